import { HttpException, HttpStatus, Inject, Injectable, UnauthorizedException } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import { InjectRepository } from '@nestjs/typeorm';
import bcrypt from 'bcryptjs';
import { randomUUID } from 'node:crypto';
import { LessThan, type Repository } from 'typeorm';
import type { LoginResponse, SessionUser } from '@kilocycle/common/types';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { User } from '../users/user.entity.js';
import type { AuthUser, JwtClaims } from './auth-user.js';
import { LoginThrottle } from './login-throttle.js';
import { RevokedToken } from './revoked-token.entity.js';

const BAD_CREDENTIALS = 'E-mail or password is not right';

// A real hash to compare against when the e-mail is unknown, so both failures take the same time.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password-kc', 10);

export function toSessionUser(user: User): SessionUser {
  return { id: user.id, email: user.email, name: user.name, role: user.role, organizationId: user.organizationId };
}

@Injectable()
export class AuthService {
  readonly throttle = new LoginThrottle();

  constructor(
    @InjectRepository(User) private readonly users: Repository<User>,
    @InjectRepository(RevokedToken) private readonly revoked: Repository<RevokedToken>,
    private readonly jwt: JwtService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  async login(email: string, password: string, address: string): Promise<LoginResponse> {
    const keys = [`account:${email.toLowerCase()}`, `address:${address}`];
    if (this.throttle.isBlocked(keys)) {
      throw new HttpException('Too many failed sign-ins; wait a minute and try again', HttpStatus.TOO_MANY_REQUESTS);
    }
    const user = await this.users
      .createQueryBuilder('u')
      .addSelect('u.passwordHash')
      .innerJoin('u.organization', 'o')
      .where('u.email = :email', { email: email.toLowerCase() })
      .andWhere('u.active = 1 AND o.active = 1')
      .getOne();
    const ok = await bcrypt.compare(password, user?.passwordHash ?? DUMMY_HASH);
    if (!user || !ok) {
      this.throttle.recordFailure(keys);
      throw new UnauthorizedException(BAD_CREDENTIALS);
    }
    const claims: JwtClaims = { sub: user.id, role: user.role, org: user.organizationId, jti: randomUUID() };
    const accessToken = await this.jwt.signAsync(claims, { expiresIn: this.config.jwtTtlSeconds });
    return { accessToken, user: toSessionUser(user) };
  }

  /** Checks a bearer token and reloads the user, so deactivation and sign-out take effect at once. */
  async authenticate(token: string): Promise<AuthUser> {
    let claims: JwtClaims;
    try {
      claims = await this.jwt.verifyAsync<JwtClaims>(token);
    } catch {
      throw new UnauthorizedException('Session is not valid or has expired; sign in again');
    }
    const [user, revoked] = await Promise.all([
      this.users.findOne({ where: { id: claims.sub }, relations: { organization: true } }),
      this.revoked.existsBy({ jti: claims.jti }),
    ]);
    if (!user || !user.active || !user.organization.active || revoked) {
      throw new UnauthorizedException('Session is not valid any more; sign in again');
    }
    return { ...toSessionUser(user), jti: claims.jti, exp: claims.exp ?? 0 };
  }

  async logout(user: AuthUser): Promise<void> {
    await this.revoked
      .createQueryBuilder()
      .insert()
      .values({ jti: user.jti, expiresAt: new Date(user.exp * 1000) })
      .orIgnore()
      .execute();
    await this.revoked.delete({ expiresAt: LessThan(new Date()) });
  }
}
