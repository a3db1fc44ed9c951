import type { Role } from '../types/auth.js';
import type { RunKind } from '../types/lab.js';
import { BENCH_ROLES } from './bench-roles.js';

/** Engineers run studies, not calibrations: these are the kinds they may open and record into. */
export const ENGINEER_RUN_KINDS: readonly RunKind[] = ['warmup', 'stability', 'supply_sensitivity', 'keying'];

/**
 * Why `role` may not open, change or record into a run of this kind (the 403's message), or null when it may:
 * the bench roles work on every run, an engineer only on studies, anyone else only reads.
 *
 * @example runWriteRefusal('technician', 'as_found'); // => null
 * @example runWriteRefusal('client', 'warmup'); // => 'lab records are read-only for this account'
 */
export function runWriteRefusal(role: Role, kind: RunKind): string | null {
  if (BENCH_ROLES.includes(role)) return null;
  if (role === 'engineer' && ENGINEER_RUN_KINDS.includes(kind)) return null;
  if (role === 'engineer') return `an engineer may work on ${ENGINEER_RUN_KINDS.join(', ')} runs, not ${kind}`;
  return 'lab records are read-only for this account';
}
