import { assertFiniteArray, assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';
import type { DriftEstimate } from './linear-frequency-drift.js';

/**
 * Frequency drift from phase data by the three-point fit of NIST SP 1065 (Riley 2008), section on frequency drift analysis: the
 * parabola through the first, middle and last phase points, x(t) = a + b·t + D·t²/2, so D is twice
 * the second divided difference, D = 2[(x₂ − x₁)/(t₂ − t₁) − (x₁ − x₀)/(t₁ − t₀)]/(t₂ − t₀), with
 * t₀ = 0, t₁ = ⌊(N − 1)/2⌋τ0, t₂ = (N − 1)τ0; for odd N this is 4(x_{N−1} − 2x_{(N−1)/2} + x_0)/((N − 1)τ0)². Exact for a quadratic phase. It uses three points only, so it gives no
 * standard error (standardError null); it is quick and insensitive to the noise's middle.
 *
 * @param x phase, s, at a fixed interval τ0, at least 3 points
 * @param tau0 sampling interval, s
 * @returns drift (fractional frequency per second); standardError null
 * @throws {MetrologyError} 'too_few_points' (under 3), 'not_finite', 'bad_argument' (τ0 ≤ 0)
 * @example threePointDrift([0, 0.5, 2, 4.5, 8], 1).drift; // => 1
 */
export function threePointDrift(x: ArrayLike<number>, tau0: number): DriftEstimate {
  const fn = 'threePointDrift';
  if (x.length < 3) throw new MetrologyError('too_few_points', `${fn} requires at least 3 phase points`);
  assertFiniteArray(fn, 'x', x);
  assertPositive(fn, 'tau0', tau0);
  const last = x.length - 1;
  const middle = Math.floor(last / 2);
  const t1 = middle * tau0;
  const t2 = last * tau0;
  const slopeFirst = (x[middle]! - x[0]!) / t1;
  const slopeSecond = (x[last]! - x[middle]!) / (t2 - t1);
  return { drift: (2 * (slopeSecond - slopeFirst)) / t2, standardError: null, method: 'three_point_phase' };
}
