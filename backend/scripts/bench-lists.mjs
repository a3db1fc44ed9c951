// Times the list endpoints and the run analysis at size: 10,000 instruments and a run of 100,000 readings.
// Usage: npm run build -w common && npm run build -w backend && node backend/scripts/bench-lists.mjs
// It empties and fills its own database (KC_DB_NAME, default kilocycle_bench_lists), starts the built
// server on BENCH_PORT (default 5183) against it, times requests over HTTP on loopback and stops the server.
// BENCH_DIST points at another build of the backend (e.g. one compiled with --outDir var/bench-dist).
import { spawn } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

process.env.KC_DB_NAME ??= 'kilocycle_bench_lists';
const PORT = Number(process.env.BENCH_PORT ?? 5183);
const INSTRUMENTS = Number(process.env.BENCH_INSTRUMENTS ?? 10_000);
const READINGS = Number(process.env.BENCH_READINGS ?? 100_000);
const REPEAT = Number(process.env.BENCH_REPEAT ?? 20);
const here = dirname(fileURLToPath(import.meta.url));
const dist = process.env.BENCH_DIST ?? join(here, '..', 'dist');

const { createDataSource } = await import(join(dist, 'database/create-data-source.js'));
const { seedDemo, DEMO_PASSWORD } = await import(join(dist, 'seed/demo-seed.js'));
const { seededGaussian, seededRandom, warmupCurve } = await import(join(dist, 'jobs/demo-signals.js'));

const log = (line) => console.log(line);
const ms = (start) => Number(process.hrtime.bigint() - start) / 1e6;

// ---- 1. Fill the database ----------------------------------------------------------------------
const ds = createDataSource();
await ds.initialize();
let t0 = process.hrtime.bigint();
await ds.dropDatabase();
await ds.runMigrations({ transaction: 'each' });
await seedDemo(ds, { bcryptCost: 4 });
const customers = (await ds.query("SELECT id FROM organizations WHERE kind = 'customer' ORDER BY id")).map((r) => r.id);
const [{ id: leadId }] = await ds.query("SELECT id FROM users WHERE role = 'lead' LIMIT 1");
log(`database ${process.env.KC_DB_NAME}: migrated and seeded in ${ms(t0).toFixed(0)} ms`);

t0 = process.hrtime.bigint();
const makers = ['Ashby', 'Brookfield', 'Calder', 'Dunmore', 'Elstow', 'Fairlie', 'Garrow', 'Hollins', 'Ixworth', 'Jessop'];
const models = ['SG-2 signal generator', 'VFO-7 oscillator', 'GDO-1 dip meter', 'RX-9 receiver', 'TX-6 transmitter'];
const random = seededRandom(7);
const today = Date.now();
const isoDay = (offsetDays) => new Date(today + offsetDays * 86_400_000).toISOString().slice(0, 10);
for (let from = 0; from < INSTRUMENTS; from += 1000) {
  const rows = [];
  for (let i = from; i < Math.min(from + 1000, INSTRUMENTS); i++) {
    rows.push([
      customers[i % customers.length],
      makers[i % makers.length],
      models[(i >> 3) % models.length],
      `B-${String(i).padStart(6, '0')}`,
      `AT-${i}`,
      12,
      isoDay(Math.floor(random() * 730) - 200),
    ]);
  }
  await ds.query('INSERT INTO instruments (organization_id, make, model, serial, asset_tag, recall_interval_months, next_due_date) VALUES ?', [rows]);
}
const instrumentIds = (await ds.query("SELECT id FROM instruments WHERE serial LIKE 'B-%' ORDER BY id")).map((r) => r.id);
const law = JSON.stringify({ kind: 'direct', unit: 'kHz' });
const tolerance = JSON.stringify({ kind: 'percent', percent: 0.5 });
for (let from = 0; from < instrumentIds.length; from += 500) {
  const rows = instrumentIds.slice(from, from + 500).flatMap((id) => [
    [id, 1, 'A 1750–2000 kHz', 'kHz', law, 1750, 2000, 1.75e6, 2.0e6, tolerance, '[1,2,4]'],
    [id, 2, 'B 3500–4000 kHz', 'kHz', law, 3500, 4000, 3.5e6, 4.0e6, tolerance, '[1,2]'],
  ]);
  await ds.query(
    'INSERT INTO instrument_ranges (instrument_id, position, label, dial_unit, dial_law, dial_min, dial_max, freq_min_hz, freq_max_hz, tolerance, multipliers) VALUES ?',
    [rows],
  );
}
log(`${INSTRUMENTS} instruments with 2 ranges each inserted in ${ms(t0).toFixed(0)} ms`);

