import { fitLine } from './fit-line.js';
import { assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/** A frequency drift estimate. */
export type DriftEstimate = {
  /** Drift rate: fractional frequency per second (or y's unit per second). */
  drift: number;
  /** Standard error of the drift, same unit; null where the method gives none. */
  standardError: number | null;
  /** How it was estimated. */
  method: 'linear_frequency' | 'three_point_phase' | 'bisection_phase';
};

/**
 * Frequency drift by a least-squares line on frequency data (NIST SP 1065, Riley 2008, section on frequency drift analysis,
 * "linear" frequency drift model): y(t) = a + D·t with t_i = i·τ0, D = S_ty/S_tt, and its
 * standard error s/√S_tt from the residual scatter s ({@link fitLine}). The standard error
 * assumes independent residuals (white FM); with flicker or random-walk FM it is too small.
 *
 * @param y fractional frequency at a fixed interval τ0, at least 3 points
 * @param tau0 sampling interval, s
 * @returns drift per second with its standard error
 * @throws {MetrologyError} 'too_few_points' (under 3), 'not_finite', 'bad_argument' (τ0 ≤ 0)
 * @example linearFrequencyDrift([1e-9, 2e-9, 3e-9], 10).drift; // => 1e-10
 */
export function linearFrequencyDrift(y: ArrayLike<number>, tau0: number): DriftEstimate {
  const fn = 'linearFrequencyDrift';
  if (y.length < 3) throw new MetrologyError('too_few_points', `${fn} requires at least 3 frequency points`);
  assertPositive(fn, 'tau0', tau0);
  const t = new Float64Array(y.length);
  for (let i = 0; i < y.length; i++) t[i] = i * tau0;
  const fit = fitLine(t, y);
  return { drift: fit.slope, standardError: fit.seSlope, method: 'linear_frequency' };
}
