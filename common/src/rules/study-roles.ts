import type { Role } from '../types/auth.js';

/** Roles that save, edit and delete comparisons of drift and stability studies. */
export const STUDY_ROLES: readonly Role[] = ['engineer', 'lead'];
