import type { RunDataKind, RunKind } from '../types/lab.js';

/** The run kinds whose readings may be phase (time interval) rather than frequency. */
export const PHASE_RUN_KINDS: readonly RunKind[] = ['stability'];

/**
 * Why a run of this kind cannot hold readings of this data kind (the 400's message), or null when it can:
 * every kind holds frequency; only stability runs hold phase, since the other studies and the calibrations
 * fit frequency against dial, time, supply or key.
 *
 * @example runDataKindRefusal('stability', 'phase'); // => null
 * @example runDataKindRefusal('warmup', 'phase'); // => 'phase (time-interval) readings are kept in stability runs only, not in a warmup run'
 */
export function runDataKindRefusal(kind: RunKind, dataKind: RunDataKind): string | null {
  if (dataKind === 'frequency' || PHASE_RUN_KINDS.includes(kind)) return null;
  return `phase (time-interval) readings are kept in stability runs only, not in a ${kind} run`;
}

/**
 * Why a reading giving `given` cannot go into a run holding `held` (a mixed run), or null when it can.
 *
 * @example mixedRunRefusal(12, 'phase', 'frequency'); // => 'run 12 holds phase readings (time interval, s): a frequency reading would make it a mixed run; send timeInterval'
 */
export function mixedRunRefusal(runId: number, held: RunDataKind, given: RunDataKind): string | null {
  if (held === given) return null;
  return held === 'phase'
    ? `run ${runId} holds phase readings (time interval, s): a frequency reading would make it a mixed run; send timeInterval`
    : `run ${runId} holds frequency readings (Hz): a time-interval reading would make it a mixed run; send frequency, or open a phase stability run`;
}
