// Imports a 1,000,000-row CSV through the real HTTP endpoint and watches the server's memory.
// Usage: npm run build -w common && npm run build -w backend && node backend/scripts/bench-import.mjs
// It empties and fills its own database (KC_DB_NAME, default kilocycle_bench_import), writes the CSV to a
// temporary file, starts the built server on BENCH_PORT (default 5186), uploads the file as multipart
// (streamed from disk) while sampling the server's VmRSS every 100 ms and polling the import's progress,
// prints rows/s, peak RSS and the progress seen, checks the row count in the database and stops the server.
import { spawn } from 'node:child_process';
import { createWriteStream, openAsBlob, readFileSync, rmSync, statSync } from 'node:fs';
import { mkdtemp } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { once } from 'node:events';
import { fileURLToPath } from 'node:url';

process.env.KC_DB_NAME ??= 'kilocycle_bench_import';
const PORT = Number(process.env.BENCH_PORT ?? 5186);
const ROWS = Number(process.env.BENCH_ROWS ?? 1_000_000);
const MODE = process.env.BENCH_MODE ?? 'all';
const RSS_TARGET_MB = 300;
const here = dirname(fileURLToPath(import.meta.url));
const dist = join(here, '..', 'dist');
const base = `http://127.0.0.1:${PORT}`;

const { createDataSource } = await import(join(dist, 'database/create-data-source.js'));
const { seedDemo, DEMO_PASSWORD } = await import(join(dist, 'seed/demo-seed.js'));

const log = (line) => console.log(line);
const seconds = (start) => Number(process.hrtime.bigint() - start) / 1e9;
const sleep = (ms) => new Promise((r) => setTimeout(r, ms));

// ---- 1. A fresh database with one open warm-up run --------------------------------------------
const ds = createDataSource();
await ds.initialize();
await ds.dropDatabase();
await ds.runMigrations({ transaction: 'each' });
await seedDemo(ds, { bcryptCost: 4 });
const [{ id: orgId }] = await ds.query("SELECT id FROM organizations WHERE kind = 'customer' ORDER BY id LIMIT 1");
const [{ id: techId }] = await ds.query("SELECT id FROM users WHERE role = 'technician' LIMIT 1");
const instrument = await ds.query("INSERT INTO instruments (organization_id, make, model, serial) VALUES (?, 'Bench Works', 'VFO-9 oscillator', 'IMPORT-1')", [
  orgId,
]);
const range = await ds.query(
  `INSERT INTO instrument_ranges (instrument_id, position, label, dial_unit, dial_law, dial_min, dial_max, freq_min_hz, freq_max_hz, tolerance, multipliers)
   VALUES (?, 1, 'A 7000–7300 kHz', 'kHz', ?, 7000, 7300, 7.0e6, 7.3e6, ?, '[1]')`,
  [instrument.insertId, JSON.stringify({ kind: 'direct', unit: 'kHz' }), JSON.stringify({ kind: 'percent', percent: 0.5 })],
);
const job = await ds.query(
  "INSERT INTO jobs (number, instrument_id, organization_id, status, received_date) VALUES ('JIMPORT-0001', ?, ?, 'in_progress', CURRENT_DATE())",
  [instrument.insertId, orgId],
);
const run = await ds.query("INSERT INTO runs (job_id, range_id, kind, status, started_at, created_by) VALUES (?, ?, 'warmup', 'open', UTC_TIMESTAMP(3), ?)", [
  job.insertId,
  range.insertId,
  techId,
]);
const runId = Number(run.insertId);
log(`database ${process.env.KC_DB_NAME}: migrated, seeded, run ${runId} open`);

// ---- 2. The CSV: a warm-up at ten readings a second, frequency in kHz, a unit column now and then -----
const dir = await mkdtemp(join(tmpdir(), 'kc-bench-import-'));
const csvPath = join(dir, 'warmup-1M.csv');
let t0 = process.hrtime.bigint();
const out = createWriteStream(csvPath);
out.write('\uFEFFElapsed (s),Counter (kHz),Unit\r\n');
let chunk = '';
for (let i = 0; i < ROWS; i++) {
  const t = i / 10;
  const khz = 7150 + 1.8 * Math.exp(-t / 1800) + 0.000002 * Math.sin(i);
  chunk += i % 10 === 0 ? `${t.toFixed(1)},${(khz * 1000).toFixed(3)},Hz\r\n` : `${t.toFixed(1)},${khz.toFixed(6)},\r\n`;
  if (chunk.length > 1 << 16) {
    if (!out.write(chunk)) await once(out, 'drain');
    chunk = '';
  }
}
out.end(chunk);
await once(out, 'finish');
const size = statSync(csvPath).size;
log(`CSV: ${ROWS.toLocaleString('en-GB')} rows, ${(size / 1e6).toFixed(1)} MB, written in ${seconds(t0).toFixed(1)} s`);

