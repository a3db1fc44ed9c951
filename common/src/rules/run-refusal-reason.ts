import type { JobStatus, RunStatus } from '../types/lab.js';

/** Why a run takes no readings now (closed, or its job in review or signed), or null when it does. */
export function runRefusalReason(ctx: { runId: number; status: RunStatus; jobStatus: JobStatus }): string | null {
  if (ctx.status !== 'open') return `run ${ctx.runId} is closed`;
  if (ctx.jobStatus === 'approved' || ctx.jobStatus === 'issued') return `run ${ctx.runId} belongs to a job that is ${ctx.jobStatus}`;
  if (ctx.jobStatus === 'in_review') return `run ${ctx.runId} belongs to a job that is in review`;
  return null;
}
