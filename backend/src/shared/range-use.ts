import type { EntityManager } from 'typeorm';

/**
 * Which instrument ranges have runs (a range with runs cannot be removed). Declared here and provided by
 * RunsModule (runs/range-use.reader.ts), so that instruments can ask without importing runs, which
 * itself depends on instruments (a run is made on a range): the dependency points one way, runs → instruments.
 */
export abstract class RangeUseSource {
  /** The ids among these ranges that have at least one run, in the caller's transaction when one is given. */
  abstract rangesWithRuns(rangeIds: readonly number[], manager?: EntityManager): Promise<Set<number>>;
}
