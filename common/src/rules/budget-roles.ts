import type { Role } from '../types/auth.js';

/**
 * Roles that do a job's uncertainty work: choose the job's procedure and edit a run's budget, and the
 * roles a job may be assigned to as its technician.
 */
export const BUDGET_ROLES: readonly Role[] = ['lead', 'technician'];
