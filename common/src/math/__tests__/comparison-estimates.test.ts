// Comparison of studies (PRODUCT §5.5): Welch intervals from estimates checked against an assembly
// by hand from jstat 1.9.6 (Student-t and normal quantiles); Allan deviation at chosen averaging
// times against the direct frequency-average form of SP 1065 Eq. 13 and against overlappingAdev at
// octaves; the warm-up covariance against fitWarmup's own standard errors; the settling time's
// standard error against numerical derivatives and against the spread of 100 simulated warm-ups.
import jstat from 'jstat';
import { adevEstimate } from '../adev-estimate.js';
import { fitWarmup } from '../fit-warmup.js';
import { overlappingAdev } from '../overlapping-adev.js';
import { overlappingAdevAt } from '../overlapping-adev-at.js';
import { settlingTime } from '../settling-time.js';
import { settlingTimeUncertainty } from '../settling-time-uncertainty.js';
import { warmupCovariance } from '../warmup-covariance.js';
import { welchDifference } from '../welch-difference.js';
import { welchFromEstimates } from '../welch-from-estimates.js';
import { errorCode, expectRelative, readCsv, seededGaussian } from './helpers.js';

describe('welchFromEstimates()', () => {
  test('agrees with an assembly by hand from jstat: se = √(se_a² + se_b²), Welch–Satterthwaite ν, t quantile', () => {
    const a = { value: 12.3, se: 0.41, df: 7 };
    const b = { value: 8.1, se: 0.27, df: 23.5 };
    const va = a.se ** 2;
    const vb = b.se ** 2;
    const df = (va + vb) ** 2 / (va ** 2 / a.df + vb ** 2 / b.df);
    const t = jstat.studentt.inv(0.975, df);
    const result = welchFromEstimates(a, b);
    expectRelative(result.difference, -4.2, 1e-12, 'difference');
    expectRelative(result.df, df, 1e-12, 'df');
    expectRelative(result.t, t, 1e-12, 't');
    expectRelative(result.low, -4.2 - t * Math.sqrt(va + vb), 1e-12, 'low');
    expectRelative(result.high, -4.2 + t * Math.sqrt(va + vb), 1e-12, 'high');
    expect(result.confidence).toBe(0.95);
  });

  test('is welchDifference when se = s/√n and ν = n − 1', () => {
    const a = { mean: 10.2, sd: 1.3, n: 8 };
    const b = { mean: 11.9, sd: 2.1, n: 13 };
    const fromSummaries = welchDifference(a, b, 0.9);
    const fromEstimates = welchFromEstimates(
      { value: a.mean, se: a.sd / Math.sqrt(a.n), df: a.n - 1 },
      { value: b.mean, se: b.sd / Math.sqrt(b.n), df: b.n - 1 },
      0.9,
    );
    for (const key of ['difference', 'low', 'high', 'df', 't', 'se'] as const) expectRelative(fromEstimates[key], fromSummaries[key], 1e-12, key);
  });

  test('infinite degrees of freedom on both sides use the normal quantile; on one side only the other sets ν', () => {
    const both = welchFromEstimates({ value: 0, se: 3, df: Infinity }, { value: 1, se: 4, df: Infinity });
    expect(both.df).toBe(Infinity);
    expectRelative(both.t, jstat.normal.inv(0.975, 0, 1), 1e-12, 'z');
    expectRelative(both.high - both.low, 2 * 5 * jstat.normal.inv(0.975, 0, 1), 1e-12, 'width');
    const one = welchFromEstimates({ value: 0, se: 3, df: Infinity }, { value: 1, se: 4, df: 10 });
    expectRelative(one.df, 625 / (256 / 10), 1e-12, 'ν from the finite side');
  });

  test('refuses what cannot form an interval', () => {
    expect(errorCode(() => welchFromEstimates({ value: 1, se: 0, df: 5 }, { value: 2, se: 0, df: 5 }))).toBe('no_spread');
    expect(errorCode(() => welchFromEstimates({ value: 1, se: -1, df: 5 }, { value: 2, se: 1, df: 5 }))).toBe('bad_argument');
    expect(errorCode(() => welchFromEstimates({ value: 1, se: 1, df: 0 }, { value: 2, se: 1, df: 5 }))).toBe('bad_argument');
    expect(errorCode(() => welchFromEstimates({ value: NaN, se: 1, df: 3 }, { value: 2, se: 1, df: 5 }))).toBe('not_finite');
    expect(errorCode(() => welchFromEstimates({ value: 1, se: 1, df: 3 }, { value: 2, se: 1, df: 5 }, 1))).toBe('bad_argument');
  });
});

