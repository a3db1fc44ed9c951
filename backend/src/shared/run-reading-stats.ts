import type { EntityManager } from 'typeorm';
import type { ReadingSource } from '@kilocycle/common/types';

/** What a run's list row shows about its readings. */
export type RunReadingStats = {
  readingCount: number;
  excludedCount: number;
  /** 0 when the run has no readings. */
  lastSeq: number;
  /** The newest reading (highest seq): when it was received and which path stored it; null without readings. */
  newest: { receivedAt: Date; source: ReadingSource } | null;
};

/**
 * Reading counts per run, for the runs module (its list page). Declared here and provided by ReadingsModule
 * (RunReadingsReader) so that runs can ask without importing readings, which itself depends on runs for a
 * run's write context: the dependency points one way, readings → runs.
 */
export abstract class RunReadingStatsSource {
  /** Stats for each run id given (runs without readings get zero counts). */
  abstract statsFor(runIds: readonly number[]): Promise<Map<number, RunReadingStats>>;
  /** How many readings these runs hold together, in the caller's transaction when one is given. */
  abstract countFor(runIds: readonly number[], manager?: EntityManager): Promise<number>;
}
