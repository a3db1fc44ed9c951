import { ForbiddenException } from '@nestjs/common';
import type { Role, RunKind } from '@kilocycle/common/types';

/** Engineers run studies, not calibrations: these are the kinds they may open and record into. */
export const ENGINEER_RUN_KINDS: readonly RunKind[] = ['warmup', 'stability', 'supply_sensitivity', 'keying'];

/** 403 unless the role may open, change or record into a run of this kind. */
export function assertMayWriteRun(role: Role, kind: RunKind): void {
  if (role === 'admin' || role === 'lead' || role === 'technician') return;
  if (role === 'engineer' && ENGINEER_RUN_KINDS.includes(kind)) return;
  if (role === 'engineer') throw new ForbiddenException(`an engineer may work on ${ENGINEER_RUN_KINDS.join(', ')} runs, not ${kind}`);
  throw new ForbiddenException('lab records are read-only for this account');
}
