import { Inject, Injectable, UnauthorizedException } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import { InjectRepository } from '@nestjs/typeorm';
import bcrypt from 'bcryptjs';
import { randomUUID } from 'node:crypto';
import { LessThan, type Repository } from 'typeorm';
import type { LoginResponse, SessionUser } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { AccountsReader } from '../users/accounts.reader.js';
import type { AuthUser, JwtClaims } from '../shared/auth-user.js';
import { RevokedToken } from './revoked-token.entity.js';
import { AccountSessions } from '../shared/account-sessions.js';
import { SignInThrottle } from './sign-in-throttle.service.js';
import { TooManyAttemptsException } from '../shared/too-many-attempts.js';

const BAD_CREDENTIALS = 'E-mail or password is not right';

// A real hash to compare against when the e-mail is unknown, so both failures take the same time.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password-kc', 10);

/** Why a sign-in was refused, as the audit trail records it (the answer to the client stays the same for all). */
type RefusalReason = 'unknown e-mail' | 'wrong password' | 'account or organisation deactivated' | 'too many failed sign-ins';

export function toSessionUser(user: SessionUser): SessionUser {
  return { id: user.id, email: user.email, name: user.name, role: user.role, organizationId: user.organizationId };
}

@Injectable()
export class AuthService {
  /**
   * When a throttled attempt was last audited, per e-mail and address: a flood of refused attempts
   * writes one event a minute for each pair, not one per request (the database is not the flood's target).
   */
  private readonly throttledAudited = new Map<string, number>();

  constructor(
    private readonly accounts: AccountsReader,
    @InjectRepository(RevokedToken) private readonly revoked: Repository<RevokedToken>,
    private readonly jwt: JwtService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly audit: AuditService,
    private readonly sessions: AccountSessions,
    private readonly throttle: SignInThrottle,
  ) {}

  async login(email: string, password: string, address: string): Promise<LoginResponse> {
    try {
      await this.throttle.checkSignIn(email, address);
    } catch (error) {
      if (error instanceof TooManyAttemptsException && this.firstThrottledThisMinute(email, address)) {
        await this.refused(email, address, { reason: 'too many failed sign-ins', accountId: null });
      }
      throw error;
    }
    const user = await this.accounts.signInCandidate(email);
    const ok = await bcrypt.compare(password, user?.passwordHash ?? DUMMY_HASH);
    if (!user || !ok) {
      await this.throttle.recordSignInFailure(email, address);
      await this.refused(email, address, user ? { reason: 'wrong password', accountId: user.id } : null);
      throw new UnauthorizedException(BAD_CREDENTIALS);
    }
    const claims: JwtClaims = { sub: user.id, role: user.role, org: user.organizationId, jti: randomUUID(), tv: user.tokenVersion };
    const accessToken = await this.jwt.signAsync(claims, { expiresIn: this.config.jwtTtlSeconds });
    await this.audit.record({ actorId: user.id, entity: 'user', entityId: user.id, action: 'sign_in', changes: { email: user.email, address } });
    return { accessToken, user: toSessionUser(user) };
  }

  /**
   * Audits a refused sign-in with the e-mail tried and the client address (never the password). The
   * event is on the account the e-mail names, or on "unknown" when none does.
   */
  private async refused(email: string, address: string, known: { reason: RefusalReason; accountId: number | null } | null): Promise<void> {
    let reason = known?.reason ?? null;
    let accountId = known?.accountId ?? null;
    if (accountId === null) {
      const account = await this.accounts.byEmail(email);
      accountId = account?.id ?? null;
      reason ??= !account ? 'unknown e-mail' : !account.active || !account.organizationActive ? 'account or organisation deactivated' : 'wrong password';
    }
    await this.audit.record({
      actorId: null,
      entity: 'user',
      entityId: accountId ?? 'unknown',
      action: 'sign_in_refused',
      changes: { email, address, reason },
    });
  }

  private firstThrottledThisMinute(email: string, address: string): boolean {
    const now = Date.now();
    const key = `${email.toLowerCase()}|${address}`;
    const last = this.throttledAudited.get(key);
    if (last !== undefined && now - last < 60_000) return false;
    if (this.throttledAudited.size > 10_000) {
      for (const [k, at] of this.throttledAudited) if (now - at >= 60_000) this.throttledAudited.delete(k);
    }
    this.throttledAudited.set(key, now);
    return true;
  }

  /**
   * The one session check, for every REST request and every /live socket event: a valid HS256 token,
   * not signed out, of an active user in an active organisation, whose token version is still current
   * (one primary-key read of the user, joined to the organisation).
   */
  async authenticate(token: string): Promise<AuthUser> {
    let claims: JwtClaims;
    try {
      claims = await this.jwt.verifyAsync<JwtClaims>(token);
    } catch {
      throw new UnauthorizedException('Session is not valid or has expired; sign in again');
    }
    const [user, revoked] = await Promise.all([this.accounts.byId(claims.sub), this.revoked.existsBy({ jti: claims.jti })]);
    if (!user || !user.active || !user.organizationActive || revoked || user.tokenVersion !== claims.tv) {
      throw new UnauthorizedException('Session is not valid any more; sign in again');
    }
    return { ...toSessionUser(user), jti: claims.jti, exp: claims.exp ?? 0 };
  }

  async logout(user: AuthUser, address: string): Promise<void> {
    await this.revoked.manager.transaction(async (manager) => {
      await manager
        .createQueryBuilder()
        .insert()
        .into(RevokedToken)
        .values({ jti: user.jti, expiresAt: new Date(user.exp * 1000) })
        .orIgnore()
        .execute();
      await this.audit.record({ actorId: user.id, entity: 'user', entityId: user.id, action: 'sign_out', changes: { email: user.email, address } }, manager);
    });
    // This session only (other devices stay signed in); its sockets close now.
    this.sessions.announce({ kind: 'token', jti: user.jti });
    await this.revoked.delete({ expiresAt: LessThan(new Date()) });
  }
}
