import 'reflect-metadata';
import { Test } from '@nestjs/testing';
import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { AppModule } from '../../src/app.module.js';
import { loadConfig } from '../../src/config/app-config.js';
import { createDataSource } from '../../src/database/create-data-source.js';
import { typeormOptions } from '../../src/database/typeorm-options.js';
import { DEMO_PASSWORD, seedDemo } from '../../src/seed/demo-seed.js';
import { setupApp } from '../../src/setup-app.js';

// The daily recall timer stays off in tests unless a test turns it on (they call run() instead).
process.env.KC_RECALL_DISABLED ??= '1';
// Each test app starts its own payment service fake: on a free port, so test files never collide.
process.env.KC_PAYMENT_FAKE_PORT ??= '0';

export type TestApp = { app: NestExpressApplication; http: ReturnType<typeof request>; dataSource: DataSource; close: () => Promise<void> };

/** Empties the test database (KC_DB_NAME, kilocycle_test under bin/kilocycle test), migrates and loads the demo data. */
export async function resetDatabase(): Promise<void> {
  await createDatabaseIfMissing();
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

/** Lets a developer point KC_DB_NAME at any new kilocycle_… name (the app user may create those). */
async function createDatabaseIfMissing(): Promise<void> {
  const config = loadConfig();
  const server = new DataSource({ ...typeormOptions(config), database: undefined, migrations: [], entities: [] });
  await server.initialize();
  try {
    await server.query(`CREATE DATABASE IF NOT EXISTS \`${config.db.name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  } finally {
    await server.destroy();
  }
}

/** A fresh database and a fresh app instance (its own sign-in throttle), set up exactly as main.ts does. */
export async function createTestApp(options: { reset?: boolean } = {}): Promise<TestApp> {
  if (options.reset !== false) await resetDatabase();
  const moduleRef = await Test.createTestingModule({ imports: [AppModule] }).compile();
  const app = moduleRef.createNestApplication<NestExpressApplication>({ logger: ['error'] });
  try {
    await setupApp(app, loadConfig());
    await app.init();
  } catch (error) {
    // A refused start (a test of one) must not leave its database pool open behind it.
    await app.close().catch(() => undefined);
    throw error;
  }
  const dataSource = app.get(DataSource);
  return { app, http: request(app.getHttpServer()), dataSource, close: () => app.close() };
}

export async function tokenFor(http: TestApp['http'], email: string, password = DEMO_PASSWORD): Promise<string> {
  const res = await http.post('/api/auth/login').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.accessToken as string;
}

export type DemoAccount = keyof typeof DEMO;
export type AsDemo = (who: DemoAccount) => { Authorization: string };

/** Signs every demo account in once; returns the request headers of each, by account. */
export async function signInDemo(http: TestApp['http']): Promise<AsDemo> {
  const headers = {} as Record<DemoAccount, { Authorization: string }>;
  for (const who of Object.keys(DEMO) as DemoAccount[]) headers[who] = { Authorization: `Bearer ${await tokenFor(http, DEMO[who])}` };
  return (who) => headers[who];
}

export const DEMO = {
  admin: 'admin@kilocycle.test',
  lead: 'lead@kilocycle.test',
  tech: 'tech@kilocycle.test',
  engineer: 'engineer@kilocycle.test',
  northgate: 'client@northgate.test',
  saltmarsh: 'client@saltmarsh.test',
} as const;
