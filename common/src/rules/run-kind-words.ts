import type { RunKind } from '../types/lab.js';

/** How a run kind is written in sentences: as-found, as-left, warm-up… */
export function runKindWords(kind: RunKind): string {
  return kind === 'supply_sensitivity' ? 'supply sensitivity' : kind === 'warmup' ? 'warm-up' : kind.replace('_', '-');
}
