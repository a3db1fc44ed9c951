// Comparison: Welch intervals against scipy 1.17.1 and against jstat; closed forms.
import jstat from 'jstat';
import { describeDifference } from '../describe-difference.js';
import { keyingShift } from '../keying-shift.js';
import { supplySensitivity } from '../supply-sensitivity.js';
import { summariseSample, welchDifference, welchFromSamples } from '../welch-difference.js';
import { errorCode, expectRelative } from './helpers.js';

const before = Object.freeze([12.1, 11.8, 12.6, 12.0, 11.7, 12.4, 12.2, 11.9]);
const after = Object.freeze([8.3, 7.1, 8.9, 7.7, 8.0, 6.9, 8.4, 7.5, 8.8, 7.2]);

describe('welchDifference() / welchFromSamples()', () => {
  test('matches scipy 1.17.1 ttest_ind(after, before, equal_var=False).confidence_interval(0.95)', () => {
    // scipy 1.17.1: df = 12.733226914052228, CI = (-4.747474692330453, -3.667525307669548)
    const result = welchFromSamples(before, after);
    expectRelative(result.difference, -4.2075, 1e-12, 'difference');
    expectRelative(result.df, 12.733226914052228, 1e-10, 'df');
    expectRelative(result.low, -4.747474692330453, 1e-7, 'low');
    expectRelative(result.high, -3.667525307669548, 1e-7, 'high');
  });

  test('matches scipy 1.17.1 at 99 %', () => {
    // scipy 1.17.1: confidence_interval(0.99) = (-4.961428510209796, -3.453571489790205)
    const result = welchFromSamples(before, after, 0.99);
    expectRelative(result.low, -4.961428510209796, 1e-7, 'low');
    expectRelative(result.high, -3.453571489790205, 1e-7, 'high');
  });

  test('agrees with an assembly by hand from jstat (sample variances and the t quantile)', () => {
    const a = { mean: jstat_mean(before), variance: jstat_variance(before), n: before.length };
    const b = { mean: jstat_mean(after), variance: jstat_variance(after), n: after.length };
    const va = a.variance / a.n;
    const vb = b.variance / b.n;
    const df = (va + vb) ** 2 / (va ** 2 / (a.n - 1) + vb ** 2 / (b.n - 1));
    const t = jstat.studentt.inv(0.975, df);
    const result = welchFromSamples(before, after);
    expectRelative(result.high, b.mean - a.mean + t * Math.sqrt(va + vb), 1e-12, 'high');
    expectRelative(result.t, t, 1e-12, 't');
  });

  test('bad input', () => {
    expect(errorCode(() => welchDifference({ mean: 1, sd: 1, n: 1 }, { mean: 1, sd: 1, n: 5 }))).toBe('too_few_points');
    expect(errorCode(() => welchDifference({ mean: 1, sd: 0, n: 3 }, { mean: 1, sd: 0, n: 5 }))).toBe('no_spread');
    expect(errorCode(() => welchDifference({ mean: 1, sd: -1, n: 3 }, { mean: 1, sd: 1, n: 5 }))).toBe('bad_argument');
    expect(errorCode(() => welchDifference({ mean: 1, sd: 1, n: 3 }, { mean: 1, sd: 1, n: 5 }, 1.5))).toBe('bad_argument');
    expect(errorCode(() => welchFromSamples([1], [1, 2]))).toBe('too_few_points');
  });
});

// jstat as an independent source of the sample statistics (jstat 1.9.6).
function jstat_mean(values: readonly number[]): number {
  return (jstat as unknown as { mean(v: readonly number[]): number }).mean(values);
}
function jstat_variance(values: readonly number[]): number {
  return (jstat as unknown as { variance(v: readonly number[], sample: boolean): number }).variance(values, true);
}

describe('describeDifference()', () => {
  // Closed cases: each end of the interval is stated with its unit and its own direction (b − a < 0 is "lower").
  test('the wording of PRODUCT §5.5: a decrease whose interval lies wholly below zero', () => {
    expect(describeDifference('after', 'settled drift rate', 'Hz/min', { difference: -4.1, low: -5.3, high: -2.9 })).toBe(
      'after: settled drift rate lower by 4.1 Hz/min (95 % interval 2.9 to 5.3 Hz/min lower)',
    );
  });
  test('a decrease whose interval straddles zero keeps sign and unit on both ends', () => {
    expect(describeDifference('after', 'Allan deviation at 1 s', '× 10⁻⁹', { difference: -40, low: -82, high: 3 })).toBe(
      'after: Allan deviation at 1 s lower by 40 × 10⁻⁹ (95 % interval 82 × 10⁻⁹ lower to 3 × 10⁻⁹ higher, so it includes no change)',
    );
  });
  test('an increase, and an interval that includes no change', () => {
    expect(describeDifference('after', 'τ', 's', { difference: 12.34, low: -3.21, high: 27.89, confidence: 0.95 })).toBe(
      'after: τ higher by 12 s (95 % interval 3 s lower to 28 s higher, so it includes no change)',
    );
  });
  test('an increase wholly above zero, with no unit', () => {
    expect(describeDifference('run 2', 'ratio', '', { difference: 0.5, low: 0.25, high: 0.75 })).toBe(
      'run 2: ratio higher by 0.50 (95 % interval 0.25 to 0.75 higher)',
    );
  });
  test('an end that rounds to zero reads "no change"', () => {
    expect(describeDifference('after', 'f∞', 'Hz', { difference: -5, low: -10, high: -0.001 })).toBe(
      'after: f∞ lower by 5.0 Hz (95 % interval 10.0 Hz lower to no change)',
    );
  });
  test('no difference at all', () => {
    expect(describeDifference('after', 'τ', 's', { difference: 0, low: -2, high: 2, confidence: 0.9 })).toBe(
      'after: τ unchanged (90 % interval 2.0 s lower to 2.0 s higher, so it includes no change)',
    );
  });
  test('from a Welch result', () => {
    const text = describeDifference('after', 'frequency', 'Hz', welchFromSamples(before, after));
    expect(text).toBe('after: frequency lower by 4.21 Hz (95 % interval 3.67 to 4.75 Hz lower)');
  });
  test('bad input', () => {
    expect(errorCode(() => describeDifference('a', 'b', 'c', { difference: Number.NaN, low: 0, high: 1 }))).toBe('not_finite');
  });
});

describe('supplySensitivity()', () => {
  test('an exact −1 Hz/V line (closed form)', () => {
    const result = supplySensitivity([210, 230, 250], [7_000_020, 7_000_000, 6_999_980]);
    expectRelative(result.hzPerVolt, -1, 1e-12, 'Hz/V');
    expect(result.seHzPerVolt).toBeLessThan(1e-9);
    expect(result.n).toBe(3);
  });
  test('bad input', () => {
    expect(errorCode(() => supplySensitivity([230, 230, 230], [1, 2, 3]))).toBe('no_spread');
  });
});

describe('keyingShift()', () => {
  test('key-down minus key-up, with its standard error (closed form)', () => {
    const result = keyingShift([7_000_000, 7_000_002], [6_999_960, 6_999_962, 6_999_970]);
    expectRelative(result.shiftHz, 6_999_964 - 7_000_001, 1e-12, 'shift');
    const expectedSe = Math.sqrt(summariseSample([0, 2]).sd ** 2 / 2 + summariseSample([-4, -2, 6]).sd ** 2 / 3);
    expectRelative(result.seHz, expectedSe, 1e-9, 'se');
    expect(result.keyDownPeakDeviationHz).toBeCloseTo(6, 6);
    expect(result.low).toBeLessThan(result.shiftHz);
  });
});
