import type { JobStatus, Role } from '@kilocycle/common/types';

const BENCH_ROLES: readonly Role[] = ['admin', 'lead', 'technician'];

/**
 * Who may move a job from one status to another by a plain status change. Leaving review is not a
 * status change: returning (with a comment and a mail to the technician) and signing (password
 * re-entry, certificate) go through POST /api/jobs/:id/return and /sign in the reviews module.
 */
export const JOB_TRANSITIONS: Readonly<Record<JobStatus, Partial<Record<JobStatus, readonly Role[]>>>> = {
  received: { in_progress: BENCH_ROLES },
  in_progress: { in_review: BENCH_ROLES },
  returned: { in_progress: BENCH_ROLES, in_review: BENCH_ROLES },
  in_review: {},
  approved: {},
  issued: {},
};

/** Jobs in these states still take runs and readings (and an instrument has at most one). */
export const OPEN_JOB_STATUSES: readonly JobStatus[] = ['received', 'in_progress', 'returned'];
/** A job is still active (an instrument has at most one) until approved. */
export const ACTIVE_JOB_STATUSES: readonly JobStatus[] = ['received', 'in_progress', 'in_review', 'returned'];
/** Once approved, a job's record is fixed. */
export const LOCKED_JOB_STATUSES: readonly JobStatus[] = ['approved', 'issued'];

/** Why `role` may not move a job from `from` to `to`, or null when it may. */
export function transitionRefusal(from: JobStatus, to: JobStatus, role: Role): { status: 403 | 409; message: string } | null {
  if (to === 'issued' || to === 'approved') {
    return { status: 409, message: `a job becomes ${to} when the lead signs it (POST /api/jobs/:id/sign), not by a status change` };
  }
  if (from === 'in_review' && to === 'returned') {
    return { status: 409, message: 'a job in review is returned with comments through POST /api/jobs/:id/return' };
  }
  const allowed = JOB_TRANSITIONS[from][to];
  if (!allowed) return { status: 409, message: `a job cannot go from ${from} to ${to}` };
  if (!allowed.includes(role)) return { status: 403, message: `moving a job from ${from} to ${to} needs one of the roles: ${allowed.join(', ')}` };
  return null;
}
