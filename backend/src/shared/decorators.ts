import { createParamDecorator, SetMetadata, type ExecutionContext } from '@nestjs/common';
import type { Role } from '@kilocycle/common/types';
import type { AuthUser } from './auth-user.js';

export const IS_PUBLIC = 'kc:isPublic';
export const ROLES_KEY = 'kc:roles';

/** Marks a route that needs no sign-in (health, login, public verification). */
export const Public = () => SetMetadata(IS_PUBLIC, true);

/** Limits a route to the given roles; without it any signed-in user may call the route. */
export const Roles = (...roles: Role[]) => SetMetadata(ROLES_KEY, roles);

export const CurrentUser = createParamDecorator((_data: unknown, ctx: ExecutionContext): AuthUser => {
  const request = ctx.switchToHttp().getRequest<{ user: AuthUser }>();
  return request.user;
});
