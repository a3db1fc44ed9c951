import type { Role } from '../types/auth.js';

/**
 * Roles that run the lab's records: reference standards, procedures, certificate settings and
 * amendments, recall notices, and deleting attachments.
 */
export const MANAGER_ROLES: readonly Role[] = ['admin', 'lead'];
