import { Injectable } from '@nestjs/common';
import type { JobStatus } from '@kilocycle/common/types';
import type { EntityManager } from 'typeorm';
import { Job } from './job.entity.js';

/**
 * A job's status as other modules move it (signing issues the job, an amendment reopens it), always in the
 * caller's transaction, which has locked the job's row first and records the audit event with the change.
 */
@Injectable()
export class JobStatusWriter {
  async setStatus(jobId: number, status: JobStatus, manager: EntityManager): Promise<void> {
    await manager.update(Job, { id: jobId }, { status });
  }
}
