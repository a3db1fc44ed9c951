import { createHash, createPrivateKey, createPublicKey } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Socket } from 'socket.io-client';
import { INGEST_EVENTS, LIVE_EVENTS, NAMESPACES, type LiveReadingsEvent, liveReadings } from '@kilocycle/common/events';
import { RedisUnreachableError } from '../../src/cluster/cluster.module.js';
import { APP_CONFIG, loadConfig, type AppConfig } from '../../src/config/config.module.js';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { connect, createBench, createRun, listen, organizationId, request, type RunFixture } from '../ingest/ingest-fixtures.js';
import { appWith, clusterSettings } from '../support/app-with.js';
import { startPrivateRedis, type PrivateRedis } from '../support/private-redis.js';
import { DEMO, tokenFor, type TestApp } from '../support/test-app.js';
import { binary } from '../support/binary-body.js';

describe('two app nodes sharing Redis (e2e, MariaDB + redis-server)', () => {
  let redis: PrivateRedis;
  let shared: ReturnType<typeof clusterSettings> | undefined;
  let varDirs: string[] = [];
  let clusterEnv: Record<string, string>;
  let nodeA: TestApp;
  let nodeB: TestApp;
  let urlA: string;
  let urlB: string;
  let sockets: Socket[] = [];

  beforeAll(async () => {
    redis = await startPrivateRedis();
    shared = clusterSettings(redis.url);
    // The database password as this machine has it (the nodes' own var directories do not hold it).
    clusterEnv = { ...shared.env, KC_DB_PASSWORD: loadConfig().db.password };
    // Each node with a var directory of its own, empty: nothing a node needs may live only there.
    varDirs = [mkdtempSync(join(tmpdir(), 'kc-node-a-')), mkdtempSync(join(tmpdir(), 'kc-node-b-'))];
    nodeA = await appWith({ ...clusterEnv, KC_VAR_DIR: varDirs[0]!, KC_NODE_NAME: 'node-a' }, true);
    nodeB = await appWith({ ...clusterEnv, KC_VAR_DIR: varDirs[1]!, KC_NODE_NAME: 'node-b' }, false);
    urlA = await listen(nodeA);
    urlB = await listen(nodeB);
  });
  afterEach(() => {
    for (const s of sockets) s.disconnect();
    sockets = [];
  });
  afterAll(async () => {
    await nodeA?.close();
    await nodeB?.close();
    await redis?.stop();
    shared?.remove();
    for (const dir of varDirs) rmSync(dir, { recursive: true, force: true });
  });

  it('should show a browser on node B the readings a bench streams into node A, within a second', async () => {
    const bench = await createBench(nodeA.dataSource);
    const run: RunFixture = await createRun(nodeA.dataSource, {
      organizationId: await organizationId(nodeA.dataSource, DEMO_CUSTOMERS.saltmarsh),
      benchId: bench.benchId,
    });
    // Signed in on node A, watching on node B: one shared session secret.
    const page = await connect(urlB, NAMESPACES.live, await tokenFor(nodeA.http, DEMO.tech), sockets);
    expect(await request(page, LIVE_EVENTS.join, { runId: run.runId })).toMatchObject({ ok: true, runId: run.runId });
    const arriving = new Promise<LiveReadingsEvent>((resolve) => page.once(LIVE_EVENTS.readings, resolve));
    const source = await connect(urlA, NAMESPACES.ingest, bench.token, sockets);
    expect(await request(source, INGEST_EVENTS.attach, { runId: run.runId })).toMatchObject({ ok: true });
    const sent = Date.now();
    await request(source, INGEST_EVENTS.readings, {
      runId: run.runId,
      readings: [
        { seq: 1, t: 1, frequency: 7_000_010 },
        { seq: 2, t: 2, frequency: 7_000_020 },
      ],
    });
    const event = await Promise.race([arriving, new Promise<never>((_, reject) => setTimeout(() => reject(new Error('nothing on node B in 1 s')), 1000))]);
    expect(Date.now() - sent).toBeLessThan(1000);
    expect(liveReadings(event).map((r) => [r.seq, r.frequency])).toEqual([
      [1, 7_000_010],
      [2, 7_000_020],
    ]);
  });

  it('should close a browser socket on node B when its session is signed out on node A', async () => {
    const token = await tokenFor(nodeA.http, DEMO.engineer);
    const page = await connect(urlB, NAMESPACES.live, token, sockets);
    const closed = new Promise<string>((resolve) => page.once('disconnect', resolve));
    expect((await nodeA.http.post('/api/auth/logout').set({ Authorization: `Bearer ${token}` })).status).toBeLessThan(300);
    const reason = await Promise.race([closed, new Promise<never>((_, reject) => setTimeout(() => reject(new Error('still open on node B after 2 s')), 2000))]);
    expect(reason).toBe('io server disconnect');
  });

  it('should add up failed sign-ins spread over both nodes: after five, the account waits on either', async () => {
    const nodes = [nodeA, nodeB];
    for (let attempt = 0; attempt < 5; attempt++) {
      const res = await nodes[attempt % 2]!.http.post('/api/auth/login').send({ email: DEMO.engineer, password: 'not the password' });
      expect(res.status).toBe(401);
    }
    // Node B saw two of the five failures: in memory it would let the sixth try through.
    for (const node of nodes) {
      const held = await node.http.post('/api/auth/login').send({ email: DEMO.engineer, password: 'not the password' });
      expect(held.status).toBe(429);
      expect(held.body.message).toMatch(/Too many failed sign-ins for this account/);
      expect(Number(held.headers['retry-after'])).toBeGreaterThanOrEqual(1);
    }
  });

  it('should sign a certificate on node A with the shared key file and verify its PDF through node B, making no key of its own', async () => {
    const lead = { Authorization: `Bearer ${await tokenFor(nodeA.http, DEMO.lead)}` };
    const [job] = await nodeA.dataSource.query(
      "SELECT j.id FROM jobs j JOIN instruments i ON i.id = j.instrument_id WHERE i.serial = 'N-1041' AND j.status = 'in_review'",
    );
    const signed = await nodeA.http.post(`/api/jobs/${job.id}/sign`).set(lead).send({ password: 'kilocycle-demo', meaning: 'reviewed and approved for issue' });
    expect(signed.status).toBe(200);
    // The key id is the first 16 hex digits of the SHA-256 of the shared public key (DER).
    const shared = createPublicKey(createPrivateKey(readFileSync(clusterEnv.KC_SIGNING_KEY_FILE!)));
    const keyId = createHash('sha256')
      .update(shared.export({ type: 'spki', format: 'der' }))
      .digest('hex')
      .slice(0, 16);
    const [row] = await nodeA.dataSource.query('SELECT key_id FROM certificates WHERE id = ?', [signed.body.id]);
    expect(row.key_id).toBe(keyId);
    const pdf = await binary(nodeB.http.get(`/api/certificates/${signed.body.id}/pdf`).set(lead));
    expect(pdf.status).toBe(200);
    const check = await nodeB.http.post(`/api/public/certificates/${signed.body.number}/check`).set('Content-Type', 'application/pdf').send(pdf.body);
    expect(check.body).toMatchObject({ match: true, signatureValid: true });
    for (const node of [nodeA, nodeB]) expect(existsSync(join(node.app.get<AppConfig>(APP_CONFIG).varDir, 'keys'))).toBe(false);
  });

  it('should report Redis in readiness: 503 on both nodes while it is gone, 200 once it is back', async () => {
    for (const node of [nodeA, nodeB]) {
      expect((await node.http.get('/api/health/ready')).body).toMatchObject({ status: 'ok', info: { database: { status: 'up' }, redis: { status: 'up' } } });
    }
    for (const [node, name] of [
      [nodeA, 'node-a'],
      [nodeB, 'node-b'],
    ] as const) {
      expect((await node.http.get('/api/health/ready')).body.info.node).toEqual({ status: 'up', name });
    }
    const bench = await createBench(nodeA.dataSource);
    const run = await createRun(nodeA.dataSource, { organizationId: await organizationId(nodeA.dataSource, DEMO_CUSTOMERS.saltmarsh), benchId: bench.benchId });
    const source = await connect(urlA, NAMESPACES.ingest, bench.token, sockets);
    expect(await request(source, INGEST_EVENTS.attach, { runId: run.runId })).toMatchObject({ ok: true });
    const unhandled: unknown[] = [];
    const onUnhandled = (reason: unknown) => unhandled.push(reason);
    process.on('unhandledRejection', onUnhandled);
    await redis.stop();
    // Readings still go in (stored and acknowledged; only their live fan-out is lost), and nothing is left unhandled.
    expect(await request(source, INGEST_EVENTS.readings, { runId: run.runId, readings: [{ seq: 1, t: 1, frequency: 7_000_001 }] })).toMatchObject({
      ok: true,
      accepted: 1,
    });
    await new Promise((r) => setTimeout(r, 200));
    process.off('unhandledRejection', onUnhandled);
    expect(unhandled).toEqual([]);
    for (const node of [nodeA, nodeB]) {
      const gone = await node.http.get('/api/health/ready');
      expect(gone.status).toBe(503);
      expect(gone.body).toMatchObject({ error: { redis: { status: 'down' } }, info: { database: { status: 'up' } } });
      expect((await node.http.get('/api/health/live')).status).toBe(200);
      // A sign-in cannot be counted, so it is refused rather than let through unthrottled; nothing is written.
      const refused = await node.http.post('/api/auth/login').send({ email: DEMO.lead, password: 'not the password' });
      expect(refused.status).toBe(503);
      expect(refused.body.message).toMatch(/shared sign-in counts cannot be reached/);
    }
    redis = await startPrivateRedis(redis.port);
    for (const node of [nodeA, nodeB]) {
      let ready = await node.http.get('/api/health/ready');
      for (let i = 0; i < 40 && ready.status !== 200; i += 1) {
        await new Promise((r) => setTimeout(r, 250));
        ready = await node.http.get('/api/health/ready');
      }
      expect(ready.status).toBe(200);
    }
  });

  it('should refuse to start a node whose Redis does not answer, saying so', async () => {
    const gone = await startPrivateRedis();
    await gone.stop();
    await expect(appWith({ ...clusterEnv, KC_REDIS_URL: gone.url }, false)).rejects.toThrow(RedisUnreachableError);
    await expect(appWith({ ...clusterEnv, KC_REDIS_URL: gone.url }, false)).rejects.toThrow(/does not answer .*start it, or fix KC_REDIS_URL/);
  });
});
