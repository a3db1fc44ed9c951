import { assertFiniteArray, assertNonNegative } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/** Where a counter-assisted capture stands after the readings seen so far. */
export type CounterSettle = {
  /** True when the last `count` readings all lie within `toleranceHz` of one another. */
  settled: boolean;
  /** The readings judged: the last `count` (or all of them while fewer have arrived). */
  window: number;
  /** max − min of the judged readings, Hz (0 for one reading, null for none). */
  spreadHz: number | null;
  /** Mean of the judged readings, Hz (null for none). */
  mean: number | null;
  /** Sample standard deviation of the judged readings, Hz (n − 1 in the denominator; null below two). */
  sd: number | null;
};

/**
 * The settle rule of counter-assisted capture: the counter has settled when the last N consecutive
 * readings all lie within a tolerance band, max − min ≤ tolerance (limits included). The setting's
 * value is then the mean of those N readings with their sample standard deviation
 * s = √(Σ(xᵢ − x̄)² / (N − 1)) (GUM 4.2.2), the spread of repeated readings that feeds the budget's
 * repeatability (s/√N). A span rule of this kind is common practice at the bench (no published source).
 *
 * @param readings counter readings in arrival order, Hz
 * @param count N, the consecutive readings that must agree (a whole number ≥ 2)
 * @param toleranceHz the band they must lie within, Hz (≥ 0)
 * @returns whether the last N agree, with their spread, mean and SD (over the readings so far while fewer than N)
 * @throws {MetrologyError} 'bad_argument' (N not a whole number ≥ 2, negative tolerance), 'not_finite'
 * @example counterSettled([7_000_100, 7_000_012, 7_000_013, 7_000_011], 3, 2); // => settled, mean 7 000 012, sd 1
 */
export function counterSettled(readings: readonly number[], count: number, toleranceHz: number): CounterSettle {
  const fn = 'counterSettled';
  if (!Number.isInteger(count) || count < 2)
    throw new MetrologyError('bad_argument', `${fn} requires N, the readings that must agree, to be a whole number of 2 or more (got ${count})`);
  assertNonNegative(fn, 'the tolerance (Hz)', toleranceHz);
  assertFiniteArray(fn, 'the readings', readings);
  const judged = readings.slice(Math.max(0, readings.length - count));
  const n = judged.length;
  if (n === 0) return { settled: false, window: 0, spreadHz: null, mean: null, sd: null };
  let low = Infinity;
  let high = -Infinity;
  let sum = 0;
  for (const x of judged) {
    low = Math.min(low, x);
    high = Math.max(high, x);
    sum += x;
  }
  // Deviations from the smallest reading keep the sums exact-ish at MHz magnitudes (sub-hertz spreads).
  const meanOffset = sum / n - low;
  let squares = 0;
  for (const x of judged) squares += (x - low - meanOffset) ** 2;
  const spread = high - low;
  return {
    settled: n >= count && spread <= toleranceHz,
    window: n,
    spreadHz: spread,
    mean: low + meanOffset,
    sd: n >= 2 ? Math.sqrt(squares / (n - 1)) : null,
  };
}
