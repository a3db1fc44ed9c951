import { NotFoundException } from '@nestjs/common';
import type { EntityManager } from 'typeorm';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { Job } from '../jobs/job.entity.js';
import { Run } from '../runs/run.entity.js';

/** A job the user may see; another organisation's job answers 404 as if it did not exist. */
export async function findScopedJob(manager: EntityManager, user: Pick<AuthUser, 'role' | 'organizationId'>, jobId: number, lock = false): Promise<Job> {
  const job = await manager.findOne(Job, { where: { id: jobId }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
  const scope = organizationScope(user);
  if (!job || (scope !== null && job.organizationId !== scope)) throw new NotFoundException(`Job ${jobId} not found`);
  return job;
}

export async function findScopedRun(manager: EntityManager, user: Pick<AuthUser, 'role' | 'organizationId'>, runId: number): Promise<{ run: Run; job: Job }> {
  const run = await manager.findOne(Run, { where: { id: runId }, relations: { range: true } });
  if (!run) throw new NotFoundException(`Run ${runId} not found`);
  try {
    return { run, job: await findScopedJob(manager, user, run.jobId) };
  } catch {
    throw new NotFoundException(`Run ${runId} not found`);
  }
}
