import { ValidationPipe, type INestApplication } from '@nestjs/common';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import type { NextFunction, Request, Response } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import type { AppConfig } from './config/app-config.js';
import { APP_VERSION } from './health/health.controller.js';

/** Everything main.ts and the e2e tests both need: prefix, validation, headers, docs, the built frontend. */
export function setupApp(app: INestApplication, config: AppConfig): void {
  const express = app as NestExpressApplication;
  express.set('trust proxy', 'loopback');
  app.setGlobalPrefix('api');
  app.useGlobalPipes(
    new ValidationPipe({ whitelist: true, forbidNonWhitelisted: true, transform: true, stopAtFirstError: false }),
  );
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
  const document = SwaggerModule.createDocument(
    app,
    new DocumentBuilder().setTitle('Kilocycle API').setVersion(APP_VERSION).addBearerAuth().build(),
  );
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
