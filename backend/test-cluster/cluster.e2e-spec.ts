import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { io, type Socket } from 'socket.io-client';
import mysql from 'mysql2/promise';
import { LIVE_EVENTS, NAMESPACES, type LiveReadingsEvent, liveReadings } from '@kilocycle/common/events';
import { Bridge, type BridgeOutcome } from '../src/bridge/bridge.js';
import { SimulateSource } from '../src/bridge/sources/simulate-source.js';
import { REPO_ROOT } from '../src/config/app-config.js';
import { newBenchToken, hashBenchToken } from '../src/benches/bench-token.js';

/**
 * The whole cluster as `bin/kilocycle cluster start --nodes 2` runs it on loopback: MariaDB primary and
 * replica, Redis, two app nodes and haproxy in front. Ports of their own, so a developer's `start` can run
 * beside it; a var directory of its own, removed afterwards.
 */
const PORT = Number(process.env.KC_CLUSTER_TEST_PORT ?? 5480);
const env = {
  ...process.env,
  KC_PORT: String(PORT),
  KC_DB_PORT: String(PORT - 1963), // 3517
  KC_DB_REPLICA_PORT: String(PORT - 1962), // 3518
  KC_REDIS_PORT: String(PORT + 1100), // 6580
  KC_VAR_DIR: mkdtempSync(join(tmpdir(), 'kc-cluster-suite-')),
  KC_DB_NAME: 'kilocycle',
};
const BALANCER = `http://127.0.0.1:${PORT}`;
const NODE = [1, 2].map((i) => `http://127.0.0.1:${PORT + i}`);
const BRIDGES = 20;
const PER_BRIDGE = 300; // ten a second each: half a minute of streaming
const quiet = () => new Writable({ write: (_chunk, _encoding, done) => done() });
const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** The pid listening on a loopback port (ss from iproute2), or null. */
function pidOn(port: number): number | null {
  const out = spawnSync('ss', ['-ltnpH', `sport = :${port}`], { encoding: 'utf8' }).stdout;
  const match = /pid=(\d+)/.exec(out);
  return match ? Number(match[1]) : null;
}

async function ready(url: string): Promise<boolean> {
  try {
    return (await fetch(`${url}/api/health/ready`)).status === 200;
  } catch {
    return false;
  }
}

async function signIn(url: string, email: string, password = 'kilocycle-demo'): Promise<Response> {
  return fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password }) });
}

async function tokenAt(url: string, email: string): Promise<string> {
  const res = await signIn(url, email);
  if (res.status !== 200) throw new Error(`sign-in as ${email} at ${url}: ${res.status}`);
  return ((await res.json()) as { accessToken: string }).accessToken;
}

