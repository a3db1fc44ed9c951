import { assertFiniteArray, assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/**
 * Fractional frequency y = (f − f_ref)/f_ref (NIST SP 1065, §1.2; IEEE Std 1139),
 * dimensionless.
 *
 * @param f frequencies, Hz
 * @param fRef reference (nominal) frequency, Hz, > 0
 * @returns y for each reading
 * @throws {MetrologyError} 'too_few_points' (empty), 'not_finite', 'bad_frequency' (f_ref ≤ 0)
 * @example fractionalFrequency([7_000_007], 7e6); // => [1e-6]
 */
export function fractionalFrequency(f: ArrayLike<number>, fRef: number): number[] {
  const fn = 'fractionalFrequency';
  if (f.length === 0) throw new MetrologyError('too_few_points', `${fn} requires at least 1 data point`);
  assertFiniteArray(fn, 'f', f);
  assertPositive(fn, 'the reference frequency', fRef, 'bad_frequency');
  const y = new Array<number>(f.length);
  for (let i = 0; i < f.length; i++) y[i] = (f[i]! - fRef) / fRef;
  return y;
}
