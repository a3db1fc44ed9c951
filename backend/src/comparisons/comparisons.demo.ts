import type { EntityManager } from 'typeorm';
import { Comparison } from './comparison.entity.js';

/**
 * The demo's saved comparison: the Saltmarsh receiver's two warm-up studies, before and after the
 * regulator change (the lab-records demo makes the runs and calls this with their ids).
 */
export async function insertDemoComparison(
  manager: EntityManager,
  spec: { instrumentId: number; beforeRunId: number; afterRunId: number; createdById: number },
): Promise<void> {
  await manager.insert(Comparison, {
    title: 'CR-7 local oscillator warm-up: before and after the gas regulator valve',
    notes: 'Both cold starts after 12 h off, dial at 7.000 MHz, BFO off. The regulator holds the oscillator HT steady while the rectifier and filter warm up.',
    instrumentId: spec.instrumentId,
    kind: 'warmup',
    runIds: [spec.beforeRunId, spec.afterRunId],
    labels: ['before: original unregulated HT', 'after: gas regulator valve on the oscillator HT'],
    withinHz: null,
    windowSeconds: null,
    createdById: spec.createdById,
  });
}