t0 = process.hrtime.bigint();
const benchInstrument = instrumentIds[0];
const [{ id: rangeId }] = await ds.query('SELECT id FROM instrument_ranges WHERE instrument_id = ? AND position = 1', [benchInstrument]);
const [{ organization_id: benchOrg }] = await ds.query('SELECT organization_id FROM instruments WHERE id = ?', [benchInstrument]);
const job = await ds.query("INSERT INTO jobs (number, instrument_id, organization_id, status, received_date) VALUES ('JBENCH-0001', ?, ?, 'in_progress', ?)", [
  benchInstrument,
  benchOrg,
  isoDay(-1),
]);
// Two identical runs: the first analysis in a fresh server also pays for compiling the code; the
// second shows a cache-cold analysis with the code already warm.
const runIds = [];
for (const seed of [11, 12]) {
  const run = await ds.query("INSERT INTO runs (job_id, range_id, kind, status, started_at, created_by) VALUES (?, ?, 'warmup', 'closed', ?, ?)", [
    job.insertId,
    rangeId,
    new Date(today - 86_400_000),
    leadId,
  ]);
  const curve = warmupCurve(1_850_000, 1_400, 1_800);
  const noise = seededGaussian(seed);
  for (let from = 0; from < READINGS; from += 1000) {
    const rows = [];
    for (let i = from; i < Math.min(from + 1000, READINGS); i++) rows.push([run.insertId, i + 1, i, null, curve(i) + 1.5 * noise(), null, 'import']);
    await ds.query('INSERT INTO readings (run_id, seq, t_s, dial, frequency_hz, aux, source) VALUES ?', [rows]);
  }
  // The run's counters, as the app's write path keeps them (these rows bypass it).
  await ds.query('UPDATE runs SET reading_count = ?, last_seq = ? WHERE id = ?', [READINGS, READINGS, run.insertId]);
  runIds.push(run.insertId);
}
const [runId, secondRunId] = runIds;
log(`two warm-up runs of ${READINGS} readings (runs ${runIds.join(', ')}) inserted in ${ms(t0).toFixed(0)} ms`);

// What streaming the rows costs by itself: the yardstick for a cold analysis. A plain query sends
// the doubles as text; a prepared statement (what the analysis uses) sends them in binary.
const runner = ds.createQueryRunner();
const connection = await runner.connect();
const streamTimes = { query: [], execute: [] };
for (let k = 0; k < 3; k++) {
  for (const method of ['query', 'execute']) {
    t0 = process.hrtime.bigint();
    const f = new Float64Array(READINGS);
    let n = 0;
    await new Promise((resolve, reject) => {
      connection[method]({ sql: 'SELECT seq, t_s, dial, frequency_hz, aux FROM readings WHERE run_id = ? ORDER BY seq', values: [runId], rowsAsArray: true })
        .on('result', (row) => {
          f[n++] = row[3];
        })
        .on('error', reject)
        .on('end', resolve);
    });
    streamTimes[method].push(ms(t0));
  }
}
await runner.release();
await ds.destroy();

