import { Global, Module } from '@nestjs/common';
import { ConfigModule as NestConfigModule } from '@nestjs/config';
import { APP_CONFIG, loadConfig } from './app-config.js';
import { validateEnvironment } from './env-schema.js';

// The module's public face: other modules import settings from here, not from its inner files.
export { APP_CONFIG, loadConfig, REPO_ROOT, type AppConfig } from './app-config.js';
export { checkEnvironment, ConfigError } from './env-schema.js';

/**
 * The app's settings: @nestjs/config checks the environment with the one schema (env-schema.ts) and
 * refuses a bad one, listing every bad key; APP_CONFIG is built from the same schema when the app is
 * assembled (so a test that sets KC_* before creating its app gets those values).
 */
@Global()
@Module({
  imports: [NestConfigModule.forRoot({ ignoreEnvFile: true, validate: validateEnvironment })],
  providers: [{ provide: APP_CONFIG, useFactory: () => loadConfig() }],
  exports: [APP_CONFIG],
})
export class ConfigModule {}
