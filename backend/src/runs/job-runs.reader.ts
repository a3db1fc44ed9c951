import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { JobRunStatsSource } from '../shared/job-run-stats.js';

/** A job's runs as the jobs module asks about them; provided as JobRunStatsSource (see shared/job-run-stats.ts). */
@Injectable()
export class JobRunsReader extends JobRunStatsSource {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {
    super();
  }

  async runCounts(jobIds: readonly number[]): Promise<Map<number, number>> {
    if (jobIds.length === 0) return new Map();
    const rows: Array<{ job_id: number; n: number | string }> = await this.dataSource.query(
      'SELECT job_id, COUNT(*) AS n FROM runs WHERE job_id IN (?) GROUP BY job_id',
      [jobIds],
    );
    return new Map(rows.map((row) => [Number(row.job_id), Number(row.n)]));
  }

  /** How many readings the job's runs hold together, from their counters, in the caller's transaction when one is given. */
  async readingCount(jobId: number, manager?: EntityManager): Promise<number> {
    const [{ n }] = await (manager ?? this.dataSource).query('SELECT COALESCE(SUM(reading_count), 0) AS n FROM runs WHERE job_id = ?', [jobId]);
    return Number(n);
  }
}
