import { CALIBRATION_RUN_KINDS, type RunKind } from '../types/lab.js';
import { runKindWords } from './run-kind-words.js';

/**
 * A calibration run (as-found, as-left) states results against a reference standard, so it cannot be
 * opened or submitted without one. Returns the sentence naming each such run that lacks one, or null.
 */
export function missingStandards(runs: ReadonlyArray<{ id: number; kind: RunKind; rangeLabel: string; standardId: number | null }>): string | null {
  const missing = runs.filter((r) => CALIBRATION_RUN_KINDS.includes(r.kind) && r.standardId === null);
  if (missing.length === 0) return null;
  return missing.map((r) => `run ${r.id} (${runKindWords(r.kind)}, ${r.rangeLabel}) has no reference standard`).join('; ');
}
