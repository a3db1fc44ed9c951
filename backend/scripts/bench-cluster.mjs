// The cluster benchmark: `npm run bench:cluster` (after npm run build -w common && npm run build -w backend).
// First the single-process figure, as `npm run bench:ingest` measures it (KC_BENCH_SKIP_LARGE=1): that
// default path must not fall. Then `bin/kilocycle cluster start --nodes 2` on ports and a var directory of
// its own, and on that cluster:
//   (a) the raw limit: mysql2 multi-row INSERT of the same rows straight into its primary;
//   (b) 20 benches flooding through node 1 alone (one node with the Redis adapter), its CPU, and the ratio
//       to (a) (target ≥ 0.7);
//   (c) 20 benches flooding through haproxy (both nodes), each node's CPU: on 2 cores two nodes share the
//       same two cores with MariaDB, Redis and haproxy, so this does not double (b);
//   (d) the failover gap: two benches streaming through haproxy (one on each node), node 1 killed; the
//       time from the kill to the first acknowledgement its bench then gets from node 2.
// The last line reads `cluster: 1 node R1 × raw, 2 nodes R2 × raw, failover gap G s`.
import { spawn, spawnSync } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import mysql from 'mysql2/promise';
import { io } from 'socket.io-client';

const here = dirname(fileURLToPath(import.meta.url));
const backend = join(here, '..');
const root = join(backend, '..');
if (!existsSync(join(backend, 'dist', 'main.js'))) {
  console.error('bench:cluster: build first (npm run build -w common && npm run build -w backend)');
  process.exit(1);
}
const say = (line) => console.log(line);
const fmt = (n, digits = 0) => n.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits }).replace(/,/g, ' ');
const sleep = (t) => new Promise((r) => setTimeout(r, t));
const BENCHES = 20;
const PER_BENCH = Number(process.env.KC_BENCH_CLUSTER_READINGS ?? 10_000);
const BATCH = 100;
const WINDOW = 4;

say(
  `Cluster benchmark — ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC, ${os.cpus().length} × ${os.cpus()[0]?.model ?? 'CPU'}, Node ${process.versions.node}, load ${os
    .loadavg()
    .map((l) => l.toFixed(2))
    .join(' ')}`,
);

// ---- the single process first -------------------------------------------------------------------

say('(0) the single-process default (npm run bench:ingest, KC_BENCH_SKIP_LARGE=1):');
const single = spawnSync(process.execPath, [join(here, 'bench-ingest.mjs')], { env: { ...process.env, KC_BENCH_SKIP_LARGE: '1' }, encoding: 'utf8' });
const singleLine =
  (single.stdout ?? '').split('\n').find((l) => l.startsWith('ingest/raw ratio:')) ?? `bench:ingest failed: ${(single.stderr ?? '').slice(-500)}`;
say(`    ${singleLine}`);

// ---- the cluster ----------------------------------------------------------------------------------

const PORT = Number(process.env.KC_BENCH_CLUSTER_PORT ?? 5580);
const varDir = mkdtempSync(join(os.tmpdir(), 'kc-bench-cluster-'));
const env = {
  ...process.env,
  KC_PORT: String(PORT),
  KC_DB_PORT: String(PORT - 1963),
  KC_DB_REPLICA_PORT: String(PORT - 1962),
  KC_REDIS_PORT: String(PORT + 1100),
  KC_VAR_DIR: varDir,
  KC_DB_NAME: 'kilocycle',
  KC_RECALL_DISABLED: '1',
};
const balancer = `http://127.0.0.1:${PORT}`;
const nodes = [1, 2].map((i) => `http://127.0.0.1:${PORT + i}`);
let log = '';
const cluster = spawn(join(root, 'bin', 'kilocycle'), ['cluster', 'start', '--nodes', '2'], { env, detached: true, stdio: ['ignore', 'pipe', 'pipe'] });
cluster.stdout.on('data', (c) => (log += c));
cluster.stderr.on('data', (c) => (log += c));

const ready = async (url) => {
  try {
    return (await fetch(`${url}/api/health/ready`)).status === 200;
  } catch {
    return false;
  }
};
/** The pid listening on a loopback port (ss from iproute2). */
const pidOn = (port) => Number(/pid=(\d+)/.exec(spawnSync('ss', ['-ltnpH', `sport = :${port}`], { encoding: 'utf8' }).stdout)?.[1] ?? 0) || null;
/** A process's CPU seconds so far (utime + stime from /proc, in clock ticks of 1/100 s). */
const cpuSeconds = (pid) => {
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
  return (Number(fields[11]) + Number(fields[12])) / 100;
};

