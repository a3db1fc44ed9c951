// The scale benchmark: `npm run bench:scale` (after npm run build -w common && npm run build -w backend).
// On its own database (KC_BENCH_DB, default kilocycle_bench_scale, emptied, migrated, demo-seeded) it:
//   (a) fills N readings (KC_SCALE_READINGS: 10M by default; 50M, 2.5M, 1500000 …) server-side, in runs
//       of 1,000,000 readings (the last one smaller) over three instruments and their jobs: INSERT … SELECT
//       from MariaDB's SEQUENCE engine (seq_1_to_N), a warm-up-like frequency computed in SQL; most runs
//       are warm-ups, one a stability run and one an as-found calibration run with dial settings; one
//       reading in 10,000 of the first warm-up run is excluded. Each run's counters (reading_count,
//       excluded_count, last_seq) are then set as the app keeps them, when the runs table has them.
//       It prints the fill time and the disk the readings take;
//   (b) starts the server from dist and times every list page with that data in place (median of 5 after
//       one untimed call, signed in as the lab lead, the admin for the admin-only lists): target < 100 ms;
//   (c) streams the first 1,000,000-reading warm-up run out of MariaDB (prepared statement, binary rows,
//       into Float64Arrays, as bench:ingest does);
//   (d) GET /api/runs/:id/analysis on that run, cold (the server's first analysis of it) and warm; and (d2)
//       the cold analysis of a second such run, once the server's analysis code is compiled;
//   (e) when there is a 1,000,000-reading stability run (KC_SCALE_READINGS of 2M or more): its rows streamed out
//       as in (c), first pass (the first read since the fill) and second, then its analysis cold in a server
//       started for it alone (its first request after signing in: code and data cold), with the default query
//       and with ?factors=decades&drift=removed, each against the stream (issue 19: at most 1.5 × its stream).
//       KC_SCALE_STABILITY_ONLY=1 runs (a) and (e) only; KC_BENCH_ROUNDS=n repeats (e)'s stream and cold analyses n
//       times and reports the median ratios.
// KC_BENCH_KEEP=1 keeps the filled database; KC_SCALE_REUSE=1 then skips (a)'s fill on the next run.
// KC_BENCH_SERVER_FLAGS passes node flags to the server (e.g. --cpu-prof --cpu-prof-dir=DIR).
// The last line reads `scale N readings: slowest list page X ms, cold analysis R × stream` (and the stability
// ratios of (e) when there is one).
import { spawn } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { createServer } from 'node:net';
import os from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import mysqlCallback from 'mysql2';
import mysql from 'mysql2/promise';

const here = dirname(fileURLToPath(import.meta.url));
const backend = join(here, '..');
const root = join(backend, '..');
const DB = process.env.KC_BENCH_DB ?? 'kilocycle_bench_scale';
process.env.KC_DB_NAME = DB;
const RUN_SIZE = 1_000_000;
const TARGET_MS = 100;

/** "10M", "50m", "2.5M", "750k", "1500000" → a whole number of readings; anything else stops the script. */
function parseCount(text) {
  const m = /^\s*(\d+(?:\.\d+)?)\s*([kKmM]?)\s*$/.exec(text);
  const n = m ? Math.round(Number(m[1]) * { '': 1, k: 1e3, m: 1e6 }[m[2].toLowerCase()]) : NaN;
  if (!Number.isSafeInteger(n) || n < 1 || n > 1e9) {
    console.error(`bench:scale: KC_SCALE_READINGS='${text}' must be a number of readings from 1 to 1000M, like 10M, 50M, 2.5M or 1500000`);
    process.exit(2);
  }
  return n;
}
const REUSE = Boolean(process.env.KC_SCALE_REUSE);
const STABILITY_ONLY = Boolean(process.env.KC_SCALE_STABILITY_ONLY);
const STABILITY_QUERIES = ['', '?factors=decades&drift=removed'];
const STABILITY_ROUNDS = Math.max(1, Math.floor(Number(process.env.KC_BENCH_ROUNDS ?? 1)) || 1);
let N = parseCount(process.env.KC_SCALE_READINGS ?? '10M');