// ---- 3. The built server on its own port ------------------------------------------------------
const nodeFlags = (process.env.BENCH_NODE_FLAGS ?? '').split(' ').filter(Boolean);
const server = spawn(process.execPath, [...nodeFlags, join(dist, 'main.js')], {
  env: { ...process.env, KC_PORT: String(PORT), KC_HOST: '127.0.0.1', KC_IMPORT_MAX_MB: '200' },
  stdio: ['ignore', nodeFlags.length > 0 ? 'inherit' : 'ignore', 'inherit'],
});
const stop = () => {
  if (server.exitCode === null) server.kill('SIGTERM');
};
process.on('exit', stop);
const rssMb = () => {
  try {
    const match = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${server.pid}/status`, 'utf8'));
    return match ? Number(match[1]) / 1024 : null;
  } catch {
    return null;
  }
};
let up = false;
for (let i = 0; i < 150 && !up; i++) {
  await sleep(200);
  up = await fetch(`${base}/api/health`)
    .then((r) => r.ok)
    .catch(() => false);
}
if (!up) throw new Error('the server did not come up');
const login = await fetch(`${base}/api/auth/login`, {
  method: 'POST',
  headers: { 'content-type': 'application/json' },
  body: JSON.stringify({ email: 'tech@kilocycle.test', password: DEMO_PASSWORD }),
});
const { accessToken } = await login.json();
const headers = { Authorization: `Bearer ${accessToken}` };
await sleep(500);
const idleRss = rssMb();
log(`server pid ${server.pid} up on ${base}; idle RSS ${idleRss?.toFixed(0)} MB`);

// ---- 4. Upload, sampling RSS every 100 ms and the progress every 250 ms ---------------------------
const importId = `bench-${Date.now()}`;
let peakRss = idleRss ?? 0;
const sampler = setInterval(() => {
  const rss = rssMb();
  if (rss !== null) peakRss = Math.max(peakRss, rss);
}, 100);
const seen = [];
let polling = true;
const poller = (async () => {
  while (polling) {
    const res = await fetch(`${base}/api/imports/${importId}/progress`, { headers }).catch(() => null);
    if (res?.ok) {
      const p = await res.json();
      const last = seen[seen.length - 1];
      if (!last || last.phase !== p.phase || last.fraction !== p.fraction || last.rowsDone !== p.rowsDone)
        seen.push({ phase: p.phase, fraction: p.fraction, rowsDone: p.rowsDone, bytesDone: p.bytesDone });
    }
    await sleep(250);
  }
})();
const form = new FormData();
form.append('file', await openAsBlob(csvPath), 'warmup-1M.csv');
t0 = process.hrtime.bigint();
const res = await fetch(`${base}/api/runs/${runId}/imports?mode=${MODE}&importId=${importId}`, { method: 'POST', headers, body: form });
const elapsed = seconds(t0);
const report = await res.json();
await sleep(300);
polling = false;
await poller;
clearInterval(sampler);
const [{ n }] = await ds.query('SELECT COUNT(*) AS n FROM readings WHERE run_id = ?', [runId]);
await ds.destroy();
stop();
rmSync(dir, { recursive: true, force: true });

// ---- 5. Figures -----------------------------------------------------------------------------
log(`answer: HTTP ${res.status}, imported ${report.imported}, rejected ${report.rejectedCount}, mode ${MODE}`);
log(`readings in the run: ${Number(n).toLocaleString('en-GB')}`);
log(
  `elapsed (upload, validate, write, commit): ${elapsed.toFixed(1)} s — ${Math.round(Number(report.imported) / elapsed).toLocaleString('en-GB')} rows/s, ${(size / 1e6 / elapsed).toFixed(1)} MB/s`,
);
log(
  `server RSS: idle ${idleRss?.toFixed(0)} MB, peak ${peakRss.toFixed(0)} MB (target under ${RSS_TARGET_MB} MB: ${peakRss < RSS_TARGET_MB ? 'met' : 'NOT met'})`,
);
const fractions = seen.map((p) => p.fraction);
const rising = fractions.every((f, i) => i === 0 || f >= fractions[i - 1]);
log(`progress: ${seen.length} distinct readings, ${rising ? 'never going back' : 'WENT BACK'}; phases ${[...new Set(seen.map((p) => p.phase))].join(' → ')}`);
for (const p of seen.filter((_p, i) => i % Math.max(1, Math.floor(seen.length / 16)) === 0 || i === seen.length - 1)) {
  log(`  ${p.phase.padEnd(10)} ${(p.fraction * 100).toFixed(1).padStart(5)} %  rows ${String(p.rowsDone).padStart(8)}  bytes ${p.bytesDone}`);
}
if (res.status !== 201 || Number(n) !== ROWS || peakRss >= RSS_TARGET_MB || !rising || seen.length < 3) process.exitCode = 1;