describe('overlappingAdevAt()', () => {
  const nbs14 = Object.freeze(
    readCsv('stability/nbs14.csv')
      .map((row) => row.frequency)
      .filter((value): value is string => value !== undefined && value !== '')
      .map(Number),
  );

  test('NBS14 at τ = 1 s: SP 1065 Table 30 (91.22945) within 1e-6', () => {
    expectRelative(overlappingAdevAt(nbs14, 1, [1])[0]!.deviation, 91.22945, 1e-6, 'ADEV(1 s)');
  });

  test('equals overlappingAdev at every octave, interval included', () => {
    const gaussian = seededGaussian(7);
    const y = Array.from({ length: 500 }, () => 1e-9 * gaussian());
    const octaves = overlappingAdev(y, 2, { confidence: 0.95 });
    const at = overlappingAdevAt(
      y,
      2,
      octaves.map((p) => p.tau),
      { confidence: 0.95 },
    );
    octaves.forEach((point, i) => expect(at[i]).toEqual(point));
  });

  test('at non-octave m equals the direct form with averages of m frequency values (SP 1065 Eq. 13, overlapping)', () => {
    const gaussian = seededGaussian(11);
    let walk = 0;
    const y = Array.from({ length: 400 }, () => (walk += 0.05 * gaussian()) + gaussian());
    for (const m of [3, 10, 25]) {
      const averages: number[] = [];
      for (let j = 0; j + m <= y.length; j++) averages.push(y.slice(j, j + m).reduce((s, v) => s + v, 0) / m);
      let sum = 0;
      let count = 0;
      for (let j = 0; j + m < averages.length; j++) {
        sum += (averages[j + m]! - averages[j]!) ** 2;
        count++;
      }
      const direct = Math.sqrt(sum / (2 * count));
      expectRelative(overlappingAdevAt(y, 0.5, [m * 0.5])[0]!.deviation, direct, 1e-10, `m = ${m}`);
    }
  });

  test('answers null where the data do not allow the averaging time', () => {
    const y = Array.from({ length: 50 }, (_, i) => Math.sin(i));
    expect(overlappingAdevAt(y, 10, [1, 15, 250, 260])).toEqual([null, null, expect.objectContaining({ m: 25 }), null]);
    expect(errorCode(() => overlappingAdevAt(y, 10, [0]))).toBe('bad_argument');
    expect(errorCode(() => overlappingAdevAt([1], 1, [1]))).toBe('too_few_points');
  });
});

describe('adevEstimate()', () => {
  test('se = σ/√(2ν): the delta-method SD of √(σ²χ²_ν/ν), close to the exact one for large ν (jstat χ² quantiles)', () => {
    const estimate = adevEstimate({ deviation: 3e-10, edf: 400 });
    expect(estimate).toEqual({ value: 3e-10, se: 3e-10 / Math.sqrt(800), df: 400 });
    // The 68.3 % χ² interval's half-width tends to the same se as ν grows.
    const low = 3e-10 * Math.sqrt(400 / jstat.chisquare.inv(0.8415, 400));
    const high = 3e-10 * Math.sqrt(400 / jstat.chisquare.inv(0.1585, 400));
    expectRelative((high - low) / 2, estimate.se, 0.01, 'half-width vs se');
    expect(errorCode(() => adevEstimate({ deviation: -1, edf: 3 }))).toBe('bad_argument');
  });
});

