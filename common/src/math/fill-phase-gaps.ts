import type { GapReport } from './detect-gaps.js';
import { withGapsMarked } from './gap-input.js';
import { MetrologyError } from './metrology-error.js';

/** A phase record with its gaps filled. */
export type FilledPhase = {
  /** The phase with every missing point filled (gaps reported by detectGaps are inserted). */
  values: Float64Array;
  /** How many points were filled. */
  filled: number;
};

/**
 * Fills gaps in PHASE data by straight-line interpolation between the readings either side, as NIST
 * SP 1065 (Riley 2008, section on gaps in the data) allows for phase: a phase gap bridged by a line is
 * a stretch of constant frequency, which biases the deviations little when the gap is short. Frequency
 * data are refused: a frequency gap cannot be filled without inventing the phase it carries
 * (analyse the {@link longestContinuousSegment} instead). A gap at either end cannot be interpolated and
 * is refused too. Missing points are NaN in the values and/or gaps from {@link detectGaps}, whose
 * `missing` points are inserted. Always state the `filled` count beside any result.
 *
 * @param series kind of data ('phase' or 'frequency'), the values (NaN where missing), optional gaps
 * @returns the filled phase and the number of points filled
 * @throws {MetrologyError} 'phase_only' (frequency data), 'gap_at_end' (missing first or last point),
 *   'not_finite' (±Infinity), 'bad_argument' (bad gaps), 'too_few_points' (under 2 values)
 * @example fillPhaseGaps({ kind: 'phase', values: [0, 1, NaN, 3] }); // => { values: [0, 1, 2, 3], filled: 1 }
 */
export function fillPhaseGaps(series: { kind: 'phase' | 'frequency'; values: ArrayLike<number>; gaps?: GapReport['gaps'] }): FilledPhase {
  const fn = 'fillPhaseGaps';
  if (series.kind !== 'phase') {
    throw new MetrologyError(
      'phase_only',
      `${fn} fills gaps in phase data only: filling gaps in frequency data would invent phase; analyse the longest continuous segment instead`,
    );
  }
  if (series.values.length < 2) throw new MetrologyError('too_few_points', `${fn} requires at least 2 phase points`);
  const x = withGapsMarked(fn, series.values, series.gaps);
  if (Number.isNaN(x[0]!) || Number.isNaN(x[x.length - 1]!)) {
    throw new MetrologyError('gap_at_end', `${fn} cannot fill a gap at the start or end of the record (nothing to interpolate from): trim it`);
  }
  let filled = 0;
  let lastKnown = 0;
  for (let i = 1; i < x.length; i++) {
    if (Number.isNaN(x[i]!)) continue;
    const span = i - lastKnown;
    for (let k = 1; k < span; k++) {
      x[lastKnown + k] = x[lastKnown]! + ((x[i]! - x[lastKnown]!) * k) / span;
      filled++;
    }
    lastKnown = i;
  }
  return { values: x, filled };
}
