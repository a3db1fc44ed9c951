import 'reflect-metadata';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { configWarnings, ConfigError, loadConfig } from './config/app-config.js';
import { setupApp } from './setup-app.js';

async function bootstrap(): Promise<void> {
  // Settings first: a bad one stops the start before anything is opened, with every bad key listed.
  for (const warning of configWarnings()) console.warn(`Kilocycle: ${warning}`);
  const config = loadConfig();
  // The app module is loaded only now: its ConfigModule checks the same environment again.
  const { AppModule } = await import('./app.module.js');
  const app = await NestFactory.create<NestExpressApplication>(AppModule, { logger: ['error', 'warn'] });
  await setupApp(app, config);
  app.enableShutdownHooks();
  await app.listen(config.port, config.host);
  console.log(`Kilocycle is serving on http://${config.host}:${config.port} (${config.mode} mode)`);
}

bootstrap().catch((error: unknown) => {
  if (error instanceof ConfigError) {
    console.error(`Kilocycle will not start: ${error.message}\nFix these settings (see the configuration table in README.md) and start again.`);
    process.exit(2);
  }
  console.error(`Kilocycle could not start: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
});
