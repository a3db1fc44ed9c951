import type { EntityManager } from 'typeorm';
import type { RunDataKind, RunKind } from '@kilocycle/common/types';
import { Run } from './run.entity.js';

export type DemoRunSpec = {
  jobId: number;
  rangeId: number;
  kind: RunKind;
  /** Default frequency; phase (time interval, s) for a stability run fed by a time-interval counter. */
  dataKind?: RunDataKind;
  standardId: number | null;
  benchId?: number | null;
  createdBy: number;
  startedAt: Date;
  /** How long the run took; null leaves it open. */
  minutes: number | null;
  configuration: string;
  notes?: string | null;
  /** The mains voltage recorded for the run (the certificate prints it); default none. */
  supplyVoltage?: number | null;
};

/** Inserts one demo run (closed after `minutes`, or open), part of the seed's one transaction. */
export async function insertDemoRun(manager: EntityManager, spec: DemoRunSpec): Promise<{ id: number; startedAt: Date }> {
  const result = await manager.insert(Run, {
    jobId: spec.jobId,
    rangeId: spec.rangeId,
    kind: spec.kind,
    dataKind: spec.dataKind ?? 'frequency',
    status: spec.minutes === null ? 'open' : 'closed',
    benchId: spec.benchId ?? null,
    standardId: spec.standardId,
    standardOverrideReason: null,
    supplyVoltage: spec.supplyVoltage ?? null,
    configuration: spec.configuration,
    notes: spec.notes ?? null,
    startedAt: spec.startedAt,
    endedAt: spec.minutes === null ? null : new Date(spec.startedAt.getTime() + spec.minutes * 60_000),
    createdById: spec.createdBy,
  });
  return { id: result.identifiers[0].id as number, startedAt: spec.startedAt };
}
