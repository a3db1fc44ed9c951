import type { Role } from '../types/auth.js';
import type { JobStatus } from '../types/lab.js';
import { BENCH_ROLES } from './bench-roles.js';

/**
 * Who may move a job from one status to another by a plain status change. Leaving review is not a
 * status change: returning (with a comment and a mail to the technician) and signing (password
 * re-entry, certificate) go through POST /api/jobs/:id/return and /sign.
 */
export const JOB_TRANSITIONS: Readonly<Record<JobStatus, Partial<Record<JobStatus, readonly Role[]>>>> = {
  received: { in_progress: BENCH_ROLES },
  in_progress: { in_review: BENCH_ROLES },
  returned: { in_progress: BENCH_ROLES, in_review: BENCH_ROLES },
  in_review: {},
  approved: {},
  issued: {},
};

export type JobTransitionRefusal = { status: 403 | 409; message: string };

/**
 * Why `role` may not move a job from `from` to `to` by a status change, or null when it may:
 * 409 when no one may (the move goes another way or not at all), 403 when other roles may.
 *
 * @example jobTransitionRefusal('received', 'in_progress', 'technician'); // => null
 * @example jobTransitionRefusal('received', 'in_progress', 'engineer')?.status; // => 403
 */
export function jobTransitionRefusal(from: JobStatus, to: JobStatus, role: Role): JobTransitionRefusal | null {
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
