import 'reflect-metadata';
import { Test } from '@nestjs/testing';
import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { AppModule } from '../../src/app.module.js';
import { loadConfig } from '../../src/config/app-config.js';
import { createDataSource } from '../../src/database/create-data-source.js';
import { DEMO_PASSWORD, seedDemo } from '../../src/seed/demo-seed.js';
import { setupApp } from '../../src/setup-app.js';

export type TestApp = { app: NestExpressApplication; http: ReturnType<typeof request>; dataSource: DataSource; close: () => Promise<void> };

/** Empties the test database (KC_DB_NAME, kilocycle_test under bin/kilocycle test), migrates and loads the demo data. */
export async function resetDatabase(): Promise<void> {
  const ds = createDataSource();
  await ds.initialize();
  try {
    await ds.dropDatabase();
    await ds.runMigrations({ transaction: 'each' });
    await seedDemo(ds, { bcryptCost: 10 });
  } finally {
    await ds.destroy();
  }
}

/** A fresh database and a fresh app instance (its own sign-in throttle), set up exactly as main.ts does. */
export async function createTestApp(options: { reset?: boolean } = {}): Promise<TestApp> {
  if (options.reset !== false) await resetDatabase();
  const moduleRef = await Test.createTestingModule({ imports: [AppModule] }).compile();
  const app = moduleRef.createNestApplication<NestExpressApplication>({ logger: ['error'] });
  setupApp(app, loadConfig());
  await app.init();
  const dataSource = app.get<DataSource>((await import('typeorm')).DataSource);
  return { app, http: request(app.getHttpServer()), dataSource, close: () => app.close() };
}

export async function tokenFor(http: TestApp['http'], email: string, password = DEMO_PASSWORD): Promise<string> {
  const res = await http.post('/api/auth/login').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.accessToken as string;
}

export const DEMO = {
  admin: 'admin@kilocycle.test',
  lead: 'lead@kilocycle.test',
  tech: 'tech@kilocycle.test',
  engineer: 'engineer@kilocycle.test',
  northgate: 'client@northgate.test',
  saltmarsh: 'client@saltmarsh.test',
} as const;
