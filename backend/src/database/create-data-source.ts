import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { loadConfig } from '../config/app-config.js';
import { ENTITIES } from './entities.js';
import { typeormOptions } from './typeorm-options.js';

/** A data source outside Nest's DI: the CLI, the seed, the benchmarks and the e2e set-up use it. */
export function createDataSource(env: NodeJS.ProcessEnv = process.env): DataSource {
  return new DataSource({ ...typeormOptions(loadConfig(env)), entities: ENTITIES });
}
