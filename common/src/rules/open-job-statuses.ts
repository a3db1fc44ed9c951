import type { JobStatus } from '../types/lab.js';

/** A job in one of these statuses still takes runs, readings and corrections (an instrument has at most one). */
export const OPEN_JOB_STATUSES: readonly JobStatus[] = ['received', 'in_progress', 'returned'];
