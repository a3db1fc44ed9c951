import type { InstrumentRange as RangeView, RangeInput } from '@kilocycle/common/types';
import type { InstrumentRange } from './instrument-range.entity.js';

/** A range's measurement columns, as stored and as shown (everything but its id and position). */
export function rangeColumns(r: RangeInput): Omit<RangeView, 'id' | 'position'> {
  return {
    label: r.label,
    dialUnit: r.dialUnit,
    dialLaw: r.dialLaw,
    dialMin: r.dialMin,
    dialMax: r.dialMax,
    freqMinHz: r.freqMinHz,
    freqMaxHz: r.freqMaxHz,
    tolerance: r.tolerance,
    multipliers: r.multipliers,
  };
}

/** The one mapping of a stored range to the range shape of `common` (the API, signed records, job results). */
export function toRangeView(r: InstrumentRange): RangeView {
  return { id: r.id, position: r.position, ...rangeColumns(r) };
}
