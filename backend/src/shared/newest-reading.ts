import type { ReadingSource } from '@kilocycle/common/types';

/** A run's newest reading (its highest seq): when it was received and which path stored it. */
export type NewestReading = { receivedAt: Date; source: ReadingSource };

/**
 * The newest reading of runs, for the runs module (its list page tells a bridge's last reading). Declared here and
 * provided by ReadingsModule (RunReadingsReader) so that runs can ask without importing readings, which itself
 * depends on runs for a run's write context and counters: the dependency points one way, readings → runs. The
 * counts themselves are the runs table's own counters.
 */
export abstract class NewestReadingSource {
  /** For each run given with its last seq (from its counters), the reading at that seq; runs without readings are left out. */
  abstract newest(runs: ReadonlyArray<{ runId: number; lastSeq: number }>): Promise<Map<number, NewestReading>>;
}
