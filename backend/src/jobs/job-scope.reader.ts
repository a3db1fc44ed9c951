import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { JobStatus } from '@kilocycle/common/types';
import type { DataSource, EntityManager } from 'typeorm';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';

/** Whose a job is, its number, status and instrument: what the modules under a job (runs) need for scope checks and locks. */
export type JobScope = { id: number; number: string; organizationId: number; status: JobStatus; instrumentId: number };

@Injectable()
export class JobScopeReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The job, or null; with `lock` its row is locked (FOR UPDATE) in the caller's transaction. */
  async scope(jobId: number, manager?: EntityManager, lock = false): Promise<JobScope | null> {
    const [row] = await (manager ?? this.dataSource).query(
      `SELECT id, number, organization_id, status, instrument_id FROM jobs WHERE id = ?${lock ? ' FOR UPDATE' : ''}`,
      [jobId],
    );
    return row
      ? {
          id: Number(row.id),
          number: String(row.number),
          organizationId: Number(row.organization_id),
          status: row.status as JobStatus,
          instrumentId: Number(row.instrument_id),
        }
      : null;
  }

  /** The job if this user may see it; another organisation's job answers 404 as if it did not exist. `lock` as in scope(). */
  async visible(user: Pick<AuthUser, 'role' | 'organizationId'>, jobId: number, manager?: EntityManager, lock = false): Promise<JobScope> {
    const job = await this.scope(jobId, manager, lock);
    const scope = organizationScope(user);
    if (!job || (scope !== null && job.organizationId !== scope)) throw new NotFoundException(`Job ${jobId} not found`);
    return job;
  }

  /** The numbers of these jobs, keyed by id (lists of records that belong to jobs: invoices). */
  async numbers(jobIds: readonly number[], manager?: EntityManager): Promise<Map<number, string>> {
    if (jobIds.length === 0) return new Map();
    const rows: Array<{ id: number; number: string }> = await (manager ?? this.dataSource).query('SELECT id, number FROM jobs WHERE id IN (?)', [
      [...new Set(jobIds)],
    ]);
    return new Map(rows.map((r) => [Number(r.id), String(r.number)]));
  }
}
