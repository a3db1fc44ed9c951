import type { JobStatus } from '../types/lab.js';

/** A job is still active (an instrument has at most one) until it is approved. */
export const ACTIVE_JOB_STATUSES: readonly JobStatus[] = ['received', 'in_progress', 'in_review', 'returned'];
