import { Injectable } from '@nestjs/common';
import { Subject } from 'rxjs';
import { In, type EntityManager } from 'typeorm';
import { User } from '../users/user.entity.js';

/** Sessions that just ended: every session of some users (version raised), or one signed-out token. */
export type SessionsEnded = { kind: 'users'; userIds: number[] } | { kind: 'token'; jti: string };

/**
 * Ends sessions. A user's sessions end by raising `users.token_version` (every request and socket event
 * compares the token's `tv` claim with it, in AuthService.authenticate); one session ends by revoking
 * its token id. `ended$` tells the socket gateways to drop the sockets of those sessions at once; it
 * fires only after the change is committed, so a reconnect cannot slip in with the old version.
 */
@Injectable()
export class SessionsService {
  readonly ended$ = new Subject<SessionsEnded>();

  /** Raises the users' version inside the caller's transaction; call `announce` after it commits. */
  async endAllSessions(manager: EntityManager, userIds: number[]): Promise<void> {
    if (userIds.length === 0) return;
    await manager.increment(User, { id: In(userIds) }, 'tokenVersion', 1);
  }

  announce(event: SessionsEnded): void {
    if (event.kind === 'users' && event.userIds.length === 0) return;
    this.ended$.next(event);
  }
}
