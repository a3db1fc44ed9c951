import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { JobStatus } from '@kilocycle/common/types';
import type { DataSource, EntityManager } from 'typeorm';

/** The job fields a job's results and its certificate start from. */
export type JobHead = { id: number; number: string; status: JobStatus; instrumentId: number };

/** Jobs as budgets' job results read them (inside the signing transaction when a manager is given). */
@Injectable()
export class JobResultsJobReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  async head(jobId: number, manager?: EntityManager): Promise<JobHead | null> {
    const rows: Array<Record<string, unknown>> = await (manager ?? this.dataSource.manager).query(
      'SELECT id, number, status, instrument_id FROM jobs WHERE id = ?',
      [jobId],
    );
    const row = rows[0];
    return row ? { id: Number(row.id), number: String(row.number), status: row.status as JobStatus, instrumentId: Number(row.instrument_id) } : null;
  }
}
