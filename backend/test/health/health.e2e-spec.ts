import { ThrowawayMariaDb } from '../support/throwaway-mariadb.js';
import { createTestApp, type TestApp } from '../support/test-app.js';

describe('GET /api/health (e2e, a MariaDB this test stops and restarts)', () => {
  const db = new ThrowawayMariaDb();
  let t: TestApp;
  const saved = { ...process.env };

  beforeAll(async () => {
    await db.init();
    Object.assign(process.env, { KC_DB_PORT: String(db.port), KC_DB_NAME: 'kc', KC_DB_USER: 'kc', KC_DB_PASSWORD: 'kc-test-pw' });
    t = await createTestApp({ reset: false });
  });
  afterAll(async () => {
    await t?.close();
    await db.destroy();
    process.env = saved;
  });

  it('should answer 200 while the database is up, 503 while it is stopped, and 200 again after it restarts', async () => {
    const up = await t.http.get('/api/health');
    expect(up.status).toBe(200);
    expect(up.body).toMatchObject({ status: 'ok', database: 'up' });

    const ready = await t.http.get('/api/health/ready');
    expect(ready.status).toBe(200);
    expect(ready.body).toMatchObject({ status: 'ok', info: { database: { status: 'up' } } });

    await db.stop();
    const down = await t.http.get('/api/health');
    expect(down.status).toBe(503);
    expect(down.body).toMatchObject({ database: 'down' });
    // Not ready (a balancer stops sending requests here), yet alive (nothing to restart).
    const notReady = await t.http.get('/api/health/ready');
    expect(notReady.status).toBe(503);
    expect(notReady.body).toMatchObject({ status: 'error', error: { database: { status: 'down' } } });
    expect((await t.http.get('/api/health/live')).status).toBe(200);
    // The process keeps serving other routes while the database is away.
    expect((await t.http.get('/api/auth/me')).status).toBe(401);

    await db.start();
    let again = await t.http.get('/api/health');
    for (let i = 0; i < 20 && again.status !== 200; i += 1) {
      await new Promise((r) => setTimeout(r, 250));
      again = await t.http.get('/api/health');
    }
    expect(again.status).toBe(200);
    expect(again.body.database).toBe('up');
    expect((await t.http.get('/api/health/ready')).status).toBe(200);
  });
});
