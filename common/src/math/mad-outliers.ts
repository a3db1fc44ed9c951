import { assertFiniteArray } from './guards.js';
import { medianInPlace } from './median-in-place.js';
import { MetrologyError } from './metrology-error.js';

/** Result of {@link madOutliers}. */
export type MadScreen = {
  /** Indices of the values flagged, ascending. */
  indices: number[];
  median: number;
  /** Median absolute deviation from the median (unscaled). */
  mad: number;
  /** Values farther than this from the median are flagged: k × 1.4826 × MAD. */
  threshold: number;
  /** The multiple k used. */
  k: number;
};

/** MAD → standard deviation for normal data: 1/Φ⁻¹(3/4) = 1.4826 (to 4 decimals). */
export const MAD_TO_SIGMA = 1.4826;

/**
 * Median-absolute-deviation outlier screen, the robust test NIST SP 1065 (Riley 2008, section on
 * outliers) recommends for frequency data: MAD = median(|y_i − median(y)|), σ̂ = MAD/0.6745 = 1.4826·MAD,
 * and a value is flagged when |y_i − median(y)| > k·σ̂, default k = 5 (a 5σ limit: hardly ever met by
 * normal noise, so what it flags is worth a look; our choice of default). The data are never changed:
 * the caller shows the flagged readings and excludes them with a reason, or not. When more than half
 * the values are equal the MAD is 0 and nothing is flagged (the threshold 0 would flag every other value).
 *
 * @param values readings (frequency, usually), at least 3
 * @param k multiple of the scaled MAD (> 0), default 5
 * @returns flagged indices, the median, the MAD and the threshold used
 * @throws {MetrologyError} 'too_few_points' (under 3), 'not_finite', 'bad_argument' (k ≤ 0)
 * @example madOutliers([10, 11, 9, 10, 50]).indices; // => [4]
 */
export function madOutliers(values: ArrayLike<number>, k = 5): MadScreen {
  const fn = 'madOutliers';
  if (values.length < 3) throw new MetrologyError('too_few_points', `${fn} requires at least 3 values`);
  assertFiniteArray(fn, 'values', values);
  if (!(Number.isFinite(k) && k > 0)) throw new MetrologyError('bad_argument', `${fn} requires k greater than zero (got ${k})`);
  // Medians by selection on one scratch copy (a sort of a million values costs half a second); the order of the
  // values does not matter to the median of their deviations, so the copy is overwritten with those in place.
  const scratch = new Float64Array(values);
  const center = medianInPlace(scratch);
  for (let i = 0; i < scratch.length; i++) scratch[i] = Math.abs(scratch[i]! - center);
  const mad = medianInPlace(scratch);
  const threshold = k * MAD_TO_SIGMA * mad;
  const indices: number[] = [];
  if (mad > 0) {
    for (let i = 0; i < values.length; i++) if (Math.abs(values[i]! - center) > threshold) indices.push(i);
  }
  return { indices, median: center, mad, threshold, k };
}
