export const ROLES = ['admin', 'lead', 'technician', 'engineer', 'client'] as const;
export type Role = (typeof ROLES)[number];

/** Defined with the other role sets in rules/lab-roles.ts; re-exported here for older imports. */
export { LAB_ROLES } from '../rules/lab-roles.js';

export const MIN_PASSWORD_LENGTH = 12;
/** bcrypt hashes only the first 72 bytes of a password: longer ones are refused, not cut. */
export const MAX_PASSWORD_BYTES = 72;

export type LoginRequest = { email: string; password: string };

export type SessionUser = {
  id: number;
  email: string;
  name: string;
  role: Role;
  organizationId: number;
};

export type LoginResponse = { accessToken: string; user: SessionUser };
