import { ValidationPipe, type INestApplication } from '@nestjs/common';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import { json, urlencoded, type NextFunction, type Request, type Response } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { RedisIoAdapter, SharedRedis } from './cluster/cluster.module.js';
import type { AppConfig } from './config/app-config.js';
import { APP_VERSION } from './health/health.controller.js';
import { MAX_JSON_BODY, verifyFormBody, verifyJsonBody } from './shared/json-body.js';

/**
 * Everything main.ts and the e2e tests both need: prefix, validation, headers, docs, the built frontend,
 * and in cluster mode socket.io through Redis (connected here, before the gateways start: a node whose
 * Redis does not answer refuses to start).
 */
export async function setupApp(app: INestApplication, config: AppConfig): Promise<void> {
  const express = app as NestExpressApplication;
  // X-Forwarded-For only from the proxies named in KC_TRUSTED_PROXIES (none by default): otherwise any
  // local client could rotate it and sidestep the per-address sign-in limits.
  express.set('trust proxy', config.trustedProxies.length > 0 ? config.trustedProxies : false);
  app.setGlobalPrefix('api');
  // Cluster mode: socket.io's rooms through Redis, so every node's sockets see every node's events.
  if (config.cluster) app.useWebSocketAdapter(await RedisIoAdapter.connect(app, app.get(SharedRedis)));
  app.useGlobalPipes(new ValidationPipe({ whitelist: true, forbidNonWhitelisted: true, transform: true, stopAtFirstError: false }));
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'img-src': ["'self'", 'data:', 'blob:'],
          'connect-src': ["'self'", 'ws:', 'wss:'],
          // Served over plain http on loopback by default: do not ask browsers to upgrade to https.
          'upgrade-insecure-requests': null,
        },
      },
    }),
  );
  // Our own parsers, after the headers: size, nesting depth and UTF-8 are checked before validation. Nest
  // sees parsers named jsonParser/urlencodedParser already in place and does not add its defaults.
  app.use(json({ limit: MAX_JSON_BODY, verify: verifyJsonBody }));
  app.use(urlencoded({ limit: MAX_JSON_BODY, extended: true, verify: verifyFormBody }));
  const document = SwaggerModule.createDocument(app, new DocumentBuilder().setTitle('Kilocycle API').setVersion(APP_VERSION).addBearerAuth().build());
  SwaggerModule.setup('api/docs', app, document);

  // The built single-page app: static files, then index.html for any non-API path (client-side routes).
  if (existsSync(join(config.frontendDist, 'index.html'))) {
    express.useStaticAssets(config.frontendDist, { index: false, maxAge: '1h' });
    const indexHtml = join(config.frontendDist, 'index.html');
    app.use((req: Request, res: Response, next: NextFunction) => {
      if (req.method !== 'GET' || req.path.startsWith('/api') || req.path.startsWith('/socket.io')) return next();
      res.sendFile(indexHtml);
    });
  }
}
