// dialSlope, ppmToHz / hzToPpm, sampleMean and meanEstimate against closed forms, hand-worked values and jstat.
import jstat from 'jstat';
import { dialSlope, hzToPpm, meanEstimate, MetrologyError, ppmToHz, sampleMean } from '../index.js';
import { expectRelative } from './helpers.js';

describe('dialSlope (numerical derivative of the dial law)', () => {
  test('a direct-reading dial moves by its unit per division: 1000 Hz per kHz, 10⁶ Hz per MHz (closed form)', () => {
    expectRelative(dialSlope({ kind: 'direct', unit: 'kHz' }, 1750, 1000), 1000, 1e-9, 'kHz dial');
    expectRelative(dialSlope({ kind: 'direct', unit: 'MHz' }, 7.1, 3), 1e6, 1e-9, 'MHz dial');
  });

  test('a table law has the slope of the segment the dial lies in (hand-worked: 1 MHz over 100 divisions, then 3 MHz over 100)', () => {
    const law = {
      kind: 'table' as const,
      points: [
        { dial: 0, frequency: 1e6 },
        { dial: 100, frequency: 2e6 },
        { dial: 200, frequency: 5e6 },
      ],
    };
    expectRelative(dialSlope(law, 25, 200), 10_000, 1e-9, 'first segment');
    expectRelative(dialSlope(law, 150, 200), 30_000, 1e-9, 'second segment');
  });

  test('one-sided at the table law’s extrapolation limit, and an error beyond it', () => {
    // The law reads up to 10 % of the span (20 divisions) past the last point: dial 220 has only a lower neighbour.
    const law = {
      kind: 'table' as const,
      points: [
        { dial: 0, frequency: 1e6 },
        { dial: 100, frequency: 2e6 },
        { dial: 200, frequency: 5e6 },
      ],
    };
    expectRelative(dialSlope(law, 220, 200), 30_000, 1e-9, 'at the limit');
    expect(() => dialSlope(law, 400, 200)).toThrow(MetrologyError);
    expect(() => dialSlope(law, 400, 200)).toThrow('the dial law gives no slope at dial 400');
  });
});

describe('ppm ↔ Hz', () => {
  test('2 ppm of 7 MHz is 14 Hz; 35 Hz at 7 MHz is 5 ppm (hand-worked)', () => {
    expectRelative(ppmToHz(2, 7_000_000), 14, 1e-12, 'ppmToHz');
    expectRelative(hzToPpm(35, 7_000_000), 5, 1e-12, 'hzToPpm');
    expectRelative(hzToPpm(-0.455, 455_000), -1, 1e-12, 'negative error at 455 kHz');
  });

  test('the two are inverse of each other', () => {
    for (const [ppm, f] of [
      [0.01, 10e6],
      [-3.2, 1.8e6],
      [50, 100e3],
    ] as const)
      expectRelative(hzToPpm(ppmToHz(ppm, f), f), ppm, 1e-12, `${ppm} ppm at ${f} Hz`);
  });
});

describe('sampleMean', () => {
  test('hand-worked mean, for a plain array and a Float64Array', () => {
    expect(sampleMean([7_000_010, 7_000_012, 7_000_014])).toBe(7_000_012);
    expect(sampleMean(new Float64Array([1, 2, 3, 4]))).toBe(2.5);
  });

  test('keeps the last digits of a long record near 7 MHz (closed form: 10⁵ copies of 7 000 000.1 and of 7 000 000.3 average 7 000 000.2)', () => {
    const values = new Float64Array(200_000);
    for (let i = 0; i < values.length; i++) values[i] = i % 2 === 0 ? 7_000_000.1 : 7_000_000.3;
    expect(Math.abs(sampleMean(values) - 7_000_000.2)).toBeLessThan(1e-8);
  });

  test('an empty sample is refused', () => {
    expect(() => sampleMean([])).toThrow(MetrologyError);
  });
});

describe('meanEstimate (x̄, s/√n, n − 1)', () => {
  test('hand-worked: [1, 2, 3, 4] has s = √(5/3) and s(x̄) = √(5/3)/2', () => {
    const estimate = meanEstimate([1, 2, 3, 4]);
    expect(estimate.value).toBe(2.5);
    expectRelative(estimate.se, Math.sqrt(5 / 3) / 2, 1e-14, 'se');
    expect(estimate.df).toBe(3);
  });

  test('agrees with jstat’s sample standard deviation / √n', () => {
    const values = [14.2, 13.9, 14.6, 14.1, 13.7, 14.4, 14.0];
    const estimate = meanEstimate(values);
    expectRelative(estimate.value, jstat.mean(values), 1e-14, 'mean vs jstat');
    expectRelative(estimate.se, jstat.stdev(values, true) / Math.sqrt(values.length), 1e-12, 'se vs jstat');
    expect(estimate.df).toBe(6);
  });

  test('one value has no standard error', () => {
    expect(() => meanEstimate([3])).toThrow('meanEstimate requires at least 2 data points (got 1)');
  });
});
