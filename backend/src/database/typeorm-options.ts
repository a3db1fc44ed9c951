import type { DataSourceOptions } from 'typeorm';

type MariaDbOptions = Extract<DataSourceOptions, { type: 'mysql' | 'mariadb' }>;
import type { AppConfig } from '../config/app-config.js';
import { MIGRATIONS } from './migrations/index.js';

/** Connection options shared by Nest, the CLI data source and the tests. `synchronize` is always off. */
export function typeormOptions(config: AppConfig): MariaDbOptions {
  return {
    type: 'mariadb',
    host: config.db.host,
    port: config.db.port,
    username: config.db.user,
    password: config.db.password,
    database: config.db.name,
    charset: 'utf8mb4_unicode_ci',
    timezone: 'Z',
    synchronize: false,
    migrationsRun: false,
    migrations: MIGRATIONS,
    migrationsTableName: 'kc_migrations',
    extra: { connectionLimit: 10, connectTimeout: 5000 },
    logging: ['error'],
  };
}
