import { ConflictException } from '@nestjs/common';
import { LOCKED_JOB_STATUSES } from '@kilocycle/common/rules';
import type { JobStatus } from '@kilocycle/common/types';

/** Once signed (approved, then issued) a job's runs, readings, budgets and fields are fixed. */
export function isJobSigned(status: JobStatus): boolean {
  return LOCKED_JOB_STATUSES.includes(status);
}

/**
 * Throws 409 when a job's record may no longer change. Every write path that touches a job's data (job
 * fields, runs, readings and their exclusions, budgets, the procedure) calls it with the job's status.
 */
export function assertJobEditable(status: JobStatus, what = 'the job'): void {
  if (isJobSigned(status)) {
    throw new ConflictException(`${what} cannot change: the job is ${status} (signed); amend the certificate to reopen it`);
  }
}
