import { assertFiniteArray, assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/**
 * Fractional frequency from phase as NIST SP 1065 (Riley 2008) §1.2 defines it: the first
 * differences of the phase over the sampling interval, y(i) = (x(i+1) − x(i))/τ0. N phase points
 * give N − 1 frequency points; the inverse of {@link phaseFromFractionalFrequency} (up to the
 * phase's starting value, which no frequency carries).
 *
 * @param x phase, s (at least 2 points)
 * @param tau0 sampling interval, s
 * @returns fractional frequency (x.length − 1 points)
 * @throws {MetrologyError} 'too_few_points' (under 2), 'not_finite', 'bad_argument' (τ0 ≤ 0)
 * @example frequencyFromPhase([0, 1e-8, 4e-8], 10); // => Float64Array [1e-9, 3e-9]
 */
export function frequencyFromPhase(x: ArrayLike<number>, tau0: number): Float64Array {
  const fn = 'frequencyFromPhase';
  if (x.length < 2) throw new MetrologyError('too_few_points', `${fn} requires at least 2 phase points`);
  assertFiniteArray(fn, 'x', x);
  assertPositive(fn, 'tau0', tau0);
  const y = new Float64Array(x.length - 1);
  for (let i = 0; i + 1 < x.length; i++) y[i] = (x[i + 1]! - x[i]!) / tau0;
  return y;
}
