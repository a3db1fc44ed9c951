// Calibration error per range (PRODUCT §5.1): closed forms, a leave-one-out refit as an
// independent check of the studentised residuals, trade facts and properties.
import fc from 'fast-check';
import { analyseCalibration } from '../analyse-calibration.js';
import { dialForFrequency, dialForFrequencyEstimate } from '../dial-for-frequency.js';
import { dialToNominal, type DialLaw } from '../dial-law.js';
import { fitLine } from '../fit-line.js';
import { toleranceHz } from '../tolerance.js';
import { errorCode, expectRelative, seededGaussian } from './helpers.js';

const kHzDial: DialLaw = { kind: 'direct', unit: 'kHz' };

describe('dialToNominal()', () => {
  test('direct law reads the dial in its unit (dial 1750 on a kHz dial is 1 750 000 Hz)', () => {
    expect(dialToNominal(kHzDial, 1750)).toBe(1_750_000);
    expect(dialToNominal({ kind: 'direct', unit: 'MHz' }, 7.15)).toBeCloseTo(7_150_000, 6);
  });
  const table: DialLaw = {
    kind: 'table',
    points: Object.freeze([
      { dial: 100, frequency: 2_000_000 },
      { dial: 0, frequency: 1_000_000 },
      { dial: 50, frequency: 1_400_000 },
    ]),
  };
  test('table law interpolates linearly between neighbouring points (any input order)', () => {
    expect(dialToNominal(table, 25)).toBe(1_200_000);
    expect(dialToNominal(table, 75)).toBe(1_700_000);
    expect(dialToNominal(table, 50)).toBe(1_400_000);
  });
  test('table law extends up to 10 % of the span beyond its ends, and refuses further', () => {
    expect(dialToNominal(table, -10)).toBe(920_000);
    expect(dialToNominal(table, 110)).toBe(2_120_000);
    expect(errorCode(() => dialToNominal(table, 110.5))).toBe('outside_table');
    expect(errorCode(() => dialToNominal(table, -11))).toBe('outside_table');
  });
  test('bad laws and dials', () => {
    expect(errorCode(() => dialToNominal(kHzDial, Number.NaN))).toBe('not_finite');
    expect(errorCode(() => dialToNominal(kHzDial, 0))).toBe('bad_frequency');
    expect(errorCode(() => dialToNominal({ kind: 'table', points: [{ dial: 0, frequency: 1 }] }, 0))).toBe('too_few_points');
    expect(
      errorCode(() =>
        dialToNominal(
          {
            kind: 'table',
            points: [
              { dial: 0, frequency: 1 },
              { dial: 0, frequency: 2 },
            ],
          },
          0,
        ),
      ),
    ).toBe('bad_dial');
    expect(errorCode(() => dialToNominal({ kind: 'direct', unit: 'GHz' as never }, 1))).toBe('unknown_unit');
  });
});

describe('toleranceHz()', () => {
  test('±0.5 % of 1.75 MHz is ±8 750 Hz; ±(10 ppm + 1 Hz) of 7 MHz is ±71 Hz', () => {
    expectRelative(toleranceHz({ kind: 'percent', percent: 0.5 }, 1_750_000), 8750, 1e-15, 'percent');
    expectRelative(toleranceHz({ kind: 'ppm_hz', ppm: 10, hz: 1 }, 7_000_000), 71, 1e-15, 'ppm + Hz');
  });
  test('bad input', () => {
    expect(errorCode(() => toleranceHz({ kind: 'percent', percent: -1 }, 1e6))).toBe('bad_argument');
    expect(errorCode(() => toleranceHz({ kind: 'percent', percent: 1 }, 0))).toBe('bad_frequency');
  });
});

