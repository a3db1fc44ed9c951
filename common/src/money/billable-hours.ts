import { MetrologyError } from '../math/metrology-error.js';

/** A quarter of an hour in seconds: study time is billed in quarter hours. */
const QUARTER_HOUR_S = 900;

/**
 * The hours of study billed for a job, in thousandths of an hour: the recorded time rounded UP to the next
 * quarter hour (a study of 1 h 01 min bills 1.25 h), and never less than one hour (a quote made before any
 * study ran proposes one hour).
 *
 *   quantityMilli = max(1000, ceil(seconds / 900) × 250)
 *
 * @param seconds the recorded study time in seconds, a finite number ≥ 0
 * @example billableHoursMilli(3_660); // => 1250
 * @example billableHoursMilli(0); // => 1000
 * @throws {MetrologyError} 'bad_argument' for a negative or non-finite time
 */
export function billableHoursMilli(seconds: number): number {
  if (!Number.isFinite(seconds) || seconds < 0) {
    throw new MetrologyError('bad_argument', `billableHoursMilli requires a time of 0 seconds or more (got ${String(seconds)})`);
  }
  return Math.max(1000, Math.ceil(seconds / QUARTER_HOUR_S) * 250);
}
