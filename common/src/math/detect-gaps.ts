import { assertFiniteArray, assertPositive } from './guards.js';
import { medianInPlace } from './median-in-place.js';
import { MetrologyError } from './metrology-error.js';

export type GapReport = {
  /** Each place where readings are missing: index of the first reading after the gap. */
  gaps: Array<{ index: number; tStart: number; tEnd: number; missing: number }>;
  /**
   * True when the sampling is not a clean grid of τ0: an interval that is not within
   * 10 % of a whole number of τ0, a repeated or backwards time stamp, or a median
   * interval more than 10 % away from τ0.
   */
  irregular: boolean;
  /** Median interval between readings, s. */
  medianInterval: number;
};

/**
 * Checks a time series before a stability analysis (PRODUCT §5.4: gaps are reported,
 * not papered over). An interval longer than 1.5·τ0 is a gap with
 * round(interval/τ0) − 1 readings missing. Allan-type deviations assume a gap-free
 * series at τ0; the caller decides whether to split the series or refuse.
 *
 * @param t time stamps, s
 * @param tau0 intended sampling interval, s
 * @returns the gaps, an irregular-sampling flag and the median interval
 * @throws {MetrologyError} 'too_few_points' (under 2), 'not_finite', 'bad_argument' (τ0 ≤ 0)
 * @example detectGaps([0, 1, 2, 5, 6], 1).gaps; // => [{ index: 3, tStart: 2, tEnd: 5, missing: 2 }]
 */
export function detectGaps(t: ArrayLike<number>, tau0: number): GapReport {
  const fn = 'detectGaps';
  if (t.length < 2) throw new MetrologyError('too_few_points', `${fn} requires at least 2 data points`);
  assertFiniteArray(fn, 't', t);
  assertPositive(fn, 'tau0', tau0);
  const gaps: GapReport['gaps'] = [];
  const intervals = new Float64Array(t.length - 1);
  let irregular = false;
  for (let i = 1; i < t.length; i++) {
    const interval = t[i]! - t[i - 1]!;
    intervals[i - 1] = interval;
    if (!(interval > 0)) {
      irregular = true;
      continue;
    }
    const multiple = interval / tau0;
    if (Math.abs(multiple - Math.round(multiple)) > 0.1 || Math.round(multiple) === 0) irregular = true;
    if (multiple > 1.5) {
      gaps.push({ index: i, tStart: t[i - 1]!, tEnd: t[i]!, missing: Math.max(Math.round(multiple) - 1, 1) });
    }
  }
  // By selection, not a sort (a sort of a million intervals costs a tenth of a second): the same median.
  const medianInterval = medianInPlace(intervals);
  if (Math.abs(medianInterval - tau0) > 0.1 * tau0) irregular = true;
  return { gaps, irregular, medianInterval };
}
