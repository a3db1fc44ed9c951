import { ForbiddenException } from '@nestjs/common';
import { BENCH_ROLES } from '@kilocycle/common/rules';
import { CALIBRATION_RUN_KINDS, type JobStatus, type Role, type RunKind, type RunStatus } from '@kilocycle/common/types';

/** Engineers run studies, not calibrations: these are the kinds they may open and record into. */
export const ENGINEER_RUN_KINDS: readonly RunKind[] = ['warmup', 'stability', 'supply_sensitivity', 'keying'];

/** 403 unless the role may open, change or record into a run of this kind. */
export function assertMayWriteRun(role: Role, kind: RunKind): void {
  if (BENCH_ROLES.includes(role)) return;
  if (role === 'engineer' && ENGINEER_RUN_KINDS.includes(kind)) return;
  if (role === 'engineer') throw new ForbiddenException(`an engineer may work on ${ENGINEER_RUN_KINDS.join(', ')} runs, not ${kind}`);
  throw new ForbiddenException('lab records are read-only for this account');
}

/** How a run kind is written in sentences: as-found, as-left, warm-up… */
export function runKindWords(kind: RunKind): string {
  return kind === 'supply_sensitivity' ? 'supply sensitivity' : kind === 'warmup' ? 'warm-up' : kind.replace('_', '-');
}

/**
 * A calibration run (as-found, as-left) states results against a reference standard, so it cannot be
 * opened or submitted without one. Returns the sentence naming each such run that lacks one, or null.
 */
export function missingStandards(runs: ReadonlyArray<{ id: number; kind: RunKind; rangeLabel: string; standardId: number | null }>): string | null {
  const missing = runs.filter((r) => CALIBRATION_RUN_KINDS.includes(r.kind) && r.standardId === null);
  if (missing.length === 0) return null;
  return missing.map((r) => `run ${r.id} (${runKindWords(r.kind)}, ${r.rangeLabel}) has no reference standard`).join('; ');
}

/** Why a run takes no readings now (closed, or its job in review or signed), or null when it does. */
export function refusalReason(ctx: { runId: number; status: RunStatus; jobStatus: JobStatus }): string | null {
  if (ctx.status !== 'open') return `run ${ctx.runId} is closed`;
  if (ctx.jobStatus === 'approved' || ctx.jobStatus === 'issued') return `run ${ctx.runId} belongs to a job that is ${ctx.jobStatus}`;
  if (ctx.jobStatus === 'in_review') return `run ${ctx.runId} belongs to a job that is in review`;
  return null;
}
