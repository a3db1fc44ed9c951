import { assertFiniteArray, assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/**
 * Phase (time deviation) from fractional frequency as NIST SP 1065 (Riley 2008) §1.2 and §5.2
 * define it: x(0) = 0, x(i+1) = x(i) + y(i)·τ0 — the running sum of the frequency data times the
 * sampling interval. M frequency points give M + 1 phase points. Nothing is removed: the mean
 * frequency stays in the phase as a slope (see {@link phaseFromFrequency} for the mean-removed form
 * the Allan deviation uses internally).
 *
 * @param y fractional frequency (dimensionless), at least 1 value
 * @param tau0 sampling interval, s
 * @returns phase, s (y.length + 1 points)
 * @throws {MetrologyError} 'too_few_points' (empty), 'not_finite', 'bad_argument' (τ0 ≤ 0)
 * @example phaseFromFractionalFrequency([1e-9, 3e-9], 10); // => Float64Array [0, 1e-8, 4e-8]
 */
export function phaseFromFractionalFrequency(y: ArrayLike<number>, tau0: number): Float64Array {
  const fn = 'phaseFromFractionalFrequency';
  if (y.length === 0) throw new MetrologyError('too_few_points', `${fn} requires at least 1 frequency point`);
  assertFiniteArray(fn, 'y', y);
  assertPositive(fn, 'tau0', tau0);
  const x = new Float64Array(y.length + 1);
  for (let i = 0; i < y.length; i++) x[i + 1] = x[i]! + y[i]! * tau0;
  return x;
}
