import { BadRequestException, createParamDecorator, type ExecutionContext, type HttpException } from '@nestjs/common';
import type { Request } from 'express';

/** Largest id a path may carry: the id columns are signed 32-bit integers. */
export const MAX_ID = 2_147_483_647;

type IdOptions = { refuse?: () => HttpException };

/**
 * The path parameter `name` as a record id written in decimal digits only: `16`, never `0x10`, `1e1`,
 * ` 16` or `16.0` (ParseIntPipe, and the global ValidationPipe's +value on a number parameter, take
 * all of those). 400 naming the parameter otherwise, or the caller's own refusal (a certificate
 * answers 404 to anything that is not one of its ids). A custom parameter decorator, so the global
 * ValidationPipe leaves the text alone and this sees exactly what the client sent.
 */
const idParam = createParamDecorator((data: { name: string } & IdOptions, ctx: ExecutionContext): number => {
  const value = ctx.switchToHttp().getRequest<Request>().params[data.name];
  return parseId(value, data.name, data.refuse);
});

/** @IdParam('id') in place of @Param('id', ParseIntPipe); optionally with the refusal to throw. */
export const IdParam = (name: string, options: IdOptions = {}) => idParam({ name, ...options });

export function parseId(value: unknown, name: string, refuse?: () => HttpException): number {
  const id = typeof value === 'string' && /^\d{1,10}$/.test(value) ? Number(value) : Number.NaN;
  if (Number.isInteger(id) && id <= MAX_ID) return id;
  if (refuse) throw refuse();
  throw new BadRequestException(`${name} must be a whole number written in decimal digits, at most ${MAX_ID}`);
}