if (!existsSync(join(backend, 'dist', 'main.js'))) {
  console.error('bench:scale: build first (npm run build -w common && npm run build -w backend)');
  process.exit(1);
}
const { loadConfig } = await import('../dist/config/app-config.js');
const { createDataSource } = await import('../dist/database/create-data-source.js');
const { seedDemo, DEMO_PASSWORD } = await import('../dist/seed/demo-seed.js');

const config = loadConfig();
const say = (line) => console.log(line);
const fmt = (n, digits = 0) => n.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits }).replace(/,/g, ' ');
const ms = (x) => `${x.toFixed(1)} ms`;
const mb = (bytes) => `${fmt(bytes / 1048576)} MB`;
const sleep = (t) => new Promise((r) => setTimeout(r, t));
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function freePort() {
  const s = createServer();
  await new Promise((r) => s.listen(0, '127.0.0.1', r));
  const { port } = s.address();
  await new Promise((r) => s.close(r));
  return port;
}

say(
  `Scale benchmark — ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC, ${os.cpus().length} × ${os.cpus()[0]?.model ?? 'CPU'}, ${fmt(os.totalmem() / 2 ** 30, 1)} GB, Node ${process.versions.node}, load ${os
    .loadavg()
    .map((l) => l.toFixed(2))
    .join(' ')}`,
);
const admin = await mysql.createConnection({ host: config.db.host, port: config.db.port, user: config.db.user, password: config.db.password });
const [[{ version, pool: poolBytes }]] = await admin.query('SELECT VERSION() AS version, @@innodb_buffer_pool_size AS pool');
say(`MariaDB ${version} on port ${config.db.port}, buffer pool ${mb(Number(poolBytes))}, database ${DB}`);
const [[{ present }]] = await admin.query('SELECT COUNT(*) AS present FROM information_schema.SCHEMATA WHERE SCHEMA_NAME = ?', [DB]);
if (REUSE && !present) {
  console.error(`bench:scale: KC_SCALE_REUSE=1 but ${DB} does not exist: run once with KC_BENCH_KEEP=1 first`);
  process.exit(2);
}
if (!REUSE) {
  await admin.query(`DROP DATABASE IF EXISTS \`${DB}\``);
  await admin.query(`CREATE DATABASE \`${DB}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
}
{
  // A reused database is brought up to this build's migrations too (a newer build may add columns).
  const ds = createDataSource();
  await ds.initialize();
  await ds.runMigrations({ transaction: 'each' });
  if (!REUSE) await seedDemo(ds, { bcryptCost: 4 });
  await ds.destroy();
}
await admin.end();

const pool = mysql.createPool({
  host: config.db.host,
  port: config.db.port,
  user: config.db.user,
  password: config.db.password,
  database: DB,
  connectionLimit: 4,
});
const [[{ sequenceWorks }]] = await pool.query('SELECT COUNT(*) AS sequenceWorks FROM seq_1_to_3');
if (Number(sequenceWorks) !== 3) throw new Error('MariaDB SEQUENCE engine not available (SELECT * FROM seq_1_to_3)');

// ---- (a) the fill ---------------------------------------------------------------------------------

/** The kind of the k-th scale run: the first a warm-up (the one analysed), then a stability run, then an as-found run. */
const kindOf = (k) => ['warmup', 'stability', 'as_found'][k] ?? 'warmup';
/** Frequency in SQL per kind, from `seq`: a warm-up curve, a steady oscillator, or the dial's setting plus an error. */
const FREQUENCY_SQL = {
  warmup: '7050000 - 1270 * EXP(-(seq * 0.5) / 600) + MOD(seq * 7919, 1000) / 1000',
  stability: '7050000 + 0.8 * SIN(seq / 5000) + MOD(seq * 7919, 1000) / 1000',
  as_found: '(3500 + 500 * FLOOR((seq - 1) / 125000)) * 1000 * (1 + 0.0004) + MOD(seq * 7919, 1000) / 1000',
};
/** As-found dial settings: 8 settings of 125,000 readings each across the band's 3500–7500 kHz dial. */
const DIAL_SQL = { warmup: 'NULL', stability: 'NULL', as_found: '3500 + 500 * FLOOR((seq - 1) / 125000)' };

async function fill() {
  const [[{ org }]] = await pool.query("SELECT id AS org FROM organizations WHERE kind = 'customer' ORDER BY id LIMIT 1");
  const [[{ creator }]] = await pool.query("SELECT id AS creator FROM users WHERE role = 'engineer' LIMIT 1");
  const jobs = [];
  for (let i = 1; i <= 3; i++) {
    const [instrument] = await pool.query("INSERT INTO instruments (organization_id, make, model, serial) VALUES (?, 'Scale', 'Load VFO', ?)", [
      org,
      `SCALE-${String(i).padStart(4, '0')}`,
    ]);
    const [range] = await pool.query(
      `INSERT INTO instrument_ranges (instrument_id, position, label, dial_unit, dial_law, dial_min, dial_max, freq_min_hz, freq_max_hz, tolerance, multipliers)
       VALUES (?, 1, 'Band A', 'kHz', '{"kind":"direct","unit":"kHz"}', 3500, 7500, 3500000, 7500000, '{"kind":"percent","percent":0.5}', '[1]')`,
      [instrument.insertId],
    );
    const [job] = await pool.query(
      "INSERT INTO jobs (number, instrument_id, organization_id, status, received_date) VALUES (?, ?, ?, 'in_progress', CURRENT_DATE())",
      [`S-${String(i).padStart(4, '0')}`, instrument.insertId, org],
    );
    jobs.push({ job: job.insertId, range: range.insertId });
  }
  const runCount = Math.ceil(N / RUN_SIZE);
  const runs = [];
  const started = performance.now();
  for (let k = 0; k < runCount; k++) {
    const size = Math.min(RUN_SIZE, N - k * RUN_SIZE);
    const kind = kindOf(k);
    const { job, range } = jobs[k % jobs.length];
    const [run] = await pool.query(
      `INSERT INTO runs (job_id, range_id, kind, status, started_at, ended_at, created_by)
       VALUES (?, ?, ?, 'closed', UTC_TIMESTAMP(3) - INTERVAL ? DAY, UTC_TIMESTAMP(3) - INTERVAL ? DAY + INTERVAL ? SECOND, ?)`,
      [job, range, kind, runCount - k + 1, runCount - k + 1, Math.ceil(size * 0.5), creator],
    );
    const runStarted = performance.now();
    // 250,000 rows a statement: one statement per run would hold a 1,000,000-row transaction's undo log.
    for (let from = 1; from <= size; from += 250_000) {
      const to = Math.min(size, from + 249_999);
      await pool.query(
        `INSERT INTO readings (run_id, seq, t_s, dial, frequency_hz, aux, source, received_at)
         SELECT ?, seq, seq * 0.5, ${DIAL_SQL[kind]}, ${FREQUENCY_SQL[kind]}, NULL, 'bridge', r.started_at + INTERVAL (seq * 500000) MICROSECOND
         FROM seq_${from}_to_${to} JOIN (SELECT started_at FROM runs WHERE id = ?) r`,
        [run.insertId, run.insertId],
      );
    }
    runs.push({ id: run.insertId, kind, size, job });
    say(`    run ${run.insertId} (${kind}, ${fmt(size)} readings) in ${((performance.now() - runStarted) / 1000).toFixed(1)} s`);
  }
  const [excluded] = await pool.query(
    `INSERT INTO reading_exclusions (reading_id, run_id, reason, excluded_by)
     SELECT id, run_id, 'Counter gate glitch (scale benchmark)', ? FROM readings WHERE run_id = ? AND MOD(seq, 10000) = 0`,
    [creator, runs[0].id],
  );
  const seconds = (performance.now() - started) / 1000;
  say(
    `(a) filled ${fmt(N)} readings in ${runCount} runs (${runs.map((r) => r.kind).join(', ')}) over 3 jobs in ${seconds.toFixed(1)} s: ${fmt(N / seconds)} rows/s; ${fmt(excluded.affectedRows)} exclusions`,
  );
}

/** Sets each run's counters as the readings write path keeps them, if the runs table has them. */
async function setCounters() {
  const [columns] = await pool.query("SHOW COLUMNS FROM runs LIKE 'reading_count'");
  if (!columns.length) {
    say('    runs has no reading_count column (per-run counters not migrated): the lists count readings on request');
    return false;
  }
  const started = performance.now();
  await pool.query(
    `UPDATE runs r SET
       reading_count = (SELECT COUNT(*) FROM readings x WHERE x.run_id = r.id),
       excluded_count = (SELECT COUNT(*) FROM reading_exclusions e WHERE e.run_id = r.id),
       last_seq = (SELECT COALESCE(MAX(x.seq), 0) FROM readings x WHERE x.run_id = r.id)`,
  );
  say(`    per-run counters present: set from the rows in ${((performance.now() - started) / 1000).toFixed(1)} s`);
  return true;
}

async function diskUse() {
  await pool.query('ANALYZE TABLE readings, reading_exclusions');
  const [tables] = await pool.query(
    `SELECT TABLE_NAME AS name, DATA_LENGTH AS data, INDEX_LENGTH AS idx, TABLE_ROWS AS rows_estimate
     FROM information_schema.TABLES WHERE TABLE_SCHEMA = ? AND TABLE_NAME IN ('readings', 'reading_exclusions') ORDER BY TABLE_NAME DESC`,
    [DB],
  );
  const [[{ readings }]] = await pool.query('SELECT COUNT(*) AS readings FROM readings');
  let total = 0;
  for (const t of tables) {
    total += Number(t.data) + Number(t.idx);
    say(`    ${t.name}: data ${mb(Number(t.data))} + indexes ${mb(Number(t.idx))}`);
  }
  const [[{ datadir }]] = await pool.query('SELECT @@datadir AS datadir');
  let files;
  try {
    const dir = join(datadir, DB);
    const sizes = readdirSync(dir).map((f) => ({ f, size: statSync(join(dir, f)).size }));
    const ibd = (name) => sizes.find((s) => s.f === `${name}.ibd`)?.size ?? 0;
    files = `; files in ${dir}: ${mb(sizes.reduce((s, x) => s + x.size, 0))} (readings.ibd ${mb(ibd('readings'))}, reading_exclusions.ibd ${mb(ibd('reading_exclusions'))})`;
  } catch (e) {
    files = `; data dir files not readable here (${e.code ?? e.message})`;
  }
  say(`(a) disk: ${mb(total)} for ${fmt(Number(readings))} readings and their exclusions, ${fmt(total / Number(readings))} bytes a reading${files}`);
}

if (REUSE) {
  const [[{ n }]] = await pool.query(
    "SELECT COUNT(*) AS n FROM readings WHERE run_id IN (SELECT r.id FROM runs r JOIN jobs j ON j.id = r.job_id WHERE j.number LIKE 'S-%')",
  );
  N = Number(n);
  say(`(a) reusing ${DB} as filled before (KC_SCALE_REUSE=1): ${fmt(N)} readings in its scale runs`);
} else await fill();
const counters = await setCounters();
await diskUse();

// ---- the server ---------------------------------------------------------------------------------

/** Starts the server from dist on a free port; resolves once /api/health answers. */
async function startServer() {
  const port = await freePort();
  // KC_BENCH_SERVER_FLAGS passes node flags to the server, e.g. --cpu-prof to see where its time goes.
  const serverFlags = (process.env.KC_BENCH_SERVER_FLAGS ?? '').split(' ').filter(Boolean);
  // The server is not told this script's own switch (it would warn of a KC_ name it does not know).
  const { KC_SCALE_STABILITY_ONLY: _stabilityOnly, ...inherited } = process.env;
  const server = spawn(process.execPath, [...serverFlags, join(backend, 'dist', 'main.js')], {
    cwd: root,
    env: { ...inherited, KC_PORT: String(port), KC_HOST: '127.0.0.1', KC_DB_NAME: DB, KC_RECALL_DISABLED: '1', NODE_OPTIONS: '' },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const exited = () => server.exitCode !== null || server.signalCode !== null;
  const stop = async () => {
    if (exited()) return;
    server.kill('SIGTERM');
    await new Promise((r) => (exited() ? r() : server.once('exit', r)));
  };
  const base = `http://127.0.0.1:${port}`;
  try {
    for (let i = 0; ; i++) {
      try {
        if ((await fetch(`${base}/api/health`)).ok) break;
      } catch {
        /* not up yet */
      }
      if (i > 300 || exited()) throw new Error('the server did not start');
      await sleep(100);
    }
  } catch (error) {
    await stop();
    throw error;
  }
  return { base, stop };
}

async function signIn(base, email) {
  const res = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  if (!res.ok) throw new Error(`sign-in as ${email}: ${res.status}`);
  return (await res.json()).accessToken;
}

// ---- (e) a stability run, before any server has read it -----------------------------------------

/** (e): the ratios of the stability run's cold analyses to its stream, or null when there is no 1M stability run. */
async function stabilityStep() {
  const [[run]] = await pool.query(
    `SELECT r.id, (SELECT COUNT(*) FROM readings x WHERE x.run_id = r.id) AS count
     FROM runs r JOIN jobs j ON j.id = r.job_id WHERE j.number LIKE 'S-%' AND r.kind = 'stability' ORDER BY r.id LIMIT 1`,
  );
  if (!run || Number(run.count) < RUN_SIZE) {
    say(`(e) no stability run of ${fmt(RUN_SIZE)} readings (KC_SCALE_READINGS=2M or more fills one): skipped`);
    return null;
  }
  const count = Number(run.count);
  const first = await streamRun(run.id, count);
  const byQuery = STABILITY_QUERIES.map(() => []);
  for (let round = 1; round <= STABILITY_ROUNDS; round++) {
    const stream = await streamRun(run.id, count);
    say(
      `(e) stability run ${run.id}, ${fmt(stream.rows)} readings${STABILITY_ROUNDS > 1 ? `, round ${round} of ${STABILITY_ROUNDS}` : ''}: streamed out in ${stream.seconds.toFixed(2)} s${round === 1 ? ` (first pass${REUSE ? '' : ', the first read since the fill'}: ${first.seconds.toFixed(2)} s)` : ''}`,
    );
    for (const [q, query] of STABILITY_QUERIES.entries()) {
      // A server of its own for each query: the series and the answer are cached per run, so a second query in
      // the same process would not read the rows again.
      const { base, stop } = await startServer();
      try {
        const token = await signIn(base, 'lead@kilocycle.test');
        const get = async () => {
          const started = performance.now();
          const res = await fetch(`${base}/api/runs/${run.id}/analysis${query}`, { headers: { authorization: `Bearer ${token}` } });
          const body = await res.text();
          if (res.status !== 200) throw new Error(`stability analysis${query} answered ${res.status}: ${body.slice(0, 300)}`);
          return { ms: performance.now() - started, body };
        };
        const cold = await get();
        const warm = [];
        for (let k = 0; k < 3; k++) warm.push((await get()).ms);
        const answer = JSON.parse(cold.body);
        const ratio = cold.ms / (stream.seconds * 1000);
        byQuery[q].push(ratio);
        say(
          `    GET /api/runs/${run.id}/analysis${query || ' (default query)'}: cold ${ms(cold.ms)} = ${ratio.toFixed(2)} × stream (target ≤ 1.5: ${ratio <= 1.5 ? 'met' : 'NOT met'}), warm median of 3 ${ms(median(warm))}; ${answer.toolkit?.deviations?.length ?? '?'} τ, ${answer.toolkit?.outliers?.flaggedCount ?? '?'} flagged by the MAD screen`,
        );
      } finally {
        await stop();
      }
    }
  }
  // The median over the rounds (KC_BENCH_ROUNDS): one round on a busy machine can be far off either way.
  return byQuery.map((ratios) => median(ratios));
}

const stabilityRatios = await stabilityStep();
const stabilitySummary = stabilityRatios
  ? `stability cold analysis ${stabilityRatios.map((r) => r.toFixed(2)).join(' / ')} × stream${STABILITY_ROUNDS > 1 ? ` (median of ${STABILITY_ROUNDS} rounds)` : ''}`
  : 'no stability run';
if (STABILITY_ONLY) {
  say(`scale ${fmt(N)} readings (KC_SCALE_STABILITY_ONLY): ${stabilitySummary} (${STABILITY_QUERIES.map((q) => q || 'default').join(' / ')})`);
  if (!process.env.KC_BENCH_KEEP) await pool.query(`DROP DATABASE \`${DB}\``).catch(() => undefined);
  await pool.end();
  process.exit(0);
}

const { base, stop } = await startServer();
let slowest = 0;
try {
  const lead = await signIn(base, 'lead@kilocycle.test');
  const adminToken = await signIn(base, 'admin@kilocycle.test');

  // The scale warm-up runs with their reading counts: the first is (c) and (d)'s, the next full one (d2)'s.
  const [warmups] = await pool.query(
    `SELECT r.id, r.job_id AS job, (SELECT COUNT(*) FROM readings x WHERE x.run_id = r.id) AS count
     FROM runs r JOIN jobs j ON j.id = r.job_id WHERE j.number LIKE 'S-%' AND r.kind = 'warmup' ORDER BY r.id`,
  );
  const big = warmups[0];
  const bigCount = Number(big.count);

  // (d) first: the server's first analysis of that run is the cold one, so no list page may touch it before.
  // As in bench:ingest (c): the first pass brings the rows into the buffer pool (as far as they fit), the second is (c).
  const first = await streamRun(big.id, bigCount);
  const stream = await streamRun(big.id, bigCount);
  say(
    `(c) run ${big.id}, ${fmt(stream.rows)} readings: streamed out into Float64Arrays in ${stream.seconds.toFixed(2)} s (prepared statement, binary rows; first pass ${first.seconds.toFixed(2)} s)`,
  );
  const analyse = async (runId = big.id) => {
    const started = performance.now();
    const res = await fetch(`${base}/api/runs/${runId}/analysis`, { headers: { authorization: `Bearer ${lead}` } });
    const body = await res.text();
    return { status: res.status, ms: performance.now() - started, body };
  };
  const cold = await analyse();
  if (cold.status !== 200) throw new Error(`analysis answered ${cold.status}: ${cold.body.slice(0, 300)}`);
  const warm = [];
  for (let k = 0; k < 5; k++) warm.push((await analyse()).ms);
  const coldRatio = cold.ms / (stream.seconds * 1000);
  say(
    `(d) GET /api/runs/${big.id}/analysis: cold ${ms(cold.ms)} (${coldRatio.toFixed(2)} × (c); target ≤ 1.5: ${coldRatio <= 1.5 ? 'met' : 'NOT met'}), warm median of 5 ${ms(median(warm))}; answer ${fmt(cold.body.length / 1024)} kB`,
  );

  // (d2) another full warm-up run, its rows streamed the same way first, analysed once the server's analysis
  // code is compiled: the part of (d) that is the analysis itself rather than the process's first use of it.
  const second = warmups.find((r) => r.id !== big.id && Number(r.count) === bigCount);
  if (second) {
    await streamRun(second.id, bigCount);
    const secondStream = await streamRun(second.id, bigCount);
    const secondCold = await analyse(second.id);
    if (secondCold.status !== 200) throw new Error(`analysis answered ${secondCold.status}: ${secondCold.body.slice(0, 300)}`);
    say(
      `(d2) run ${second.id}, same size, code already compiled: stream ${secondStream.seconds.toFixed(2)} s, cold analysis ${ms(secondCold.ms)} (${(secondCold.ms / (secondStream.seconds * 1000)).toFixed(2)} × its stream)`,
    );
  }

  // (b) the list pages.
  const [[review]] = await pool.query("SELECT COUNT(*) AS n FROM jobs WHERE status = 'in_review'");
  const lastPage = Math.max(1, Math.ceil(bigCount / 50));
  const pages = [
    ['runs, first page of 50', '/api/runs?page=1&pageSize=50'],
    ['runs, 5 a page', '/api/runs?pageSize=5'],
    ['runs, sorted by -startedAt', '/api/runs?pageSize=25&sort=-startedAt'],
    [`a scale job's runs`, `/api/jobs/${big.job}/runs`],
    ['jobs, first page of 50', '/api/jobs?page=1&pageSize=50'],
    [`review queue (jobs in review: ${review.n})`, '/api/jobs?status=in_review&pageSize=25'],
    ['instruments, first page of 25 by make', '/api/instruments?page=1&pageSize=25&sort=make'],
    [`readings of run ${big.id}, first page of 50`, `/api/runs/${big.id}/readings?page=1&pageSize=50`],
    [`readings of run ${big.id}, last page (${fmt(lastPage)})`, `/api/runs/${big.id}/readings?page=${lastPage}&pageSize=50`],
    [`readings of run ${big.id}, latest 500 (the live page)`, `/api/runs/${big.id}/readings?sort=-seq&pageSize=500`],
    [`readings of run ${big.id}, by -frequency`, `/api/runs/${big.id}/readings?sort=-frequency&pageSize=50`],
    ['certificates', '/api/certificates?page=1&pageSize=25'],
    ['audit log, newest first', '/api/audit?page=1&pageSize=50&sort=-at'],
    [`audit of job ${big.job}`, `/api/audit?jobId=${big.job}&sort=-at&pageSize=200`],
    ['recall notices', '/api/recall/notices'],
    ['organisations', '/api/organizations'],
    ['standards', '/api/standards'],
    ['benches', '/api/benches'],
    ['procedures', '/api/procedures'],
    ['comparisons', '/api/comparisons'],
    ['users (admin)', '/api/users', adminToken],
    ['mail outbox (admin)', '/api/mail', adminToken],
  ];
  say(
    `(b) list pages, median of 5 after one untimed call (target < ${TARGET_MS} ms; per-run counters ${counters ? 'in place' : 'NOT in place: before counters'}):`,
  );
  for (const [label, path, token = lead] of pages) {
    const times = [];
    let total = '';
    for (let k = 0; k < 6; k++) {
      const started = performance.now();
      const res = await fetch(base + path, { headers: { authorization: `Bearer ${token}` } });
      const body = await res.json();
      const elapsed = performance.now() - started;
      if (res.status !== 200) throw new Error(`${path}: ${res.status} ${JSON.stringify(body).slice(0, 300)}`);
      total = body.total ?? '';
      if (k > 0) times.push(elapsed);
    }
    const m = median(times);
    slowest = Math.max(slowest, m);
    say(`    ${label.padEnd(52)} ${ms(m).padStart(10)}  ${m < TARGET_MS ? 'met' : 'NOT met'}   ${path}${total === '' ? '' : ` (total ${fmt(Number(total))})`}`);
  }
  say(`scale ${fmt(N)} readings: slowest list page ${Math.round(slowest)} ms, cold analysis ${coldRatio.toFixed(2)} × stream, ${stabilitySummary}`);
} finally {
  await stop();
  if (!process.env.KC_BENCH_KEEP) await pool.query(`DROP DATABASE \`${DB}\``).catch(() => undefined);
  await pool.end();
}

/** A run's time and frequency columns out of MariaDB into Float64Arrays: prepared statement, binary rows. */
function streamRun(runId, count) {
  const conn = mysqlCallback.createConnection({ host: config.db.host, port: config.db.port, user: config.db.user, password: config.db.password, database: DB });
  return new Promise((resolve, reject) => {
    const t = new Float64Array(count);
    const f = new Float64Array(count);
    let i = 0;
    const started = performance.now();
    conn
      .execute({
        sql: 'SELECT t_s, frequency_hz FROM readings FORCE INDEX (UQ_readings_run_seq) WHERE run_id = ? ORDER BY seq',
        values: [runId],
        rowsAsArray: true,
      })
      .on('result', (r) => {
        t[i] = Number(r[0]);
        f[i] = Number(r[1]);
        i++;
      })
      .on('error', reject)
      .on('end', () => resolve({ seconds: (performance.now() - started) / 1000, rows: i }));
  }).finally(() => conn.end());
}
