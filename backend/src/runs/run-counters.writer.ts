import { Injectable } from '@nestjs/common';
import type { EntityManager } from 'typeorm';

/**
 * Adds a stored batch to its run's counters, in the caller's transaction (the batch's own). `topSeq` is the
 * highest seq of the batch's valid readings: any of them not stored now was stored before, so it cannot be above
 * the run's last seq. A plain function as well as the writer's method, for the demo seed's readings.
 */
export async function addReadingsToRun(manager: EntityManager, runId: number, count: number, topSeq: number): Promise<void> {
  if (count <= 0) return;
  await manager.query('UPDATE runs SET reading_count = reading_count + ?, last_seq = GREATEST(last_seq, ?) WHERE id = ?', [count, topSeq, runId]);
}

/**
 * The write side of a run's counters (reading_count, excluded_count, last_seq): the readings module calls it inside
 * the transaction of each batch and each exclusion, so the counters commit, or roll back, with the rows they count.
 */
@Injectable()
export class RunCountersWriter {
  /**
   * Locks the run row (FOR UPDATE) in the caller's transaction and answers its last seq: writers of one run take
   * turns here, so readings numbered after the last one, and the last seq a batch answers with, are exact.
   * Null when there is no such run.
   */
  async lockLastSeq(runId: number, manager: EntityManager): Promise<number | null> {
    const [row] = await manager.query('SELECT last_seq FROM runs WHERE id = ? FOR UPDATE', [runId]);
    return row ? Number(row.last_seq) : null;
  }

  addReadings(runId: number, count: number, topSeq: number, manager: EntityManager): Promise<void> {
    return addReadingsToRun(manager, runId, count, topSeq);
  }

  async addExclusion(runId: number, manager: EntityManager): Promise<void> {
    await manager.query('UPDATE runs SET excluded_count = excluded_count + 1 WHERE id = ?', [runId]);
  }
}
