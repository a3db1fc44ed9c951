import { MetrologyError } from './metrology-error.js';
import type { GapReport } from './detect-gaps.js';

// Internal: a series with its gaps marked as NaN, from NaN already in the values and/or the gaps
// reported by detectGaps (each gap's `missing` readings inserted before its `index`).

/** Values with NaN where readings are missing. */
export function withGapsMarked(fn: string, values: ArrayLike<number>, gaps: GapReport['gaps'] | undefined): Float64Array {
  for (let i = 0; i < values.length; i++) {
    const value = values[i];
    if (typeof value !== 'number' || (!Number.isFinite(value) && !Number.isNaN(value))) {
      throw new MetrologyError('not_finite', `${fn} requires finite numbers or NaN for a missing reading (index ${i} is ${String(value)})`);
    }
  }
  if (gaps === undefined || gaps.length === 0) return Float64Array.from(values as ArrayLike<number>);
  let previous = 0;
  let missing = 0;
  for (const gap of gaps) {
    if (!(
      Number.isInteger(gap.index) &&
      gap.index > previous - 1 &&
      gap.index >= 1 &&
      gap.index < values.length &&
      Number.isInteger(gap.missing) &&
      gap.missing >= 1
    )) {
      throw new MetrologyError('bad_argument', `${fn} requires gaps in order, each before a reading (1 … ${values.length - 1}) with a whole missing count ≥ 1`);
    }
    previous = gap.index + 1;
    missing += gap.missing;
  }
  const out = new Float64Array(values.length + missing).fill(Number.NaN);
  let source = 0;
  let target = 0;
  for (const gap of gaps) {
    while (source < gap.index) out[target++] = values[source++]!;
    target += gap.missing;
  }
  while (source < values.length) out[target++] = values[source++]!;
  return out;
}
