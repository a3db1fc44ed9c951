import type { Role } from '../types/auth.js';

/** Roles that belong to the lab itself (everyone but a customer's client): they read all of the lab's records. */
export const LAB_ROLES: readonly Role[] = ['admin', 'lead', 'technician', 'engineer'];
