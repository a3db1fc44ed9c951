import type { Role, SessionUser } from '@kilocycle/common/types';

/** The signed-in user as the guards attach it to the request. */
export type AuthUser = SessionUser & { jti: string; exp: number };

/** `tv` is the user's token version at sign-in; the session ends when the stored version moves on. */
export type JwtClaims = { sub: number; role: Role; org: number; jti: string; tv: number; exp?: number };

/**
 * The organisation a user's reads are confined to: a client sees only its own organisation's records;
 * lab staff see every organisation's. Every module that lists or fetches owned records calls this.
 */
export function organizationScope(user: Pick<SessionUser, 'role' | 'organizationId'>): number | null {
  return user.role === 'client' ? user.organizationId : null;
}