// ---- 2. Start the server against that database ------------------------------------------------
const server = spawn(process.execPath, [join(dist, 'main.js')], {
  env: { ...process.env, KC_PORT: String(PORT), KC_MODE: 'demo' },
  stdio: ['ignore', 'pipe', 'pipe'],
});
server.stderr.on('data', (chunk) => process.stderr.write(chunk));
const base = `http://127.0.0.1:${PORT}`;
try {
  for (let attempt = 0; ; attempt++) {
    try {
      if ((await fetch(`${base}/api/health`)).status < 500) break;
    } catch {
      if (attempt > 150) throw new Error('the server did not start within 30 s');
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'lead@kilocycle.test', password: DEMO_PASSWORD }),
  });
  const { accessToken } = await login.json();
  const headers = { authorization: `Bearer ${accessToken}` };
  const get = async (path) => {
    const start = process.hrtime.bigint();
    const res = await fetch(`${base}${path}`, { headers });
    const body = await res.json();
    const elapsed = ms(start);
    if (res.status !== 200) throw new Error(`${path}: ${res.status} ${JSON.stringify(body).slice(0, 300)}`);
    return { elapsed, body };
  };
  const stats = (times) => {
    const sorted = [...times].sort((a, b) => a - b);
    const at = (q) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];
    return `median ${at(0.5).toFixed(1)} ms, p90 ${at(0.9).toFixed(1)} ms, min ${sorted[0].toFixed(1)} ms`;
  };
  const time = async (label, path) => {
    await get(path); // one untimed call: JIT and connection warm-up
    const times = [];
    let total = 0;
    for (let k = 0; k < REPEAT; k++) {
      const { elapsed, body } = await get(path);
      times.push(elapsed);
      total = body.total;
    }
    log(`  ${label.padEnd(58)} ${stats(times)}  (total ${total})`);
  };

  // The analyses first, while nothing is cached.
  const first = await get(`/api/runs/${runId}/analysis`);
  const cold = await get(`/api/runs/${secondRunId}/analysis`);
  const warm = [];
  for (let k = 0; k < REPEAT; k++) warm.push((await get(`/api/runs/${secondRunId}/analysis`)).elapsed);
  const northgate = customers[0];

  log(`\nHTTP on loopback, ${REPEAT} timed calls each after one untimed call:`);
  await time('instruments, first page (25, default sort)', '/api/instruments?pageSize=25');
  await time('instruments, page 200 sorted by -serial', '/api/instruments?page=200&pageSize=25&sort=-serial');
  await time('instruments, q=ashby + organisation, sorted by due date', `/api/instruments?q=ashby&organizationId=${northgate}&sort=nextDueDate&pageSize=50`);
  await time('instruments, overdue, sorted by -nextDueDate, 100 a page', '/api/instruments?overdue=true&sort=-nextDueDate&pageSize=100');
  await time('instruments, sorted by organisation name, page 50', '/api/instruments?sort=organizationName&page=50&pageSize=25');
  await time('jobs, first page', '/api/jobs?pageSize=25');
  await time('runs, first page', '/api/runs?pageSize=25');
  await time(`readings of the 100k run, first page (100)`, `/api/runs/${runId}/readings?pageSize=100`);
  await time(`readings of the 100k run, last page (100)`, `/api/runs/${runId}/readings?page=${Math.ceil(READINGS / 100)}&pageSize=100`);
  await time(`readings of the 100k run, sorted by -frequency (100)`, `/api/runs/${runId}/readings?pageSize=100&sort=-frequency`);
  log(`\nAnalysis of the ${READINGS}-reading warm-up run:`);
  const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
  log(`  streaming the rows alone, plain query (text)                  ${streamTimes.query.map((x) => x.toFixed(0)).join(' / ')} ms`);
  log(`  streaming the rows alone, prepared statement (binary)         ${streamTimes.execute.map((x) => x.toFixed(0)).join(' / ')} ms`);
  log(`  first analysis after start (code not yet compiled)            ${first.elapsed.toFixed(0)} ms`);
  log(
    `  cold (another run, not cached: load, fit, downsample)         ${cold.elapsed.toFixed(0)} ms  (τ = ${cold.body.fit.tau.toFixed(1)} s, series ${cold.body.series.t.length} points)`,
  );
  log(
    `    = ${(cold.elapsed / median(streamTimes.query)).toFixed(2)}× the text stream, ${(cold.elapsed / median(streamTimes.execute)).toFixed(2)}× the binary stream`,
  );
  log(`  warm (cached)                                                 ${stats(warm)}`);
} finally {
  server.kill('SIGTERM');
  await new Promise((resolve) => server.once('exit', resolve));
}
