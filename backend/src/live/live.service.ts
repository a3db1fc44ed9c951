import { Injectable } from '@nestjs/common';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { ReadingsWriter } from '../readings/readings-writer.service.js';
import { RunContextReader } from '../runs/run-context.reader.js';
import { IngestException, payloadObject, runIdOf } from '../shared/socket-refusal.js';

@Injectable()
export class LiveService {
  constructor(
    private readonly runs: RunContextReader,
    private readonly writer: ReadingsWriter,
  ) {}

  /**
   * The run a user may watch, with its last seq; a client sees only its own organisation's runs and
   * is told "no run" for any other, exactly as the REST routes answer 404.
   */
  async runFor(user: AuthUser, payload: unknown): Promise<{ runId: number; lastSeq: number }> {
    const runId = runIdOf(payloadObject(payload, '{runId}'));
    const run = await this.runs.scope(runId);
    const scope = organizationScope(user);
    if (!run || (scope !== null && run.organizationId !== scope)) throw new IngestException('run_not_found', `there is no run ${runId}`);
    return { runId, lastSeq: await this.writer.lastSeq(runId) };
  }
}