describe('the cluster: two nodes, Redis, a replica and haproxy, started by bin/kilocycle cluster start', () => {
  let cluster: ChildProcess;
  let log = '';
  let db: mysql.Connection;

  beforeAll(async () => {
    cluster = spawn(join(REPO_ROOT, 'bin', 'kilocycle'), ['cluster', 'start', '--nodes', '2'], { env, detached: true, stdio: ['ignore', 'pipe', 'pipe'] });
    cluster.stdout!.on('data', (chunk: Buffer) => (log += chunk.toString()));
    cluster.stderr!.on('data', (chunk: Buffer) => (log += chunk.toString()));
    const started = Date.now();
    while (!((await ready(BALANCER)) && (await ready(NODE[0]!)) && (await ready(NODE[1]!)))) {
      if (cluster.exitCode !== null || Date.now() - started > 300_000) throw new Error(`the cluster did not become ready:\n${log.slice(-3000)}`);
      await sleep(500);
    }
    db = await mysql.createConnection({
      host: '127.0.0.1',
      port: Number(env.KC_DB_PORT),
      user: 'kilocycle',
      password: readFileSync(join(env.KC_VAR_DIR, 'db-password'), 'utf8').trim(),
      database: 'kilocycle',
    });
  }, 320_000);

  afterAll(async () => {
    await db?.end();
    if (cluster && cluster.exitCode === null) {
      process.kill(-cluster.pid!, 'SIGINT');
      const stopped = Date.now();
      while (cluster.exitCode === null && Date.now() - stopped < 60_000) await sleep(200);
    }
    // Everything it started has stopped: nothing listens on the cluster's ports any more.
    const left = [PORT, PORT + 1, PORT + 2, Number(env.KC_DB_PORT), Number(env.KC_DB_REPLICA_PORT), Number(env.KC_REDIS_PORT)].filter((p) => pidOn(p) !== null);
    rmSync(env.KC_VAR_DIR, { recursive: true, force: true });
    expect(left).toEqual([]);
  }, 90_000);

  it('should answer `cluster status` with every part up', () => {
    const status = spawnSync(join(REPO_ROOT, 'bin', 'kilocycle'), ['cluster', 'status'], { env, encoding: 'utf8' });
    expect(status.status).toBe(0);
    expect(status.stdout).toMatch(/replica/i);
    expect(status.stdout).toMatch(/redis/i);
    expect(status.stdout).toMatch(/haproxy/i);
  });

  it('should block an account after failed sign-ins spread over both nodes', async () => {
    for (let attempt = 0; attempt < 5; attempt++) expect((await signIn(NODE[attempt % 2]!, 'engineer@kilocycle.test', 'wrong password')).status).toBe(401);
    // Then the account waits on either node and through the balancer, whatever the next attempts are.
    for (const url of [...NODE, BALANCER, BALANCER, BALANCER]) expect((await signIn(url, 'engineer@kilocycle.test', 'wrong password')).status).toBe(429);
  });

  it('should send each recall reminder once when both nodes run the recall at the same moment', async () => {
    const admin = await tokenAt(BALANCER, 'admin@kilocycle.test');
    const runs = await Promise.all(NODE.map((url) => fetch(`${url}/api/recall/run`, { method: 'POST', headers: { authorization: `Bearer ${admin}` } })));
    expect(runs.map((r) => r.status)).toEqual([200, 200]);
    // The demo has one customer with two instruments due: one mail, whoever (a node's timer or these calls) sent it.
    const mails = (await (await fetch(`${BALANCER}/api/mail?kind=recall_reminder&pageSize=100`, { headers: { authorization: `Bearer ${admin}` } })).json()) as {
      items: unknown[];
    };
    expect(mails.items).toHaveLength(1);
  });

  it('should serve and verify through node B a certificate signed on node A', async () => {
    const lead = await tokenAt(NODE[0]!, 'lead@kilocycle.test');
    const [[job]] = (await db.query(
      "SELECT j.id FROM jobs j JOIN instruments i ON i.id = j.instrument_id WHERE i.serial = 'N-1041' AND j.status = 'in_review'",
    )) as unknown as [[{ id: number }]];
    const signed = await fetch(`${NODE[0]}/api/jobs/${job.id}/sign`, {
      method: 'POST',
      headers: { authorization: `Bearer ${lead}`, 'content-type': 'application/json' },
      body: JSON.stringify({ password: 'kilocycle-demo', meaning: 'reviewed and approved for issue' }),
    });
    expect(signed.status).toBe(200);
    const certificate = (await signed.json()) as { id: number; number: string };
    const pdf = await fetch(`${NODE[1]}/api/certificates/${certificate.id}/pdf`, { headers: { authorization: `Bearer ${lead}` } });
    expect(pdf.status).toBe(200);
    const check = await fetch(`${NODE[1]}/api/public/certificates/${certificate.number}/check`, {
      method: 'POST',
      headers: { 'content-type': 'application/pdf' },
      body: Buffer.from(await pdf.arrayBuffer()),
    });
    expect(await check.json()).toMatchObject({ match: true, signatureValid: true });
  });

  it('should keep 20 bridges streaming through the balancer when node A is killed: no reading lost or stored twice', async () => {
    const [[range]] = (await db.query(
      "SELECT r.id AS rangeId, j.id AS jobId FROM instrument_ranges r JOIN jobs j ON j.instrument_id = r.instrument_id WHERE j.status = 'in_progress' LIMIT 1",
    )) as unknown as [[{ rangeId: number; jobId: number }]];
    const streams: Array<{ runId: number; token: string }> = [];
    for (let i = 0; i < BRIDGES; i++) {
      const token = newBenchToken();
      const [bench] = (await db.query('INSERT INTO benches (name, token_hash, token_issued_at) VALUES (?, ?, UTC_TIMESTAMP())', [
        `Cluster bench ${i + 1}`,
        hashBenchToken(token),
      ])) as unknown as [{ insertId: number }];
      const [run] = (await db.query(
        `INSERT INTO runs (job_id, range_id, kind, status, bench_id, started_at, created_by)
         VALUES (?, ?, 'stability', 'open', ?, UTC_TIMESTAMP(3), (SELECT id FROM users WHERE role = 'technician' LIMIT 1))`,
        [range.jobId, range.rangeId, bench.insertId],
      )) as unknown as [{ insertId: number }];
      streams.push({ runId: run.insertId, token });
    }

    // A browser on node B watches every run.
    const tech = await tokenAt(BALANCER, 'tech@kilocycle.test');
    const page: Socket = io(NODE[1]! + NAMESPACES.live, { auth: { token: tech }, transports: ['websocket'], reconnection: false, forceNew: true });
    await new Promise<void>((resolve, reject) => page.once('connect', () => resolve()).once('connect_error', reject));
    for (const { runId } of streams) expect(await page.timeout(5000).emitWithAck(LIVE_EVENTS.join, { runId })).toMatchObject({ ok: true });
    const seenBeforeKill = new Set<number>();
    let killed = false;
    page.on(LIVE_EVENTS.readings, (event: LiveReadingsEvent) => {
      if (!killed && liveReadings(event).length > 0) seenBeforeKill.add(event.runId);
    });

    const spools = mkdtempSync(join(tmpdir(), 'kc-cluster-spools-'));
    const bridges = streams.map(
      ({ runId, token }, i) =>
        new Bridge({
          server: BALANCER,
          token,
          runId,
          source: new SimulateSource({ profile: 'stable', intervalMs: 100, speed: 1, seed: i + 1 }),
          spoolPath: join(spools, `run-${runId}.jsonl`),
          batchSize: 10,
          window: 4,
          count: PER_BRIDGE,
          timeZero: 'now',
          ackTimeoutMs: 5000,
          flushTimeoutMs: 60_000,
          statusEveryMs: 3_600_000,
          stderr: quiet(),
        }),
    );
    const outcomes: Promise<BridgeOutcome>[] = bridges.map((bridge) => bridge.run());
    await sleep(10_000);
    const nodeA = pidOn(PORT + 1);
    expect(nodeA).not.toBeNull();
    killed = true;
    const killedAt = Date.now();
    process.kill(nodeA!, 'SIGKILL');
    const results = await Promise.all(outcomes);
    page.disconnect();
    rmSync(spools, { recursive: true, force: true });

    expect(results.map((r) => r.exitCode)).toEqual(Array(BRIDGES).fill(0));
    // Node A's bridges went to node B: B's browser saw every run streaming before the kill (half came through A).
    expect(seenBeforeKill.size).toBe(BRIDGES);
    for (const { runId } of streams) {
      const [[row]] = (await db.query('SELECT COUNT(*) AS n, COUNT(DISTINCT seq) AS seqs, MIN(seq) AS first, MAX(seq) AS last FROM readings WHERE run_id = ?', [
        runId,
      ])) as unknown as [[{ n: number; seqs: number; first: number; last: number }]];
      expect({ runId, n: Number(row.n), seqs: Number(row.seqs), first: Number(row.first), last: Number(row.last) }).toEqual({
        runId,
        n: PER_BRIDGE,
        seqs: PER_BRIDGE,
        first: 1,
        last: PER_BRIDGE,
      });
      const [[counters]] = (await db.query('SELECT reading_count AS n, last_seq AS last FROM runs WHERE id = ?', [runId])) as unknown as [
        [{ n: number; last: number }],
      ];
      expect([Number(counters.n), Number(counters.last)]).toEqual([PER_BRIDGE, PER_BRIDGE]);
    }
    console.log(
      `cluster: node A killed ${((Date.now() - killedAt) / 1000).toFixed(1)} s before the last bridge finished; ${BRIDGES} × ${PER_BRIDGE} readings stored once each`,
    );
  }, 240_000);

  it('should still answer lists with the replica stopped', async () => {
    const replica = pidOn(Number(env.KC_DB_REPLICA_PORT));
    expect(replica).not.toBeNull();
    process.kill(replica!, 'SIGTERM');
    for (let i = 0; i < 100 && pidOn(Number(env.KC_DB_REPLICA_PORT)) !== null; i++) await sleep(100);
    const lead = await tokenAt(BALANCER, 'lead@kilocycle.test');
    for (const path of ['/api/runs?pageSize=25', '/api/jobs?pageSize=25', '/api/instruments?pageSize=25']) {
      const started = Date.now();
      const res = await fetch(`${BALANCER}${path}`, { headers: { authorization: `Bearer ${lead}` } });
      expect([path, res.status]).toEqual([path, 200]);
      expect(Date.now() - started).toBeLessThan(5000);
    }
  });
});
