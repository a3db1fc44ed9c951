import { evaluateWarmup, type WarmupFit } from './fit-warmup.js';
import { fitLine } from './fit-line.js';
import { assertFiniteArray, assertSameLength } from './guards.js';
import { MetrologyError } from './metrology-error.js';
import { settlingTime, type SettlingCriterion } from './settling-time.js';

export type WarmupSummary = {
  /** Model frequency at t = 3600 s minus at t = 0, Hz. */
  driftFirstHourHz: number;
  /** Whether the readings reach one hour (otherwise driftFirstHourHz is extrapolated by the model). */
  firstHourCovered: boolean;
  /** Settling time used, s (null when the criterion is never met). */
  settledAtSeconds: number | null;
  /** Least-squares slope of the readings after settling × 600 s, Hz; null when under 3 readings or 10 min remain. */
  driftPer10MinAfterSettlingHz: number | null;
};

/**
 * Plain figures of a warm-up (PRODUCT §5.3):
 * - drift in the first hour: f(3600 s) − f(0) of the fitted model (flagged when the record
 *   is shorter than an hour and the figure is extrapolated);
 * - drift per ten minutes after settling: the least-squares slope of the readings
 *   themselves from the settling time on, × 600 s (measured, so it includes any drift
 *   the model does not describe). Settled means `criterion` ({@link settlingTime}),
 *   default five time constants (e^(−5) ≈ 0.7 % of the amplitude left).
 *
 * @param t seconds since power-on (ascending)
 * @param f frequency, Hz
 * @param fit result of fitWarmup on the same readings
 * @param criterion optional settling criterion
 * @returns first-hour drift, settling time used and settled drift per 10 min
 * @throws {MetrologyError} 'length_mismatch', 'not_finite', 'too_few_points' (under 3)
 * @example warmupSummary(t, f, fitWarmup(t, f)).driftFirstHourHz;
 */
export function warmupSummary(
  t: ArrayLike<number>,
  f: ArrayLike<number>,
  fit: Pick<WarmupFit, 'fInf' | 'amplitude' | 'tau' | 'linear'>,
  criterion?: SettlingCriterion,
): WarmupSummary {
  const fn = 'warmupSummary';
  assertSameLength(fn, t, f);
  if (t.length < 3) throw new MetrologyError('too_few_points', `${fn} requires at least 3 data points`);
  assertFiniteArray(fn, 't', t);
  assertFiniteArray(fn, 'f', f);
  const n = t.length;
  const driftFirstHourHz = evaluateWarmup(fit, 3600) - evaluateWarmup(fit, 0);
  const settledAtSeconds = criterion === undefined ? 5 * fit.tau : settlingTime(fit, criterion);
  let driftPer10MinAfterSettlingHz: number | null = null;
  if (settledAtSeconds !== null) {
    let from = 0;
    while (from < n && t[from]! < settledAtSeconds) from++;
    const count = n - from;
    if (count >= 3 && t[n - 1]! - t[from]! >= 600) {
      const tail = fitLine(tailFrom(t, from), tailFrom(f, from));
      driftPer10MinAfterSettlingHz = tail.slope * 600;
    }
  }
  return { driftFirstHourHz, firstHourCovered: t[n - 1]! >= 3600, settledAtSeconds, driftPer10MinAfterSettlingHz };
}

/** The values from `from` on: a view of a typed array (no copy of a million readings), a slice of anything else. */
function tailFrom(values: ArrayLike<number>, from: number): ArrayLike<number> {
  return ArrayBuffer.isView(values) ? (values as Float64Array).subarray(from) : (Array.prototype.slice.call(values, from) as number[]);
}
