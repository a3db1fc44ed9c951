import type { JobStatus } from '../types/lab.js';

/** Once signed (approved, then issued), a job's record is fixed: no edits, runs or readings. */
export const LOCKED_JOB_STATUSES: readonly JobStatus[] = ['approved', 'issued'];
