import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource } from 'typeorm';
import { organizationScope, type AuthUser } from '../auth/auth-user.js';
import { IngestException, payloadObject, runIdOf } from '../shared/socket-refusal.js';

@Injectable()
export class LiveService {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /**
   * The run a user may watch, with its last seq; a client sees only its own organisation's runs and
   * is told "no run" for any other, exactly as the REST routes answer 404.
   */
  async runFor(user: AuthUser, payload: unknown): Promise<{ runId: number; lastSeq: number }> {
    const runId = runIdOf(payloadObject(payload, '{runId}'));
    const [row] = await this.dataSource.query(
      `SELECT j.organization_id, (SELECT COALESCE(MAX(seq), 0) FROM readings WHERE run_id = r.id) AS last_seq
         FROM runs r JOIN jobs j ON j.id = r.job_id WHERE r.id = ?`,
      [runId],
    );
    const scope = organizationScope(user);
    if (!row || (scope !== null && Number(row.organization_id) !== scope)) throw new IngestException('run_not_found', `there is no run ${runId}`);
    return { runId, lastSeq: Number(row.last_seq) };
  }
}
