import type { EntityManager } from 'typeorm';
import type { SignerDeed } from '@kilocycle/common/types';

/**
 * What a user did to a job's data, for the no-self-sign rule: the runs they opened (runs.created_by),
 * the readings they typed or imported and the budgets they edited (the audit trail: each stored batch,
 * each import and each budget edit writes its event in the same transaction as the change), and the
 * readings they excluded (reading_exclusions.excluded_by, the record itself). The readings' own author
 * column says the same as the batch events; it is not scanned here, as a run may hold a million readings.
 */
export async function readSignerDeeds(manager: EntityManager, jobId: number, userId: number): Promise<SignerDeed[]> {
  const [opened, events, excluded] = await Promise.all([
    manager.query('SELECT id FROM runs WHERE job_id = ? AND created_by = ? ORDER BY id', [jobId, userId]) as Promise<Array<{ id: number }>>,
    manager.query(
      `SELECT e.entity_id, e.action, e.changes FROM audit_events e
        WHERE e.entity = 'run' AND e.actor_id = ? AND e.action IN ('readings', 'import', 'budget')
          AND e.entity_id IN (SELECT CAST(id AS CHAR) FROM runs WHERE job_id = ?)
        ORDER BY e.id`,
      [userId, jobId],
    ) as Promise<Array<{ entity_id: string; action: string; changes: unknown }>>,
    manager.query(
      `SELECT x.run_id, r.seq FROM reading_exclusions x JOIN readings r ON r.id = x.reading_id JOIN runs u ON u.id = x.run_id
        WHERE u.job_id = ? AND x.excluded_by = ? ORDER BY x.run_id, r.seq`,
      [jobId, userId],
    ) as Promise<Array<{ run_id: number; seq: number }>>,
  ]);
  const deeds: SignerDeed[] = opened.map((r) => ({ kind: 'opened_run', runId: Number(r.id) }));
  for (const e of events) {
    const runId = Number(e.entity_id);
    const changes = (typeof e.changes === 'string' ? JSON.parse(e.changes) : e.changes) as Record<string, unknown> | null;
    if (e.action === 'budget') deeds.push({ kind: 'edited_budget', runId });
    else if (e.action === 'import') deeds.push({ kind: 'imported', runId, readings: Number(changes?.imported ?? 0) });
    else if (changes?.source === 'import') deeds.push({ kind: 'imported', runId, readings: Number(changes.accepted ?? 0) });
    else deeds.push({ kind: 'entered', runId, readings: Number(changes?.accepted ?? 0) });
  }
  for (const x of excluded) deeds.push({ kind: 'excluded', runId: Number(x.run_id), seq: Number(x.seq) });
  return deeds;
}
