import type { WarmupFit } from './fit-warmup.js';
import { assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/** When a warm-up counts as settled: within N Hz of the settled line, or drifting slower than R Hz/min. */
export type SettlingCriterion = { kind: 'within_hz'; hz: number } | { kind: 'rate_below'; hzPerMin: number };

/**
 * Settling time from a warm-up fit f(t) = f∞ + A·e^(−t/τ) (+ c·t):
 * - within_hz: first t with |A|·e^(−t/τ) ≤ N, i.e. t = τ·ln(|A|/N) (0 if already within at
 *   power-on). With a linear term this is the distance from the settled line f∞ + c·t.
 * - rate_below: first t after which |df/dt| = |−(A/τ)·e^(−t/τ) + c| stays ≤ R/60 (R in
 *   Hz/min); since the exponential part decays monotonically this is a closed form.
 *   null when the linear term alone is at or above R (it never settles by this rule).
 *
 * @param fit result of fitWarmup (fInf, amplitude, tau, linear)
 * @param criterion within_hz (Hz) or rate_below (Hz/min), value > 0
 * @returns seconds since power-on, or null when the criterion is never met
 * @throws {MetrologyError} 'bad_argument' for a criterion value ≤ 0 or an unknown kind, or a fit with τ ≤ 0
 * @example settlingTime({ fInf: 7e6, amplitude: -100, tau: 600, linear: null }, { kind: 'within_hz', hz: 1 }); // => 2763.1…
 */
export function settlingTime(fit: Pick<WarmupFit, 'amplitude' | 'tau' | 'linear'>, criterion: SettlingCriterion): number | null {
  const fn = 'settlingTime';
  assertPositive(fn, 'the fit time constant', fit.tau);
  const amplitude = fit.amplitude;
  const linear = fit.linear ?? 0;
  if (criterion.kind === 'within_hz') {
    assertPositive(fn, 'the settling band (Hz)', criterion.hz);
    const size = Math.abs(amplitude);
    return size <= criterion.hz ? 0 : fit.tau * Math.log(size / criterion.hz);
  }
  if (criterion.kind === 'rate_below') {
    assertPositive(fn, 'the settling rate (Hz/min)', criterion.hzPerMin);
    const limit = criterion.hzPerMin / 60; // Hz/s
    if (Math.abs(linear) >= limit) return null;
    const initialRate = -amplitude / fit.tau; // exponential part of df/dt at t = 0
    const rateAtZero = initialRate + linear;
    if (Math.abs(rateAtZero) <= limit) return 0;
    const target = rateAtZero > limit ? limit - linear : -limit - linear;
    return fit.tau * Math.log(initialRate / target);
  }
  throw new MetrologyError('bad_argument', `${fn} requires a criterion of kind 'within_hz' or 'rate_below'`);
}
