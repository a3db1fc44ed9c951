import type { WarmupFit } from './fit-warmup.js';
import { assertFiniteArray, assertMinLength } from './guards.js';
import { settlingTime } from './settling-time.js';

/** Both settling times of a warm-up, each saying whether it lies beyond the last reading. */
export type WarmupSettling = {
  /** The settling band N, Hz. */
  withinHz: number;
  /** First t (s since power-on) within N Hz of the settled line; null when never. */
  withinSeconds: number | null;
  /** True when withinSeconds lies after the last reading: the fit's prediction, not something the record shows. */
  withinExtrapolated: boolean;
  /** The settling rate R, Hz/min. */
  rateHzPerMin: number;
  /** First t (s) after which the drift stays below R; null when never. */
  rateSeconds: number | null;
  /** True when rateSeconds lies after the last reading. */
  rateExtrapolated: boolean;
  /** Time of the last reading, s since power-on: how far the record reaches. */
  lastReadingSeconds: number;
};

/**
 * Settling times by both rules ({@link settlingTime}) with an honesty mark: a time later than
 * the last reading is an extrapolation of the fitted model f∞ + A·e^(−t/τ) (+ c·t) beyond the
 * record, and is flagged so that a page can say so. A time equal to the last reading is inside
 * the record; a criterion never met (null) is not an extrapolation.
 *
 * @param t seconds since power-on of the readings the fit used (at least one)
 * @param fit result of fitWarmup on those readings
 * @param criteria the settling band withinHz (Hz) and rate rateHzPerMin (Hz/min), both > 0
 * @returns both settling times, whether each lies beyond the record, and the last reading's time
 * @throws {MetrologyError} 'too_few_points' (no readings), 'not_finite', 'bad_argument' (see settlingTime)
 * @example warmupSettling([0, 60, 120], { amplitude: -100, tau: 600, linear: null }, { withinHz: 1, rateHzPerMin: 1 }).withinExtrapolated; // => true (2 763 s > 120 s)
 */
export function warmupSettling(
  t: ArrayLike<number>,
  fit: Pick<WarmupFit, 'amplitude' | 'tau' | 'linear'>,
  criteria: { withinHz: number; rateHzPerMin: number },
): WarmupSettling {
  const fn = 'warmupSettling';
  assertMinLength(fn, t, 1);
  assertFiniteArray(fn, 't', t);
  let last = -Infinity;
  for (let i = 0; i < t.length; i++) last = Math.max(last, t[i]!);
  const withinSeconds = settlingTime(fit, { kind: 'within_hz', hz: criteria.withinHz });
  const rateSeconds = settlingTime(fit, { kind: 'rate_below', hzPerMin: criteria.rateHzPerMin });
  return {
    withinHz: criteria.withinHz,
    withinSeconds,
    withinExtrapolated: withinSeconds !== null && withinSeconds > last,
    rateHzPerMin: criteria.rateHzPerMin,
    rateSeconds,
    rateExtrapolated: rateSeconds !== null && rateSeconds > last,
    lastReadingSeconds: last,
  };
}