describe('warmupCovariance() and settlingTimeUncertainty()', () => {
  const truth = { fInf: 7_453_820, amplitude: 2_350, tau: 840 };
  const simulate = (seed: number, count = 720, interval = 10, noise = 2) => {
    const gaussian = seededGaussian(seed);
    const t = Array.from({ length: count }, (_, i) => i * interval);
    const f = t.map((s) => truth.fInf + truth.amplitude * Math.exp(-s / truth.tau) + noise * gaussian());
    return { t, f };
  };

  test("the diagonal reproduces fitWarmup's own standard errors (computed there in scaled variables)", () => {
    const { t, f } = simulate(21);
    const fit = fitWarmup(t, f);
    const covariance = warmupCovariance(t, fit);
    expect(covariance.parameters).toEqual(['fInf', 'amplitude', 'tau']);
    expect(covariance.df).toBe(717);
    expectRelative(Math.sqrt(covariance.matrix[0]![0]!), fit.seFInf, 1e-4, 'se f∞');
    expectRelative(Math.sqrt(covariance.matrix[1]![1]!), fit.seAmplitude, 1e-4, 'se A');
    expectRelative(Math.sqrt(covariance.matrix[2]![2]!), fit.seTau, 1e-4, 'se τ');
    expectRelative(covariance.matrix[1]![2]!, covariance.matrix[2]![1]!, 1e-12, 'symmetric');
  });

  test('with a linear term and a record starting after power-on, still the fit standard errors', () => {
    const gaussian = seededGaussian(5);
    const t = Array.from({ length: 1500 }, (_, i) => 120 + 4 * i);
    const f = t.map((s) => 5e6 - 300 * Math.exp(-s / 700) + 0.004 * s + 0.5 * gaussian());
    const fit = fitWarmup(t, f, { linearTerm: true });
    const covariance = warmupCovariance(t, fit);
    expect(covariance.parameters).toEqual(['fInf', 'amplitude', 'tau', 'linear']);
    expectRelative(Math.sqrt(covariance.matrix[1]![1]!), fit.seAmplitude, 1e-4, 'se A');
    expectRelative(Math.sqrt(covariance.matrix[2]![2]!), fit.seTau, 1e-4, 'se τ');
    expectRelative(Math.sqrt(covariance.matrix[3]![3]!), fit.seLinear!, 1e-4, 'se c');
  });

  test('the settling time is settlingTime(); its se matches the delta method with numerical derivatives', () => {
    const { t, f } = simulate(8);
    const fit = fitWarmup(t, f);
    const covariance = warmupCovariance(t, fit);
    const result = settlingTimeUncertainty(fit, covariance, 5);
    expect(result.seconds).toBe(settlingTime(fit, { kind: 'within_hz', hz: 5 }));
    const at = (amplitude: number, tau: number) => settlingTime({ amplitude, tau, linear: null }, { kind: 'within_hz', hz: 5 })!;
    const hA = 1e-6 * Math.abs(fit.amplitude);
    const hT = 1e-6 * fit.tau;
    const gA = (at(fit.amplitude + hA, fit.tau) - at(fit.amplitude - hA, fit.tau)) / (2 * hA);
    const gT = (at(fit.amplitude, fit.tau + hT) - at(fit.amplitude, fit.tau - hT)) / (2 * hT);
    const c = covariance.matrix;
    const variance = gA * gA * c[1]![1]! + 2 * gA * gT * c[1]![2]! + gT * gT * c[2]![2]!;
    expectRelative(result.se, Math.sqrt(variance), 1e-6, 'se');
    expect(result.df).toBe(717);
  });

  test('the se is honest: within 25 % of the spread of settling times over 100 simulated warm-ups', () => {
    const times: number[] = [];
    const stated: number[] = [];
    for (let seed = 100; seed < 200; seed++) {
      const { t, f } = simulate(seed, 240, 30, 4);
      const fit = fitWarmup(t, f);
      const result = settlingTimeUncertainty(fit, warmupCovariance(t, fit), 5);
      times.push(result.seconds);
      stated.push(result.se);
    }
    const mean = times.reduce((s, v) => s + v, 0) / times.length;
    const sd = Math.sqrt(times.reduce((s, v) => s + (v - mean) ** 2, 0) / (times.length - 1));
    const meanStated = stated.reduce((s, v) => s + v, 0) / stated.length;
    // The SD of an SD from 100 values is about 7 %; 25 % also covers the first-order approximation.
    expectRelative(meanStated, sd, 0.25, 'stated se vs observed spread');
  });

  test('is 0 ± 0 when the amplitude is already inside the band, and refuses a band of 0', () => {
    const covariance = {
      parameters: ['fInf', 'amplitude', 'tau'] as Array<'fInf' | 'amplitude' | 'tau'>,
      matrix: [
        [1, 0, 0],
        [0, 1, 0],
        [0, 0, 1],
      ],
      df: 10,
    };
    expect(settlingTimeUncertainty({ amplitude: 3, tau: 100, linear: null }, covariance, 5)).toEqual({ seconds: 0, se: 0, df: 10 });
    expect(errorCode(() => settlingTimeUncertainty({ amplitude: 3, tau: 100, linear: null }, covariance, 0))).toBe('bad_argument');
  });
});
