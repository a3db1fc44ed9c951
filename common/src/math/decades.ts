import { MetrologyError } from './metrology-error.js';

/**
 * Averaging factors in 1-2-5 steps per decade, 1, 2, 5, 10, 20, 50, 100, …, up to and including a
 * limit — the "decade" τ spacing of NIST SP 1065 (Riley 2008) §5.2 plots, three points a decade, so
 * τ = 1, 10, 100, … (the τ of the SP 1065 §12.4 test suite) are always among them.
 * Chosen over 1, 10, 100 alone because one point a decade is too sparse to see a slope change.
 *
 * @param limit largest factor allowed (values below 1 give an empty list)
 * @returns 1, 2, 5, 10, 20, 50, … up to limit
 * @throws {MetrologyError} 'bad_argument' for NaN
 * @example decades(60); // => [1, 2, 5, 10, 20, 50]
 */
export function decades(limit: number): number[] {
  if (Number.isNaN(limit)) throw new MetrologyError('bad_argument', 'decades requires a limit that is a number');
  const out: number[] = [];
  for (let power = 1; power <= limit; power *= 10) {
    for (const step of [1, 2, 5]) {
      if (step * power <= limit) out.push(step * power);
    }
  }
  return out;
}
