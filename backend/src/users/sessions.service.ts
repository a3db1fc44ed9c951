import { Injectable } from '@nestjs/common';
import { Subject } from 'rxjs';
import { In, type EntityManager } from 'typeorm';
import { AccountSessions, type SessionsEnded } from '../shared/account-sessions.js';
import { User } from './user.entity.js';

export type { SessionsEnded };

/** Ends sessions by raising `users.token_version` (the users module owns the column); see AccountSessions. */
@Injectable()
export class SessionsService extends AccountSessions {
  readonly ended$ = new Subject<SessionsEnded>();

  async endAllSessions(manager: EntityManager, userIds: number[]): Promise<void> {
    if (userIds.length === 0) return;
    await manager.increment(User, { id: In(userIds) }, 'tokenVersion', 1);
  }

  async endOrganizationSessions(manager: EntityManager, organizationId: number): Promise<number[]> {
    const userIds = (await manager.find(User, { select: { id: true }, where: { organizationId } })).map((u) => u.id);
    await this.endAllSessions(manager, userIds);
    return userIds;
  }

  announce(event: SessionsEnded): void {
    if (event.kind === 'users' && event.userIds.length === 0) return;
    this.ended$.next(event);
  }
}
