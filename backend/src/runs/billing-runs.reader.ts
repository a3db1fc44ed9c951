import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { CALIBRATION_RUN_KINDS } from '@kilocycle/common/types';
import type { DataSource, EntityManager } from 'typeorm';

/** Runs as the price list counts them (a quote's or invoice's per-hour lines). */
@Injectable()
export class BillingRunsReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /**
   * The time the job's study runs (every kind but as-found and as-left) recorded, in seconds: each run from its
   * start to its end (an open run up to now), summed. In the caller's transaction when one is given.
   */
  async studySeconds(jobId: number, manager?: EntityManager): Promise<number> {
    const [row] = await (manager ?? this.dataSource.manager).query(
      'SELECT COALESCE(SUM(GREATEST(0, TIMESTAMPDIFF(SECOND, started_at, COALESCE(ended_at, UTC_TIMESTAMP(3))))), 0) AS s FROM runs WHERE job_id = ? AND kind NOT IN (?)',
      [jobId, [...CALIBRATION_RUN_KINDS]],
    );
    return Number(row?.s ?? 0);
  }
}
