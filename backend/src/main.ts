import 'reflect-metadata';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { AppModule } from './app.module.js';
import { loadConfig } from './config/app-config.js';
import { setupApp } from './setup-app.js';

async function bootstrap(): Promise<void> {
  const config = loadConfig();
  const app = await NestFactory.create<NestExpressApplication>(AppModule, { logger: ['error', 'warn'] });
  setupApp(app, config);
  app.enableShutdownHooks();
  await app.listen(config.port, config.host);
  console.log(`Kilocycle is serving on http://${config.host}:${config.port} (${config.mode} mode)`);
}

bootstrap().catch((error: unknown) => {
  console.error(`Kilocycle could not start: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
});