describe('analyseCalibration()', () => {
  test('a dial mark of 1750 kHz that counts 1735 kHz is an error of −15 kHz, −0.857 % (common practice, no published source)', () => {
    const point = analyseCalibration({ law: kHzDial, readings: [{ dial: 1750, frequency: 1_735_000 }] }).points[0]!;
    expect(point.errorHz).toBe(-15_000);
    expect(point.errorPercent.toFixed(3)).toBe('-0.857');
    expectRelative(point.errorPpm, -15_000 / 1.75, 1e-12, 'ppm');
    expect(point.sd).toBeNull();
    expect(point.studentised).toBeNull();
  });

  test('repeated readings are averaged, excluded readings ignored', () => {
    const result = analyseCalibration({
      law: kHzDial,
      tolerance: { kind: 'percent', percent: 1 },
      readings: Object.freeze([
        { dial: 1800, frequency: 1_790_000 },
        { dial: 1800, frequency: 1_790_010 },
        { dial: 1800, frequency: 1_790_020 },
        { dial: 1800, frequency: 9_999_999, excluded: true },
        { dial: 1750, frequency: 1_735_000 },
      ]),
    });
    expect(result.points.map((p) => p.dial)).toEqual([1750, 1800]);
    const p = result.points[1]!;
    expect(p.measured).toBe(1_790_010);
    expect(p.n).toBe(3);
    expectRelative(p.sd!, 10, 1e-12, 'sd');
    expect(p.toleranceHz).toBe(18_000);
    expect(result.fit).toBeNull();
    expect(result.tracking).toBeNull();
    expect(result.corrections[1]).toEqual({ dial: 1800, nominal: 1_800_000, measured: 1_790_010, correctionHz: -9990 });
  });

  test('offset and scale error of an instrument with a linear error are recovered, tracking error is 0 (closed form)', () => {
    // error = 500 Hz + 0.002·nominal exactly
    const readings = [1750, 1800, 1850, 1900, 1950, 2000].map((dial) => ({ dial, frequency: dial * 1000 + 500 + 0.002 * dial * 1000 }));
    const result = analyseCalibration({ law: kHzDial, readings });
    expectRelative(result.fit!.offsetHz, 500, 1e-9, 'offset');
    expectRelative(result.fit!.slope, 0.002, 1e-9, 'scale error');
    expect(result.tracking!.bestFit.maxAbsHz).toBeLessThan(1e-6);
    expect(result.tracking!.endPoint.maxAbsHz).toBeLessThan(1e-6);
  });

  test('end-point residuals are 0 at both ends; best-fit residuals sum to 0', () => {
    const readings = [1, 2, 3, 4, 5].map((dial) => ({ dial, frequency: dial * 1e6 + 1000 * Math.sin(dial) }));
    const result = analyseCalibration({ law: { kind: 'direct', unit: 'MHz' }, readings });
    expect(result.points[0]!.residualEndPoint).toBe(0);
    expect(Math.abs(result.points[4]!.residualEndPoint)).toBeLessThan(1e-9);
    expect(Math.abs(result.points.reduce((s, p) => s + p.residualBestFit, 0))).toBeLessThan(1e-6);
    expect(result.tracking!.endPoint.maxAbsHz).toBeGreaterThan(result.tracking!.bestFit.maxAbsHz * 0.5);
  });

  test('studentised residuals equal a leave-one-out refit (independent computation); a spike is flagged', () => {
    const gaussian = seededGaussian(42);
    const dials = [1750, 1775, 1800, 1825, 1850, 1875, 1900, 1925, 1950, 2000];
    const readings = dials.map((dial) => ({ dial, frequency: dial * 1000 - 15_000 + 10 * gaussian() + (dial === 1875 ? 400 : 0) }));
    const result = analyseCalibration({ law: kHzDial, readings });
    const x = result.points.map((p) => p.nominal);
    const y = result.points.map((p) => p.errorHz);
    result.points.forEach((point, i) => {
      const xs = x.filter((_, j) => j !== i);
      const ys = y.filter((_, j) => j !== i);
      const loo = fitLine(xs, ys);
      const predicted = loo.intercept + loo.slope * x[i]!;
      const variance = loo.residualSd ** 2 * (1 + 1 / xs.length + (x[i]! - loo.meanX) ** 2 / loo.sxx);
      expectRelative(point.studentised!, (y[i]! - predicted) / Math.sqrt(variance), 1e-7, `studentised at dial ${point.dial}`);
    });
    expect(result.points.filter((p) => p.outlier).map((p) => p.dial)).toEqual([1875]);
  });

  test('error of a perfect instrument is 0 everywhere (property)', () => {
    fc.assert(
      fc.property(fc.uniqueArray(fc.integer({ min: 1, max: 30_000 }), { minLength: 1, maxLength: 20 }), (dials) => {
        const result = analyseCalibration({ law: kHzDial, readings: dials.map((dial) => ({ dial, frequency: dial * 1000 })) });
        return (
          result.points.every((p) => p.errorHz === 0 && p.errorPpm === 0 && p.residualBestFit === 0 && p.residualEndPoint === 0 && !p.outlier) &&
          (result.fit === null || (result.fit.offsetHz === 0 && result.fit.slope === 0))
        );
      }),
    );
  });

  test('inverse of the correction table round-trips (property)', () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.integer({ min: 100, max: 30_000 }), { minLength: 2, maxLength: 15 }),
        fc.double({ min: -0.01, max: 0.01, noNaN: true }),
        fc.double({ min: -5000, max: 5000, noNaN: true }),
        (dials, scale, offset) => {
          const readings = dials.map((dial) => ({ dial, frequency: dial * 1000 * (1 + scale) + offset }));
          const { corrections } = analyseCalibration({ law: kHzDial, readings });
          const points = corrections.map((c) => ({ dial: c.dial, measured: c.nominal + c.correctionHz }));
          return points.every((p) => Math.abs(dialForFrequency(points, p.measured) - p.dial) <= 1e-9 * p.dial);
        },
      ),
    );
  });

  test('bad input', () => {
    expect(errorCode(() => analyseCalibration({ law: kHzDial, readings: [] }))).toBe('too_few_points');
    expect(errorCode(() => analyseCalibration({ law: kHzDial, readings: [{ dial: 1, frequency: 1, excluded: true }] }))).toBe('too_few_points');
    expect(errorCode(() => analyseCalibration({ law: kHzDial, readings: [{ dial: 1, frequency: Number.NaN }] }))).toBe('not_finite');
  });
});

