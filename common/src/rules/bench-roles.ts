import type { Role } from '../types/auth.js';

/**
 * Roles that work at the bench: they receive instruments, open and edit jobs, move a job towards
 * review, capture readings and attach files. Engineers only read (and run their own studies).
 */
export const BENCH_ROLES: readonly Role[] = ['admin', 'lead', 'technician'];
