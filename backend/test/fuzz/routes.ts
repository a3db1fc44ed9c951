/* eslint-disable @typescript-eslint/no-unsafe-function-type -- class-validator's metadata and Nest's reflection hand classes around as Function */
import { RequestMethod } from '@nestjs/common';
import { ModulesContainer } from '@nestjs/core';
import type { INestApplication } from '@nestjs/common';
import { getMetadataStorage } from 'class-validator';
import { ROLES, type Role } from '@kilocycle/common/types';
import { IS_PUBLIC, ROLES_KEY } from '../../src/shared/decorators.js';

// Nest's metadata keys (@nestjs/common/constants, not exported from the package root) and RouteParamtypes.BODY.
const PATH_METADATA = 'path';
const METHOD_METADATA = 'method';
const ROUTE_ARGS_METADATA = '__routeArguments__';
const BODY_ARGUMENT = 3;

export type WriteMethod = 'POST' | 'PUT' | 'PATCH' | 'DELETE';

/** A field of a body DTO as class-validator sees it. */
export type BodyField = { name: string; optional: boolean; nested: boolean; nullRefused: boolean };

/** One write route of the running app, read from Nest's own route metadata (what the router serves). */
export type WriteRoute = {
  method: WriteMethod;
  /** Express-style path under /api, e.g. /api/users/:id */
  path: string;
  params: string[];
  /** Roles that may call it; 'anonymous' for public routes. */
  roles: (Role | 'anonymous')[];
  /** The class-validator DTO of its @Body(), if it has one. */
  body: { name: string; fields: BodyField[] } | null;
};

const WRITE: Partial<Record<RequestMethod, WriteMethod>> = {
  [RequestMethod.POST]: 'POST',
  [RequestMethod.PUT]: 'PUT',
  [RequestMethod.PATCH]: 'PATCH',
  [RequestMethod.DELETE]: 'DELETE',
};

function joinPath(...parts: (string | string[] | undefined)[]): string {
  const segments = parts
    .flatMap((p) => (Array.isArray(p) ? p[0] : p) ?? '')
    .flatMap((p) => p.split('/'))
    .filter(Boolean);
  return `/${segments.join('/')}`;
}

function dtoFields(dto: Function): BodyField[] {
  const metadata = getMetadataStorage().getTargetValidationMetadatas(dto, '', true, false);
  const byName = new Map<string, BodyField>();
  for (const m of metadata) {
    const field = byName.get(m.propertyName) ?? { name: m.propertyName, optional: false, nested: false, nullRefused: false };
    if (m.type === 'conditionalValidation') field.optional = true;
    if (m.type === 'isDefined') field.nullRefused = true;
    if (m.type === 'nestedValidation') field.nested = true;
    byName.set(m.propertyName, field);
  }
  // A required field refuses null too (its type check fails on it).
  return [...byName.values()].map((f) => ({ ...f, nullRefused: f.nullRefused || !f.optional }));
}

/** Every POST/PUT/PATCH/DELETE route of the app with its roles and body DTO. */
export function writeRoutes(app: INestApplication): WriteRoute[] {
  const routes: WriteRoute[] = [];
  for (const module of app.get(ModulesContainer).values()) {
    for (const wrapper of module.controllers.values()) {
      const controller = wrapper.metatype as Function | null;
      if (!controller) continue;
      const prefix = Reflect.getMetadata(PATH_METADATA, controller) as string | string[] | undefined;
      const proto = controller.prototype as Record<string, unknown>;
      for (const key of Object.getOwnPropertyNames(proto)) {
        const handler = proto[key];
        if (key === 'constructor' || typeof handler !== 'function') continue;
        const method = WRITE[Reflect.getMetadata(METHOD_METADATA, handler) as RequestMethod];
        const routePath = Reflect.getMetadata(PATH_METADATA, handler) as string | string[] | undefined;
        if (!method || routePath === undefined) continue;
        const path = joinPath('api', prefix, routePath);
        const isPublic = Reflect.getMetadata(IS_PUBLIC, handler) ?? Reflect.getMetadata(IS_PUBLIC, controller);
        const roles = (Reflect.getMetadata(ROLES_KEY, handler) ?? Reflect.getMetadata(ROLES_KEY, controller) ?? ROLES) as Role[];
        const args = (Reflect.getMetadata(ROUTE_ARGS_METADATA, controller, key) ?? {}) as Record<string, { index: number }>;
        const types = (Reflect.getMetadata('design:paramtypes', proto, key) ?? []) as Function[];
        let body: WriteRoute['body'] = null;
        for (const [argKey, arg] of Object.entries(args)) {
          if (Number(argKey.split(':')[0]) !== BODY_ARGUMENT) continue;
          const type = types[arg.index];
          const fields = type ? dtoFields(type) : [];
          if (type && fields.length > 0) body = { name: type.name, fields };
        }
        routes.push({
          method,
          path,
          params: [...path.matchAll(/:(\w+)/g)].map((m) => m[1]),
          roles: isPublic ? ['anonymous'] : roles,
          body,
        });
      }
    }
  }
  return routes.sort((a, b) => `${a.path} ${a.method}`.localeCompare(`${b.path} ${b.method}`));
}