describe('dialForFrequency()', () => {
  const points = Object.freeze([
    { dial: 2000, measured: 1_990_000 },
    { dial: 1750, measured: 1_735_000 },
    { dial: 1875, measured: 1_861_000 },
  ]);
  test('interpolates between the bracketing measured points', () => {
    expect(dialForFrequency(points, 1_735_000)).toBe(1750);
    expect(dialForFrequency(points, 1_798_000)).toBe(1812.5);
    expect(dialForFrequency(points, 1_990_000)).toBe(2000);
  });
  test('works for a dial whose frequency falls as the dial rises', () => {
    expect(
      dialForFrequency(
        [
          { dial: 0, measured: 2e6 },
          { dial: 100, measured: 1e6 },
        ],
        1.5e6,
      ),
    ).toBe(50);
  });
  test('refuses targets outside the measured span and non-monotonic data', () => {
    expect(errorCode(() => dialForFrequency(points, 1_700_000))).toBe('outside_span');
    expect(errorCode(() => dialForFrequency(points, 2_000_000))).toBe('outside_span');
    expect(
      errorCode(() =>
        dialForFrequency(
          [
            { dial: 0, measured: 1 },
            { dial: 1, measured: 3 },
            { dial: 2, measured: 2 },
          ],
          2.5,
        ),
      ),
    ).toBe('not_monotonic');
    expect(errorCode(() => dialForFrequency([{ dial: 0, measured: 1 }], 1))).toBe('too_few_points');
    expect(
      errorCode(() =>
        dialForFrequency(
          [
            { dial: 0, measured: 1 },
            { dial: 0, measured: 2 },
          ],
          1,
        ),
      ),
    ).toBe('bad_dial');
  });
});

describe('dialForFrequencyEstimate()', () => {
  const points = Object.freeze([
    { dial: 2000, measured: 1_990_000 },
    { dial: 1750, measured: 1_735_000 },
    { dial: 1875, measured: 1_861_000 },
  ]);
  test('inside the measured span: the interpolation, not marked', () => {
    expect(dialForFrequencyEstimate(points, 1_798_000)).toEqual({ dial: 1812.5, extrapolated: false, measuredFrom: 1750, measuredTo: 2000 });
  });
  test('beyond either end: the straight line through the two end points, marked as extrapolated (closed form)', () => {
    // Low end: 1750 + (1 700 000 − 1 735 000)·125/126 000 = 1750 − 4375/126.
    const low = dialForFrequencyEstimate(points, 1_700_000);
    expectRelative(low.dial, 1750 - 4375 / 126, 1e-14, 'low end');
    expect(low.extrapolated).toBe(true);
    // High end: 2000 + (2 000 000 − 1 990 000)·125/129 000 = 2000 + 1250/129.
    const high = dialForFrequencyEstimate(points, 2_000_000);
    expectRelative(high.dial, 2000 + 1250 / 129, 1e-14, 'high end');
    expect(high.extrapolated).toBe(true);
    // A dial whose frequency falls as it rises: beyond its high-frequency end lies below its lowest dial.
    const falling = dialForFrequencyEstimate(
      [
        { dial: 0, measured: 2e6 },
        { dial: 100, measured: 1e6 },
      ],
      2.5e6,
    );
    expect(falling).toEqual({ dial: -50, extrapolated: true, measuredFrom: 0, measuredTo: 100 });
  });
  test('refuses a setting beyond the dial span, and keeps every other refusal of dialForFrequency', () => {
    expect(errorCode(() => dialForFrequencyEstimate(points, 2_000_000, { min: 1700, max: 2005 }))).toBe('outside_span');
    expect(dialForFrequencyEstimate(points, 2_000_000, { min: 1700, max: 2020 }).extrapolated).toBe(true);
    expect(
      errorCode(() =>
        dialForFrequencyEstimate(
          [
            { dial: 0, measured: 1 },
            { dial: 1, measured: 3 },
            { dial: 2, measured: 2 },
          ],
          4,
        ),
      ),
    ).toBe('not_monotonic');
    expect(errorCode(() => dialForFrequencyEstimate([{ dial: 0, measured: 1 }], 2))).toBe('too_few_points');
    expect(errorCode(() => dialForFrequencyEstimate(points, Number.NaN))).toBe('not_finite');
  });
});
