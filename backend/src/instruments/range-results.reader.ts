import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { InstrumentRange as RangeView } from '@kilocycle/common/types';
import type { DataSource, EntityManager } from 'typeorm';
import { InstrumentRange } from './instrument-range.entity.js';
import { toRangeView } from './range-view.js';

/** A range as a job's results compute with it: the one range shape of `common`. */
export type ResultsRange = RangeView;

/** Instrument ranges as other modules read them (inside the caller's transaction when a manager is given). */
@Injectable()
export class RangeResultsReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The instrument's ranges in their order. */
  async ranges(instrumentId: number, manager?: EntityManager): Promise<RangeView[]> {
    const rows = await (manager ?? this.dataSource.manager).find(InstrumentRange, { where: { instrumentId }, order: { position: 'ASC' } });
    return rows.map(toRangeView);
  }

  /** One range by id, or null. */
  async range(id: number, manager?: EntityManager): Promise<RangeView | null> {
    const row = await (manager ?? this.dataSource.manager).findOneBy(InstrumentRange, { id });
    return row ? toRangeView(row) : null;
  }
}
