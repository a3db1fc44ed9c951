import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { Bench } from './bench.entity.js';

/** A bench as a run opened on it needs it: its name, whether it is in use, and the standard it takes by default. */
export type RunBench = { id: number; name: string; active: boolean; defaultStandardId: number | null };

/** Benches as the runs module reads them when a run is opened (in the caller's transaction when a manager is given). */
@Injectable()
export class RunBenchReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The bench, or null when there is no such bench. */
  async bench(id: number, manager?: EntityManager): Promise<RunBench | null> {
    const row = await (manager ?? this.dataSource.manager).findOneBy(Bench, { id });
    return row ? { id: row.id, name: row.name, active: row.active, defaultStandardId: row.defaultStandardId } : null;
  }
}