let db;
try {
  const started = Date.now();
  while (!((await ready(balancer)) && (await ready(nodes[0])) && (await ready(nodes[1])))) {
    if (cluster.exitCode !== null || Date.now() - started > 300_000) throw new Error(`the cluster did not become ready:\n${log.slice(-3000)}`);
    await sleep(500);
  }
  say(`    cluster up in ${((Date.now() - started) / 1000).toFixed(1)} s (primary, replica, Redis, 2 nodes, haproxy on ${PORT})`);
  db = mysql.createPool({
    host: '127.0.0.1',
    port: Number(env.KC_DB_PORT),
    user: 'kilocycle',
    password: readFileSync(join(varDir, 'db-password'), 'utf8').trim(),
    database: 'kilocycle',
    connectionLimit: 8,
  });
  const [[target]] = await db.query(
    "SELECT r.id AS rangeId, j.id AS jobId, (r.freq_min_hz + r.freq_max_hz) / 2 AS middle FROM instrument_ranges r JOIN jobs j ON j.instrument_id = r.instrument_id WHERE j.status = 'in_progress' LIMIT 1",
  );
  let benchNo = 0;
  const benchWithRun = async () => {
    const token = 'kcb_' + randomBytes(32).toString('base64url');
    const hash = createHash('sha256').update(token).digest('hex');
    const [bench] = await db.query('INSERT INTO benches (name, token_hash, token_issued_at) VALUES (?, ?, UTC_TIMESTAMP())', [
      `Cluster load ${++benchNo}`,
      hash,
    ]);
    const [run] = await db.query(
      `INSERT INTO runs (job_id, range_id, kind, status, bench_id, started_at, created_by)
       VALUES (?, ?, 'warmup', 'open', ?, UTC_TIMESTAMP(3), (SELECT id FROM users WHERE role = 'technician' LIMIT 1))`,
      [target.jobId, target.rangeId, bench.insertId],
    );
    return { token, runId: run.insertId };
  };
  // A warm-up-like frequency in the middle of the range the runs are on.
  const middle = Number(target.middle);
  const reading = (seq) => ({ seq, t: seq * 0.5, frequency: middle - 1270 * Math.exp(-(seq * 0.5) / 600) + ((seq * 7919) % 1000) / 1000 });

  // (a) the raw limit, on the cluster's own primary.
  const raw = async () => {
    const runs = [];
    for (let c = 0; c < 4; c++) runs.push((await benchWithRun()).runId);
    const each = 50_000;
    const t0 = performance.now();
    await Promise.all(
      runs.map(async (runId) => {
        for (let from = 1; from <= each; from += 1000) {
          const rows = [];
          for (let seq = from; seq < from + 1000; seq++) {
            const r = reading(seq);
            rows.push([runId, seq, r.t, null, r.frequency, null, 'bridge']);
          }
          await db.query('INSERT INTO readings (run_id, seq, t_s, dial, frequency_hz, aux, source) VALUES ?', [rows]);
        }
      }),
    );
    return (runs.length * each) / ((performance.now() - t0) / 1000);
  };
  const rawRate = await raw();
  say(`(a) raw mysql2 multi-row INSERT into the cluster's primary, 4 connections × 1 000 rows a statement: ${fmt(rawRate)} rows/s`);

  const connect = (url, token) =>
    new Promise((resolve, reject) => {
      const socket = io(`${url}/ingest`, { auth: { token }, transports: ['websocket'], reconnection: false, forceNew: true });
      socket.once('connect', () => resolve(socket));
      socket.once('connect_error', reject);
    });
  const flood = async (url) => {
    const benches = [];
    for (let i = 0; i < BENCHES; i++) {
      const bench = await benchWithRun();
      const socket = await connect(url, bench.token);
      const ack = await socket.timeout(5000).emitWithAck('attach', { runId: bench.runId });
      if (!ack.ok) throw new Error(ack.error);
      benches.push({ ...bench, socket });
    }
    const pids = [PORT + 1, PORT + 2].map(pidOn);
    const cpuBefore = pids.map((pid) => (pid ? cpuSeconds(pid) : 0));
    const t0 = performance.now();
    await Promise.all(
      benches.map(async (bench) => {
        let next = 1;
        const lane = async () => {
          while (next <= PER_BENCH) {
            const from = next;
            const count = Math.min(BATCH, PER_BENCH - from + 1);
            next += count;
            const readings = Array.from({ length: count }, (_, k) => reading(from + k));
            const ack = await bench.socket.timeout(30_000).emitWithAck('readings', { runId: bench.runId, readings });
            if (!ack.ok || ack.accepted !== count) throw new Error(`batch not stored: ${JSON.stringify(ack).slice(0, 200)}`);
          }
        };
        await Promise.all(Array.from({ length: WINDOW }, lane));
      }),
    );
    const seconds = (performance.now() - t0) / 1000;
    const cpu = pids.map((pid, i) => (pid ? (cpuSeconds(pid) - cpuBefore[i]) / seconds : 0));
    for (const b of benches) b.socket.disconnect();
    return { rate: (BENCHES * PER_BENCH) / seconds, cpu };
  };
  const pct = (x) => `${Math.round(x * 100)} %`;
  const one = await flood(nodes[0]);
  say(
    `(b) ${BENCHES} benches × ${fmt(PER_BENCH)} readings through node 1 alone (Redis adapter on): ${fmt(one.rate)} readings/s = ${(one.rate / rawRate).toFixed(2)} × (a) (target ≥ 0.7: ${one.rate / rawRate >= 0.7 ? 'met' : 'NOT met'}); CPU node 1 ${pct(one.cpu[0])}, node 2 ${pct(one.cpu[1])}`,
  );
  const two = await flood(balancer);
  say(
    `(c) ${BENCHES} benches through haproxy (2 nodes): ${fmt(two.rate)} readings/s = ${(two.rate / rawRate).toFixed(2)} × (a); CPU node 1 ${pct(two.cpu[0])}, node 2 ${pct(two.cpu[1])} (one core is 100 %; 2 cores in all)`,
  );

  // (d) failover: two benches through haproxy (round robin: one on each node), node 1 killed mid-stream.
  const streams = [];
  for (let i = 0; i < 2; i++) {
    const bench = await benchWithRun();
    const s = { ...bench, acks: [], seq: 1, stop: false };
    const socket = io(`${balancer}/ingest`, { auth: { token: bench.token }, transports: ['websocket'], reconnectionDelay: 100, reconnectionDelayMax: 500 });
    socket.on('connect', () => socket.emit('attach', { runId: bench.runId }, () => undefined));
    s.socket = socket;
    s.loop = (async () => {
      while (!s.stop) {
        if (!socket.connected) {
          await sleep(20);
          continue;
        }
        try {
          const from = s.seq;
          const ack = await socket.timeout(2000).emitWithAck('readings', { runId: bench.runId, readings: [reading(from)] });
          if (ack.ok) {
            s.acks.push(Date.now());
            s.seq = from + 1;
          }
        } catch {
          /* no answer: the node is gone; the socket reconnects through haproxy */
        }
        await sleep(50);
      }
    })();
    streams.push(s);
  }
  await sleep(3000);
  const victim = pidOn(PORT + 1);
  const killedAt = Date.now();
  process.kill(victim, 'SIGKILL');
  await sleep(8000);
  for (const s of streams) {
    s.stop = true;
    await s.loop;
    s.socket.disconnect();
  }
  const gaps = streams.map((s) => {
    const after = s.acks.find((t) => t > killedAt);
    return after === undefined ? Infinity : (after - killedAt) / 1000;
  });
  const gap = Math.max(...gaps);
  say(
    `(d) failover: node 1 killed with SIGKILL; the first acknowledgement from node 2 came ${gap.toFixed(2)} s later (the other bench: ${Math.min(...gaps).toFixed(2)} s)`,
  );
  say(`cluster: 1 node ${(one.rate / rawRate).toFixed(2)} × raw, 2 nodes ${(two.rate / rawRate).toFixed(2)} × raw, failover gap ${gap.toFixed(2)} s`);
} finally {
  await db?.end();
  if (cluster.exitCode === null) {
    process.kill(-cluster.pid, 'SIGINT');
    for (let i = 0; i < 300 && cluster.exitCode === null; i++) await sleep(200);
  }
  rmSync(varDir, { recursive: true, force: true });
}
