import { assertFiniteArray, assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';
import type { DriftEstimate } from './linear-frequency-drift.js';

/**
 * Frequency drift by the bisection method of NIST SP 1065 (Riley 2008), section on frequency drift analysis, taken on phase data:
 * the mean frequencies of the first and last halves of the record, ȳ₁ = (x_h − x_0)/(hτ0) and
 * ȳ₂ = (x_{N−1} − x_{N−1−h})/(hτ0), with h = ⌊(N − 1)/2⌋ frequency intervals per half (the middle
 * interval is left out when N − 1 is odd), and D = (ȳ₂ − ȳ₁)/((N − 1 − h)τ0), the distance between
 * the halves' centres. Exact for a quadratic phase. Standard error: from the scatter s₁, s₂ of the
 * frequency values y_i = (x_{i+1} − x_i)/τ0 within each half, se = √(s₁²/h + s₂²/h)/((N − 1 − h)τ0),
 * which assumes white FM (our choice; SP 1065 gives no standard error for this method), so it is
 * null when a half has fewer than 2 intervals.
 *
 * @param x phase, s, at a fixed interval τ0, at least 3 points
 * @param tau0 sampling interval, s
 * @returns drift (fractional frequency per second) with its standard error
 * @throws {MetrologyError} 'too_few_points' (under 3), 'not_finite', 'bad_argument' (τ0 ≤ 0)
 * @example bisectionDrift([0, 0.5, 2, 4.5, 8], 1).drift; // => 1
 */
export function bisectionDrift(x: ArrayLike<number>, tau0: number): DriftEstimate {
  const fn = 'bisectionDrift';
  if (x.length < 3) throw new MetrologyError('too_few_points', `${fn} requires at least 3 phase points`);
  assertFiniteArray(fn, 'x', x);
  assertPositive(fn, 'tau0', tau0);
  const intervals = x.length - 1;
  const h = Math.floor(intervals / 2);
  const secondStart = intervals - h;
  const meanFirst = (x[h]! - x[0]!) / (h * tau0);
  const meanSecond = (x[intervals]! - x[secondStart]!) / (h * tau0);
  const separation = secondStart * tau0;
  const drift = (meanSecond - meanFirst) / separation;
  if (h < 2) return { drift, standardError: null, method: 'bisection_phase' };
  const variance = (start: number, mean: number) => {
    let sum = 0;
    for (let i = start; i < start + h; i++) sum += ((x[i + 1]! - x[i]!) / tau0 - mean) ** 2;
    return sum / (h - 1);
  };
  const standardError = Math.sqrt((variance(0, meanFirst) + variance(secondStart, meanSecond)) / h) / separation;
  return { drift, standardError, method: 'bisection_phase' };
}
