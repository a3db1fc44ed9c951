import type { DemoContext } from '../seed/demo-seed.js';
import { Comparison } from './comparison.entity.js';

/**
 * The demo's saved comparison: the Saltmarsh receiver's two warm-up studies, before and after the
 * regulator change (the lab-records demo makes the runs). When those runs are not there the demo
 * simply has no saved comparison.
 */
export async function seedDemoComparisons({ manager, customerIds, userIds }: DemoContext): Promise<void> {
  const runs: Array<{ id: number; instrument_id: number }> = await manager.query(
    `SELECT r.id, j.instrument_id FROM runs r JOIN jobs j ON j.id = r.job_id JOIN instruments i ON i.id = j.instrument_id
      WHERE i.organization_id = ? AND r.kind = 'warmup' ORDER BY j.instrument_id, r.started_at, r.id`,
    [customerIds.saltmarsh],
  );
  const first = runs[0];
  const pair = first ? runs.filter((r) => r.instrument_id === first.instrument_id).slice(0, 2) : [];
  const engineer = userIds['engineer@kilocycle.test'];
  if (pair.length < 2 || engineer === undefined) return;
  await manager.insert(Comparison, {
    title: 'CR-7 local oscillator warm-up: before and after the gas regulator valve',
    notes: 'Both cold starts after 12 h off, dial at 7.000 MHz, BFO off. The regulator holds the oscillator HT steady while the rectifier and filter warm up.',
    instrumentId: Number(first!.instrument_id),
    kind: 'warmup',
    runIds: pair.map((r) => Number(r.id)),
    labels: ['before: original unregulated HT', 'after: gas regulator valve on the oscillator HT'],
    withinHz: null,
    windowSeconds: null,
    createdById: engineer,
  });
}
