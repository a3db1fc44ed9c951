import { fitLine } from './fit-line.js';
import { assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/** Result of {@link removeLinearFrequencyDrift}. */
export type DriftRemoved = {
  /** y_i − (a + D·t_i), t_i = i·τ0: what is left once the least-squares line is taken off. */
  residuals: Float64Array;
  /** Intercept a of the line, in y's unit. */
  intercept: number;
  /** Drift D, y's unit per second (the slope {@link linearFrequencyDrift} gives). */
  drift: number;
};

/**
 * Frequency data with their linear frequency drift removed (NIST SP 1065, Riley 2008, section on
 * frequency drift analysis: the drift is estimated and removed before the noise is analysed). The
 * least-squares line y(t) = a + D·t, t_i = i·τ0, is the one {@link linearFrequencyDrift} fits
 * ({@link fitLine}); the residuals keep the noise and lose the drift and the mean, so an Allan
 * deviation of them no longer grows as D·τ/√2, while a Hadamard deviation (blind to a linear
 * frequency drift) is unchanged.
 *
 * @param y frequency data (fractional frequency or Hz) at a fixed interval τ0, at least 3 points
 * @param tau0 sampling interval, s
 * @returns the residuals, and the line's intercept and slope
 * @throws {MetrologyError} 'too_few_points' (under 3), 'not_finite', 'bad_argument' (τ0 ≤ 0)
 * @example removeLinearFrequencyDrift([1, 2, 3], 1).residuals; // => Float64Array [0, 0, 0]
 */
export function removeLinearFrequencyDrift(y: ArrayLike<number>, tau0: number): DriftRemoved {
  const fn = 'removeLinearFrequencyDrift';
  if (y.length < 3) throw new MetrologyError('too_few_points', `${fn} requires at least 3 frequency points`);
  assertPositive(fn, 'tau0', tau0);
  const t = new Float64Array(y.length);
  for (let i = 0; i < y.length; i++) t[i] = i * tau0;
  const fit = fitLine(t, y);
  const residuals = new Float64Array(y.length);
  for (let i = 0; i < y.length; i++) residuals[i] = y[i]! - (fit.intercept + fit.slope * t[i]!);
  return { residuals, intercept: fit.intercept, drift: fit.slope };
}
