import type { GapReport } from './detect-gaps.js';
import { withGapsMarked } from './gap-input.js';
import { MetrologyError } from './metrology-error.js';

/** The longest run of readings without a gap. */
export type ContinuousSegment = {
  /** Index of its first reading in the input. */
  start: number;
  /** Index after its last reading in the input (exclusive). */
  end: number;
  /** Its readings (a copy). */
  values: Float64Array;
  /** Readings left out of the analysis (the rest of the input, gaps' missing readings not counted). */
  leftOut: number;
};

/**
 * The longest continuous segment of a series with gaps — one of the two ways NIST SP 1065 (Riley
 * 2008, section on gaps in the data) offers to analyse a record with gaps (the other is filling
 * phase gaps, {@link fillPhaseGaps}). A gap is a NaN in the values or a gap reported by
 * {@link detectGaps} (a break before reading `index`); the segment never spans one. The first of
 * equally long segments is taken. Works for phase or frequency data alike.
 *
 * @param values readings, NaN where one is missing
 * @param gaps optional gaps from detectGaps (t and tau0 of the same readings)
 * @returns the segment's bounds (indices into `values`), its readings and how many were left out
 * @throws {MetrologyError} 'too_few_points' (no reading at all), 'not_finite' (±Infinity), 'bad_argument' (bad gaps)
 * @example longestContinuousSegment([1, 2, NaN, 4, 5, 6]).start; // => 3
 */
export function longestContinuousSegment(values: ArrayLike<number>, gaps?: GapReport['gaps']): ContinuousSegment {
  const fn = 'longestContinuousSegment';
  withGapsMarked(fn, values, undefined); // checks the values
  const breaks = new Set((gaps ?? []).map((gap) => gap.index));
  if (gaps !== undefined) withGapsMarked(fn, values, gaps); // checks the gaps
  let bestStart = 0;
  let bestLength = 0;
  let runStart = 0;
  for (let i = 0; i <= values.length; i++) {
    const ends = i === values.length || Number.isNaN(values[i]!) || breaks.has(i);
    if (!ends) continue;
    if (i - runStart > bestLength) {
      bestStart = runStart;
      bestLength = i - runStart;
    }
    runStart = i < values.length && Number.isNaN(values[i]!) ? i + 1 : i;
  }
  if (bestLength === 0) throw new MetrologyError('too_few_points', `${fn} requires at least one reading that is not missing`);
  let present = 0;
  for (let i = 0; i < values.length; i++) if (!Number.isNaN(values[i]!)) present++;
  const end = bestStart + bestLength;
  return { start: bestStart, end, values: Float64Array.from({ length: bestLength }, (_, k) => values[bestStart + k]!), leftOut: present - bestLength };
}
