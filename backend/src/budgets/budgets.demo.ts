import type { EntityManager } from 'typeorm';
import type { DecisionRule, ExtraComponent } from '@kilocycle/common/types';
import { JobProcedure } from './job-procedure.entity.js';
import { recordProcedureVersion } from './procedure-versions.js';
import { Procedure } from './procedure.entity.js';

export type DemoProcedureSpec = {
  name: string;
  method: string;
  decisionRule: DecisionRule;
  dialHalfDivisionPercentOfSpan: number;
  driftPpm: number;
  driftHz: number;
  extraComponents: ExtraComponent[];
  isDefault: boolean;
};

/** Inserts one demo procedure and its first version (no author); returns its id. Part of the seed's one transaction. */
export async function insertDemoProcedure(manager: EntityManager, spec: DemoProcedureSpec): Promise<number> {
  const id = (await manager.insert(Procedure, spec)).identifiers[0].id as number;
  await recordProcedureVersion(manager, id, null);
  return id;
}

/** Chooses the procedure for a demo job. Part of the seed's one transaction. */
export async function insertDemoJobProcedure(manager: EntityManager, jobId: number, procedureId: number): Promise<void> {
  await manager.insert(JobProcedure, { jobId, procedureId });
}
