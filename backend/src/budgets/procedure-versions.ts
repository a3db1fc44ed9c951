import type { EntityManager } from 'typeorm';
import type { ProcedureVersion } from '@kilocycle/common/types';
import { ProcedureVersionRow } from './procedure-version.entity.js';
import { Procedure } from './procedure.entity.js';

/** What a version of a procedure keeps: the method, the decision rule and the budget defaults. */
export function procedureFigures(p: Procedure): ProcedureVersion {
  return {
    id: p.id,
    version: p.version,
    name: p.name,
    method: p.method,
    decisionRule: p.decisionRule,
    dialHalfDivisionPercentOfSpan: Number(p.dialHalfDivisionPercentOfSpan),
    driftPpm: Number(p.driftPpm),
    driftHz: Number(p.driftHz),
    extraComponents: p.extraComponents ?? [],
  };
}

/**
 * Writes the procedure's current row as its version `procedure.version`, inside the caller's transaction:
 * called when a procedure is created and after every edit of what it computes or prints.
 */
export async function recordProcedureVersion(manager: EntityManager, procedureId: number, actorId: number | null): Promise<void> {
  const procedure = await manager.findOneByOrFail(Procedure, { id: procedureId });
  await manager.insert(ProcedureVersionRow, { procedureId, version: procedure.version, figures: procedureFigures(procedure), createdById: actorId });
}
