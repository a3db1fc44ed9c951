import type { WarmupFit } from './fit-warmup.js';
import { assertPositive } from './guards.js';
import { settlingTime } from './settling-time.js';
import type { WarmupCovariance } from './warmup-covariance.js';

/**
 * Settling time "within N Hz of the settled line" with its standard error, by the first-order
 * delta method (JCGM 100:2008 5.2.2, correlated inputs):
 * t_s = τ·ln(|A|/N) for |A| > N (0 otherwise, see {@link settlingTime}),
 * ∂t_s/∂τ = ln(|A|/N), ∂t_s/∂A = τ/A, ∂t_s/∂f∞ = ∂t_s/∂c = 0,
 * u²(t_s) = gᵀ·C·g with C the parameter covariance ({@link warmupCovariance}), which keeps the
 * (usually strong) correlation between τ and A. When |A| ≤ N the settling time is 0 with standard error 0.
 *
 * @param fit the warm-up fit (f∞, A, τ, c)
 * @param covariance its parameter covariance, from warmupCovariance
 * @param withinHz the settling band N, Hz (> 0)
 * @returns seconds since power-on, its standard error (s) and ν = n − p
 * @throws {MetrologyError} 'bad_argument' (N ≤ 0 or a fit with τ ≤ 0)
 * @example settlingTimeUncertainty(fit, warmupCovariance(t, fit), 5).seconds; // => τ·ln(|A|/5)
 */
export function settlingTimeUncertainty(
  fit: Pick<WarmupFit, 'amplitude' | 'tau' | 'linear'>,
  covariance: WarmupCovariance,
  withinHz: number,
): { seconds: number; se: number; df: number } {
  assertPositive('settlingTimeUncertainty', 'the settling band (Hz)', withinHz);
  const seconds = settlingTime(fit, { kind: 'within_hz', hz: withinHz })!;
  if (seconds === 0) return { seconds, se: 0, df: covariance.df };
  const gradient = covariance.parameters.map((name) => {
    if (name === 'tau') return Math.log(Math.abs(fit.amplitude) / withinHz);
    if (name === 'amplitude') return fit.tau / fit.amplitude;
    return 0;
  });
  let variance = 0;
  for (let j = 0; j < gradient.length; j++) for (let k = 0; k < gradient.length; k++) variance += gradient[j]! * covariance.matrix[j]![k]! * gradient[k]!;
  return { seconds, se: Math.sqrt(Math.max(variance, 0)), df: covariance.df };
}
