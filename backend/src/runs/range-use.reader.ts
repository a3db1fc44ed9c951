import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { RangeUseSource } from '../shared/range-use.js';

/** Which ranges have runs, for the instruments module (see RangeUseSource). */
@Injectable()
export class RangeUseReader extends RangeUseSource {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {
    super();
  }

  async rangesWithRuns(rangeIds: readonly number[], manager?: EntityManager): Promise<Set<number>> {
    if (rangeIds.length === 0) return new Set();
    const rows: Array<{ range_id: number }> = await (manager ?? this.dataSource.manager).query('SELECT DISTINCT range_id FROM runs WHERE range_id IN (?)', [
      [...rangeIds],
    ]);
    return new Set(rows.map((row) => Number(row.range_id)));
  }
}
