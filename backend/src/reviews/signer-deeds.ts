import type { EntityManager } from 'typeorm';
import type { SignerDeed } from '@kilocycle/common/types';
import type { AuditLogService } from '../audit/audit-log.service.js';
import type { ReadingResultsReader } from '../readings/reading-results.reader.js';
import type { RunResultsReader } from '../runs/run-results.reader.js';

/** The owners asked: runs (the job's runs and who opened them), audit (the events) and readings (exclusions). */
export type SignerDeedSources = { runs: RunResultsReader; audit: AuditLogService; readings: ReadingResultsReader };

/**
 * What a user did to a job's data, for the no-self-sign rule: the runs they opened (runs.created_by),
 * the readings they typed or imported and the budgets they edited (the audit trail: each stored batch,
 * each import and each budget edit writes its event in the same transaction as the change), and the
 * readings they excluded (reading_exclusions.excluded_by, the record itself). The readings' own author
 * column says the same as the batch events; it is not scanned here, as a run may hold a million readings.
 * One call per owner: the job's runs first, then their audit events and exclusions together.
 */
export async function readSignerDeeds(sources: SignerDeedSources, jobId: number, userId: number, manager?: EntityManager): Promise<SignerDeed[]> {
  const runs = (await sources.runs.jobRuns(jobId, manager)).sort((a, b) => a.id - b.id);
  const runIds = runs.map((r) => r.id);
  const [events, exclusions] = await Promise.all([
    sources.audit.actorEvents('run', runIds.map(String), userId, ['readings', 'import', 'budget'], manager),
    sources.readings.exclusions(runIds, manager),
  ]);
  const deeds: SignerDeed[] = runs.filter((r) => r.createdBy === userId).map((r) => ({ kind: 'opened_run', runId: r.id }));
  for (const e of events) {
    const runId = Number(e.entityId);
    const changes = e.changes;
    if (e.action === 'budget') deeds.push({ kind: 'edited_budget', runId });
    else if (e.action === 'import') deeds.push({ kind: 'imported', runId, readings: Number(changes?.imported ?? 0) });
    else if (changes?.source === 'import') deeds.push({ kind: 'imported', runId, readings: Number(changes.accepted ?? 0) });
    else deeds.push({ kind: 'entered', runId, readings: Number(changes?.accepted ?? 0) });
  }
  for (const x of exclusions) if (x.excludedBy === userId) deeds.push({ kind: 'excluded', runId: x.runId, seq: x.seq });
  return deeds;
}
