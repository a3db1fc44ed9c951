import type { LoginResponse, Organization, SessionUser, User } from '@kilocycle/common/types';

let sequence = 100;
const nextId = () => ++sequence;

export function createSessionUser(overrides: Partial<SessionUser> = {}): SessionUser {
  const id = overrides.id ?? nextId();
  return {
    id,
    email: `person${id}@kilocycle.test`,
    name: `Person ${id}`,
    role: 'technician',
    organizationId: 1,
    ...overrides,
  };
}

export function createLoginResponse(overrides: Partial<SessionUser> = {}): LoginResponse {
  return { accessToken: `token-${nextId()}`, user: createSessionUser(overrides) };
}

export function createUser(overrides: Partial<User> = {}): User {
  const base = createSessionUser(overrides);
  return {
    ...base,
    organizationName: 'Quarry Lane Frequency Lab',
    active: true,
    createdAt: '2025-01-15T09:30:00.000Z',
    ...overrides,
  };
}

export function createOrganization(overrides: Partial<Organization> = {}): Organization {
  const id = overrides.id ?? nextId();
  return {
    id,
    name: `Customer ${id}`,
    kind: 'customer',
    contactEmail: null,
    active: true,
    createdAt: '2025-01-15T09:30:00.000Z',
    ...overrides,
  };
}
