import type { Role } from './auth.js';

export type User = {
  id: number;
  email: string;
  name: string;
  role: Role;
  organizationId: number;
  organizationName: string;
  active: boolean;
  createdAt: string;
};

export type CreateUserRequest = {
  email: string;
  name: string;
  role: Role;
  organizationId: number;
  password: string;
};

export type UpdateUserRequest = {
  name?: string;
  role?: Role;
  active?: boolean;
  password?: string;
};
