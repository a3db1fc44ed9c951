import type { Observable } from 'rxjs';
import type { EntityManager } from 'typeorm';

/** Sessions that just ended: every session of some users (version raised), or one signed-out token. */
export type SessionsEnded = { kind: 'users'; userIds: number[] } | { kind: 'token'; jti: string };

/**
 * Ends sessions. A user's sessions end by raising the user's token version (every request and socket
 * event compares the token's `tv` claim with it, in AuthService.authenticate); one session ends by
 * revoking its token id. `ended$` tells the socket gateways to drop the sockets of those sessions at
 * once; `announce` is called only after the change is committed, so a reconnect cannot slip in with the
 * old version.
 *
 * Declared here, with no table, so that auth, organizations and live can end or follow sessions without
 * importing the users module that keeps the version (users/sessions.service.ts implements it and
 * UsersModule provides it to the whole app).
 */
export abstract class AccountSessions {
  abstract readonly ended$: Observable<SessionsEnded>;

  /** Raises the users' version inside the caller's transaction; call `announce` after it commits. */
  abstract endAllSessions(manager: EntityManager, userIds: number[]): Promise<void>;

  /** Ends the sessions of every user of the organisation, inside the caller's transaction; returns their ids. */
  abstract endOrganizationSessions(manager: EntityManager, organizationId: number): Promise<number[]>;

  abstract announce(event: SessionsEnded): void;
}
