import { MetrologyError } from './metrology-error.js';

/**
 * A fitted error line's value at the centre of the settings measured: error = offset + slope × nominal, evaluated
 * at (min + max) / 2 of the nominals. This is the error a person expects in the middle of a range, unlike the
 * intercept (the value at 0 Hz, far outside any range, which may have the opposite sign of every error measured).
 *
 * @param fit the line: offsetHz (error at 0 Hz) and slope (Hz of error per Hz of nominal)
 * @param nominalsHz the nominal frequencies of the settings measured (at least one, finite)
 * @returns the centre of the span and the line's error there, in Hz
 * @throws {MetrologyError} 'bad_argument' with no nominals or a non-finite one
 * @example lineAtMidSpan({ offsetHz: 100, slope: -0.002 }, [1_750_000, 2_000_000]); // => { nominalHz: 1_875_000, errorHz: -3650 }
 */
export function lineAtMidSpan(fit: { offsetHz: number; slope: number }, nominalsHz: readonly number[]): { nominalHz: number; errorHz: number } {
  if (nominalsHz.length === 0 || nominalsHz.some((n) => !Number.isFinite(n))) {
    throw new MetrologyError('bad_argument', 'lineAtMidSpan: the settings measured must be at least one finite nominal frequency');
  }
  const nominalHz = (Math.min(...nominalsHz) + Math.max(...nominalsHz)) / 2;
  return { nominalHz, errorHz: fit.offsetHz + fit.slope * nominalHz };
}
