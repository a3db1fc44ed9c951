import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { JobRunStatsSource } from '../shared/job-run-stats.js';
import { RunReadingStatsSource } from '../shared/run-reading-stats.js';

/** A job's runs as the jobs module asks about them; provided as JobRunStatsSource (see shared/job-run-stats.ts). */
@Injectable()
export class JobRunsReader extends JobRunStatsSource {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly readings: RunReadingStatsSource,
  ) {
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

  async readingCount(jobId: number, manager?: EntityManager): Promise<number> {
    const runs: Array<{ id: number }> = await (manager ?? this.dataSource).query('SELECT id FROM runs WHERE job_id = ?', [jobId]);
    return this.readings.countFor(
      runs.map((r) => Number(r.id)),
      manager,
    );
  }
}
