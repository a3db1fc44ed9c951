import type { EntityManager } from 'typeorm';
import { addReadingsToRun } from '../runs/run-counters.writer.js';

/** A demo reading: [seq, t in seconds since the run started, dial or null, frequency in Hz, aux or null]. */
export type DemoReadingRow = [number, number, number | null, number, number | null];

/**
 * Stores a run's generated demo readings (source import unless told, received as their t says), 1,000 to a
 * multi-row INSERT: the demo's stability run alone has 3,600. Part of the seed's one transaction.
 */
export async function insertDemoReadings(
  manager: EntityManager,
  runId: number,
  startedAt: Date,
  rows: readonly DemoReadingRow[],
  source: 'import' | 'manual' = 'import',
): Promise<void> {
  for (let from = 0; from < rows.length; from += 1000) {
    const values = rows
      .slice(from, from + 1000)
      .map(([seq, t, dial, frequency, aux]) => [runId, seq, t, dial, frequency, aux, source, new Date(startedAt.getTime() + t * 1000)]);
    await manager.query('INSERT INTO readings (run_id, seq, t_s, dial, frequency_hz, aux, source, received_at) VALUES ?', [values]);
  }
  // The run's counters, as the write path keeps them.
  await addReadingsToRun(
    manager,
    runId,
    rows.length,
    rows.reduce((top, [seq]) => Math.max(top, seq), 0),
  );
}
