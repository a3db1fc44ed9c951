import { ForbiddenException, Injectable, UnauthorizedException, type CanActivate, type ExecutionContext } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import type { Role } from '@kilocycle/common/types';
import type { AuthUser } from '../shared/auth-user.js';
import { AuthService } from './auth.service.js';
import { IS_PUBLIC, ROLES_KEY } from '../shared/decorators.js';

/** Global guard: every HTTP route needs a valid session unless marked @Public(); @Roles narrows it. */
@Injectable()
export class AuthGuard implements CanActivate {
  constructor(
    private readonly reflector: Reflector,
    private readonly auth: AuthService,
  ) {}

  async canActivate(context: ExecutionContext): Promise<boolean> {
    if (context.getType() !== 'http') return true;
    const targets = [context.getHandler(), context.getClass()];
    if (this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, targets)) return true;
    const request = context.switchToHttp().getRequest<{ headers: Record<string, string | undefined>; user?: AuthUser }>();
    const header = request.headers['authorization'] ?? '';
    const match = /^Bearer\s+(.+)$/i.exec(header);
    if (!match) throw new UnauthorizedException('Sign in first: no bearer token was sent');
    const user = await this.auth.authenticate(match[1]);
    request.user = user;
    const roles = this.reflector.getAllAndOverride<Role[] | undefined>(ROLES_KEY, targets);
    if (roles && !roles.includes(user.role)) {
      throw new ForbiddenException(`This needs one of the roles: ${roles.join(', ')}`);
    }
    return true;
  }
}
