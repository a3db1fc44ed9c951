import { ForbiddenException } from '@nestjs/common';
import { runWriteRefusal } from '@kilocycle/common/rules';
import type { Role, RunKind } from '@kilocycle/common/types';

/** 403 unless the role may open, change or record into a run of this kind (the rule: common's runWriteRefusal). */
export function assertMayWriteRun(role: Role, kind: RunKind): void {
  const refusal = runWriteRefusal(role, kind);
  if (refusal !== null) throw new ForbiddenException(refusal);
}
