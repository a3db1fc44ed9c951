import { createRequire } from 'node:module';
import type { ComparisonResult, ComparisonRow, InstrumentSensitivity, SavedComparison } from '@kilocycle/common/types';
import Papa from 'papaparse';
import type { DataSource } from 'typeorm';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { createRun, organizationId } from '../ingest/ingest-fixtures.js';
import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';

// jstat 1.9 (no type declarations): the independent check of the Welch intervals.
type Jstat = { studentt: { inv(p: number, df: number): number }; mean(values: number[]): number; stdev(values: number[], sample: boolean): number };
const jstat = createRequire(import.meta.url)('jstat') as Jstat;

/** Mulberry32 + Box–Muller: seeded counter noise. */
function gaussian(seed: number): () => number {
  let state = seed >>> 0;
  const uniform = () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(Math.max(uniform(), 1e-300))) * Math.cos(2 * Math.PI * uniform());
}

type Row = { t: number; f: number; aux?: number | null };
const warmup = (fInf: number, amplitude: number, tau: number, seed: number, count = 720, step = 10): Row[] => {
  const noise = gaussian(seed);
  return Array.from({ length: count }, (_, i) => ({ t: i * step, f: fInf + amplitude * Math.exp((-i * step) / tau) + 2 * noise() }));
};

async function insertReadings(ds: DataSource, runId: number, rows: Row[]): Promise<void> {
  for (let from = 0; from < rows.length; from += 1000) {
    const values = rows.slice(from, from + 1000).map((r, i) => [runId, from + i + 1, r.t, null, r.f, r.aux ?? null, 'bridge']);
    await ds.query('INSERT INTO readings (run_id, seq, t_s, dial, frequency_hz, aux, source) VALUES ?', [values]);
  }
}

/** A second run on the first run's job and range. */
async function sibling(ds: DataSource, of: { jobId: number; rangeId: number }, kind: string): Promise<number> {
  const [creator] = await ds.query("SELECT id FROM users WHERE role = 'engineer' LIMIT 1");
  const result = await ds.query("INSERT INTO runs (job_id, range_id, kind, status, started_at, created_by) VALUES (?, ?, ?, 'closed', UTC_TIMESTAMP(3), ?)", [
    of.jobId,
    of.rangeId,
    kind,
    creator.id,
  ]);
  return Number(result.insertId);
}

/** The Welch interval assembled here from the two estimates: se, Welch–Satterthwaite ν, jstat's t quantile. */
function expectWelch(row: ComparisonRow, i: number): void {
  const a = row.values[0]!;
  const b = row.values[i]!;
  const diff = row.differences[i]!;
  const va = a.se ** 2;
  const vb = b.se ** 2;
  const df = (va + vb) ** 2 / (va ** 2 / a.df + vb ** 2 / b.df);
  const t = jstat.studentt.inv(0.975, df);
  const d = b.value - a.value;
  const tolerance = (x: number) => 1e-9 * Math.max(1, Math.abs(x));
  expect(Math.abs(diff.difference - d)).toBeLessThan(tolerance(d));
  expect(Math.abs(diff.df - df)).toBeLessThan(1e-9 * df);
  expect(Math.abs(diff.low - (d - t * Math.sqrt(va + vb)))).toBeLessThan(tolerance(diff.low));
  expect(Math.abs(diff.high - (d + t * Math.sqrt(va + vb)))).toBeLessThan(tolerance(diff.high));
  expect(diff.confidence).toBe(0.95);
}

describe('comparisons (e2e, MariaDB)', () => {
  let t: TestApp;
  let before: { runId: number; jobId: number; rangeId: number; instrumentId: number };
  let afterId: number;
  const tokens: Partial<Record<keyof typeof DEMO, string>> = {};
  const auth = (who: keyof typeof DEMO) => ({ Authorization: `Bearer ${tokens[who]}` });
  const labels = ['before: original regulator', 'after: gas regulator valve'];

  beforeAll(async () => {
    t = await createTestApp();
    const org = await organizationId(t.dataSource, DEMO_CUSTOMERS.saltmarsh);
    const run = await createRun(t.dataSource, { organizationId: org, benchId: null, kind: 'warmup', status: 'closed' });
    const [job] = await t.dataSource.query('SELECT instrument_id FROM jobs WHERE id = ?', [run.jobId]);
    before = { ...run, instrumentId: Number(job.instrument_id) };
    afterId = await sibling(t.dataSource, run, 'warmup');
    await insertReadings(t.dataSource, before.runId, warmup(7_453_820, 2_350, 840, 21));
    await insertReadings(t.dataSource, afterId, warmup(7_453_905, 900, 520, 22));
    for (const who of ['engineer', 'lead', 'tech', 'admin', 'saltmarsh'] as const) tokens[who] = await tokenFor(t.http, DEMO[who]);
  });
  afterAll(async () => {
    await t.close();
  });

  it('compares two warm-ups: fits, curves aligned at power-on, and every difference a Welch interval that jstat reproduces', async () => {
    const res = await t.http
      .post('/api/comparisons/compute')
      .set(auth('engineer'))
      .send({ runIds: [before.runId, afterId], labels });
    expect(res.status).toBe(200);
    const result = res.body as ComparisonResult;
    expect(result).toMatchObject({ instrumentId: before.instrumentId, kind: 'warmup', confidence: 0.95, options: { withinHz: 5, windowSeconds: 600 } });
    const [first, second] = result.runs;
    expect(first!.label).toBe(labels[0]);
    expect(Math.abs(first!.fit!.tau - 840)).toBeLessThan(4 * first!.fit!.seTau);
    expect(Math.abs(second!.fit!.tau - 520)).toBeLessThan(4 * second!.fit!.seTau);
    expect(first!.points.t).toHaveLength(720);
    expect(first!.points.t[0]).toBe(0);
    expect(first!.points.deviation[0]).toBeCloseTo(first!.points.frequency[0]! - first!.fit!.fInf, 6);
    expect(first!.fitted!.t).toHaveLength(200);
    expect(first!.fitted!.t[0]).toBe(0);
    expect(first!.fitted!.deviation[0]).toBeCloseTo(first!.fit!.amplitude, 6);
    expect(first!.stability!.tau0).toBe(10);

    expect(result.rows.map((r) => r.quantity)).toEqual(['tau', 'amplitude', 'fInf', 'settledDriftRate', 'settlingTime', 'adev1s', 'adev10s', 'adev100s']);
    const row = (q: string) => result.rows.find((r) => r.quantity === q)!;
    for (const q of ['tau', 'amplitude', 'fInf', 'settledDriftRate', 'settlingTime', 'adev10s', 'adev100s']) {
      expect(row(q).differences[0]).toBeNull();
      expectWelch(row(q), 1);
    }
    // Sampled every 10 s: no Allan deviation at 1 s, and the reason says so.
    expect(row('adev1s').values).toEqual([null, null]);
    expect(row('adev1s').problems[0]).toContain('do not give τ = 1 s');

    // The settled drift rate is the mean of the settled windows, its se s/√k (checked with jstat).
    const rates = first!.driftWindows.map((w) => w.rateHzPerMin);
    expect(first!.driftWindows.every((w) => w.tStart >= first!.settledFromSeconds!)).toBe(true);
    expect(row('settledDriftRate').values[0]!.value).toBeCloseTo(jstat.mean(rates), 10);
    expect(row('settledDriftRate').values[0]!.se).toBeCloseTo(jstat.stdev(rates, true) / Math.sqrt(rates.length), 10);
    expect(row('settledDriftRate').values[0]!.df).toBe(rates.length - 1);
    // Fit-based quantities carry ν = n − 3.
    expect(row('tau').values[0]!.df).toBe(717);

    expect(row('tau').differences[1]!.sentence).toMatch(
      /^after: gas regulator valve: time constant τ lower by [\d.]+ s \(95 % interval [\d.]+ to [\d.]+ s lower\)$/,
    );
    expect(row('settlingTime').name).toBe('settling time (within 5 Hz)');
    expect(row('settledDriftRate').differences[1]!.sentence).toMatch(
      /^after: gas regulator valve: settled drift rate (lower|higher) by [\d.]+ Hz\/min \(95 % interval [\d.]+( Hz\/min (lower|higher))? to [\d.]+ Hz\/min (lower|higher)/,
    );
    expect(row('adev10s').differences[1]!.sentence).toMatch(/Allan deviation at 10 s (lower|higher|unchanged).* × 10⁻\S+/);
  });

  it("the demo has the Saltmarsh receiver's before/after warm-ups saved as a comparison, which computes in full", async () => {
    const list = await t.http.get('/api/comparisons').query({ q: 'gas regulator valve' }).set(auth('engineer'));
    expect(list.body.total).toBe(1);
    const demo = list.body.items[0] as SavedComparison;
    expect(demo).toMatchObject({
      kind: 'warmup',
      instrumentLabel: 'Marlow & Reade CR-7 communications receiver s/n CR7-5520',
      labels: ['before: original unregulated HT', 'after: gas regulator valve on the oscillator HT'],
    });
    const res = await t.http.get(`/api/comparisons/${demo.id}/result`).set(auth('engineer'));
    expect(res.status).toBe(200);
    const result = res.body as ComparisonResult;
    expect(result.runs.map((r) => r.fitProblem)).toEqual([null, null]);
    const sentences = result.rows.map((r) => r.differences[1]?.sentence ?? r.problems[1]);
    expect(sentences.filter((s) => s?.startsWith('after: gas regulator valve on the oscillator HT: ')).length).toBeGreaterThanOrEqual(6);
    expect(result.rows.find((r) => r.quantity === 'settledDriftRate')!.differences[1]).not.toBeNull();
  });

  it('refuses runs that cannot be compared', async () => {
    const post = (body: object) => t.http.post('/api/comparisons/compute').set(auth('engineer')).send(body);
    expect((await post({ runIds: [before.runId] })).status).toBe(400);
    expect((await post({ runIds: [before.runId, before.runId] })).status).toBe(400);
    expect((await post({ runIds: [before.runId, 999_999] })).status).toBe(404);
    expect((await post({ runIds: [before.runId, afterId], labels: ['only one'] })).body.message).toContain('one label per run');
    const stability = await sibling(t.dataSource, before, 'stability');
    expect((await post({ runIds: [before.runId, stability] })).body.message).toContain('not both');
    const other = await createRun(t.dataSource, {
      organizationId: await organizationId(t.dataSource, DEMO_CUSTOMERS.northgate),
      benchId: null,
      kind: 'warmup',
    });
    expect((await post({ runIds: [before.runId, other.runId] })).body.message).toContain('one instrument');
    const calibration = await sibling(t.dataSource, before, 'as_found');
    expect((await post({ runIds: [before.runId, calibration] })).body.message).toContain('only warmup and stability runs');
  });

  it('compares stability runs with Allan deviations at 1, 10 and 100 s, and their Welch intervals', async () => {
    const first = await sibling(t.dataSource, before, 'stability');
    const second = await sibling(t.dataSource, before, 'stability');
    const quiet = gaussian(5);
    const noisy = gaussian(6);
    const firstReadings = Array.from({ length: 1200 }, (_, i) => ({ t: i, f: 5e6 + 0.01 * quiet() }));
    await insertReadings(t.dataSource, first, firstReadings);
    await insertReadings(
      t.dataSource,
      second,
      Array.from({ length: 1200 }, (_, i) => ({ t: i, f: 5e6 + 0.03 * noisy() })),
    );
    const res = await t.http
      .post('/api/comparisons/compute')
      .set(auth('lead'))
      .send({ runIds: [first, second] });
    expect(res.status).toBe(200);
    const result = res.body as ComparisonResult;
    expect(result.rows.map((r) => r.quantity)).toEqual(['settledDriftRate', 'adev1s', 'adev10s', 'adev100s']);
    expect(result.rows[0]!.name).toBe('drift rate');
    // The drift rate and its interval are one estimator, the least-squares line on frequency: slope Stf/Stt (×60 for Hz/min),
    // se = s/√Stt with s² = SSR/(n − 2), ν = n − 2, Student t from jstat (the closed form of simple linear regression).
    const n = firstReadings.length;
    const tMean = firstReadings.reduce((a, r) => a + r.t, 0) / n;
    const fMean = firstReadings.reduce((a, r) => a + r.f, 0) / n;
    const stt = firstReadings.reduce((a, r) => a + (r.t - tMean) ** 2, 0);
    const slope = firstReadings.reduce((a, r) => a + (r.t - tMean) * (r.f - fMean), 0) / stt;
    const ssr = firstReadings.reduce((a, r) => a + (r.f - fMean - slope * (r.t - tMean)) ** 2, 0);
    const se = Math.sqrt(ssr / (n - 2) / stt);
    const drift = result.rows[0]!.values[0]!;
    expect(drift.df).toBe(n - 2);
    expect(Math.abs(drift.value - 60 * slope)).toBeLessThan(1e-6 * 60 * se);
    expect(Math.abs(drift.se - 60 * se)).toBeLessThan(1e-6 * 60 * se);
    const t975 = jstat.studentt.inv(0.975, n - 2);
    expect(Math.abs(drift.high - (drift.value + t975 * drift.se))).toBeLessThan(1e-6 * 60 * se);
    expect(result.rows[0]!.method).toContain('least-squares line on frequency');
    for (const row of result.rows) expectWelch(row, 1);
    const adev1 = result.rows[1]!;
    // White frequency noise of 0.01 Hz at 5 MHz: σ_y(1 s) = 2e-9; three times that in the second run.
    expect(adev1.values[0]!.value).toBeGreaterThan(1.7e-9);
    expect(adev1.values[0]!.value).toBeLessThan(2.3e-9);
    expect(adev1.values[0]!.low).toBeLessThan(adev1.values[0]!.value);
    expect(adev1.differences[1]!.sentence).toMatch(
      /^run \d+: Allan deviation at 1 s higher by [\d.]+ × 10⁻⁹ \(95 % interval [\d.]+ to [\d.]+ × 10⁻⁹ higher\)$/,
    );
    expect(result.runs[0]!.fitProblem).toContain('not fitted');
    expect(result.runs[0]!.stability!.adev[0]!.tau).toBe(1);
  });

  it('takes the Allan deviation of a stability run with a gap over its longest continuous segment, never across the gap', async () => {
    const first = await sibling(t.dataSource, before, 'stability');
    const second = await sibling(t.dataSource, before, 'stability');
    const quiet = gaussian(15);
    // 400 readings, 100 s missing, then 800 readings 0.5 Hz higher (a step of 1e-7 across the gap), white FM of 0.01 Hz at 5 MHz.
    const rows = [
      ...Array.from({ length: 400 }, (_, i) => ({ t: i, f: 5e6 + 0.01 * quiet() })),
      ...Array.from({ length: 800 }, (_, i) => ({ t: 500 + i, f: 5e6 + 0.5 + 0.01 * quiet() })),
    ];
    await insertReadings(t.dataSource, first, rows);
    await insertReadings(
      t.dataSource,
      second,
      Array.from({ length: 1200 }, (_, i) => ({ t: i, f: 5e6 + 0.01 * quiet() })),
    );
    const res = await t.http
      .post('/api/comparisons/compute')
      .set(auth('lead'))
      .send({ runIds: [first, second] });
    expect(res.status).toBe(200);
    const stability = (res.body as ComparisonResult).runs[0]!.stability!;
    expect(stability).toMatchObject({ gapCount: 1, count: 800, leftOut: 400, fromSeconds: 500, toSeconds: 1299 });
    // White FM: σ_y(τ) = σ_y(1 s)/√τ, 2e-9 at 1 s → 2e-10 at 100 s (closed form). Across the gap the 1e-7 step would put
    // σ_y(100 s) near 1e-8; over the segment it stays within a factor of two of 2e-10 (edf well above 10 there).
    const at100 = stability.adev.find((p) => p.tau === 128)!;
    expect(at100.deviation).toBeLessThan((2 * 2e-10) / Math.sqrt(1.28));
  });

  it('shows supply sensitivity and keying shift of the same instrument', async () => {
    const supply = await sibling(t.dataSource, before, 'supply_sensitivity');
    const noise = gaussian(9);
    await insertReadings(
      t.dataSource,
      supply,
      [200, 210, 220, 230, 240, 250].flatMap((v, k) => [0, 1, 2].map((j) => ({ t: k * 30 + j, f: 7_000_000 - 1.5 * (v - 220) + 0.2 * noise(), aux: v }))),
    );
    const keying = await sibling(t.dataSource, before, 'keying');
    await insertReadings(
      t.dataSource,
      keying,
      Array.from({ length: 40 }, (_, i) => ({ t: i, f: 7_000_000 + (i % 2 === 1 ? -42 : 0) + 0.5 * noise(), aux: i % 2 })),
    );
    const res = await t.http.get(`/api/instruments/${before.instrumentId}/sensitivity`).set(auth('tech'));
    expect(res.status).toBe(200);
    const block = res.body as InstrumentSensitivity;
    expect(block.supplySensitivity).toHaveLength(1);
    expect(block.supplySensitivity[0]).toMatchObject({ runId: supply, n: 18, problem: null });
    expect(Math.abs(block.supplySensitivity[0]!.hzPerVolt! + 1.5)).toBeLessThan(4 * block.supplySensitivity[0]!.seHzPerVolt!);
    expect(block.keying[0]!.shift!.shiftHz).toBeCloseTo(-42, 0);
    const compared = await t.http
      .post('/api/comparisons/compute')
      .set(auth('engineer'))
      .send({ runIds: [before.runId, afterId] });
    expect((compared.body as ComparisonResult).sensitivity.keying[0]!.runId).toBe(keying);
    expect((await t.http.get(`/api/instruments/${before.instrumentId}/sensitivity`).set(auth('saltmarsh'))).status).toBe(403);
  });

  it('saves, lists, reopens, exports, changes and deletes a comparison; engineers and leads write, clients see nothing', async () => {
    const created = await t.http
      .post('/api/comparisons')
      .set(auth('engineer'))
      .send({ title: 'CR-7 LO warm-up: regulator change', notes: 'Cold starts after 12 h off.', runIds: [before.runId, afterId], labels, windowSeconds: 300 });
    expect(created.status).toBe(201);
    const saved = created.body as SavedComparison;
    expect(saved).toMatchObject({
      instrumentId: before.instrumentId,
      kind: 'warmup',
      runIds: [before.runId, afterId],
      labels,
      windowSeconds: 300,
      withinHz: null,
      createdByName: 'Ellis Okafor',
    });
    expect(
      (
        await t.http
          .post('/api/comparisons')
          .set(auth('tech'))
          .send({ title: 'x', runIds: [before.runId, afterId] })
      ).status,
    ).toBe(403);
    expect(
      (
        await t.http
          .post('/api/comparisons')
          .set(auth('admin'))
          .send({ title: 'x', runIds: [before.runId, afterId] })
      ).status,
    ).toBe(403);
    for (const path of ['/api/comparisons', `/api/comparisons/${saved.id}`, `/api/comparisons/${saved.id}/result`, `/api/comparisons/${saved.id}/export.csv`]) {
      expect((await t.http.get(path).set(auth('saltmarsh'))).status).toBe(403);
    }
    expect(
      (
        await t.http
          .post('/api/comparisons/compute')
          .set(auth('saltmarsh'))
          .send({ runIds: [before.runId, afterId] })
      ).status,
    ).toBe(403);

    const list = await t.http.get('/api/comparisons').query({ instrumentId: before.instrumentId, q: 'regulator' }).set(auth('tech'));
    expect(list.body).toEqual({ items: [saved], total: 1 });
    const reopened = await t.http.get(`/api/comparisons/${saved.id}/result`).set(auth('tech'));
    expect(reopened.status).toBe(200);
    expect((reopened.body as ComparisonResult).options.windowSeconds).toBe(300);
    expect((reopened.body as ComparisonResult).runs.map((r) => r.label)).toEqual(labels);

    const csv = await t.http.get(`/api/comparisons/${saved.id}/export.csv`).set(auth('engineer'));
    expect(csv.status).toBe(200);
    expect(csv.headers['content-disposition']).toContain(`comparison-${saved.id}-cr-7-lo-warm-up-regulator-change.csv`);
    const lines = Papa.parse<string[]>(csv.text.trim()).data;
    expect(lines[0]!.slice(0, 5)).toEqual(['quantity', 'unit', 'run_id', 'label', 'value']);
    const tauAfter = lines.find((l) => l[0] === 'time constant τ' && l[2] === String(afterId))!;
    expect(tauAfter[13]).toMatch(/^after: gas regulator valve: time constant τ lower by/);
    expect(lines.filter((l) => l[0] === 'keying shift (key down − key up)')).toHaveLength(1);

    const patched = await t.http
      .patch(`/api/comparisons/${saved.id}`)
      .set(auth('lead'))
      .send({ title: 'Regulator change', labels: ['before', 'after'], windowSeconds: null });
    expect(patched.status).toBe(200);
    expect(patched.body).toMatchObject({ title: 'Regulator change', labels: ['before', 'after'], windowSeconds: null });
    expect((await t.http.patch(`/api/comparisons/${saved.id}`).set(auth('tech')).send({ title: 'x' })).status).toBe(403);
    expect(
      (
        await t.http
          .patch(`/api/comparisons/${saved.id}`)
          .set(auth('lead'))
          .send({ runIds: [before.runId] })
      ).status,
    ).toBe(400);

    expect((await t.http.delete(`/api/comparisons/${saved.id}`).set(auth('engineer'))).status).toBe(204);
    expect((await t.http.get(`/api/comparisons/${saved.id}`).set(auth('engineer'))).status).toBe(404);
    const audit = await t.dataSource.query("SELECT action FROM audit_events WHERE entity = 'comparison' AND entity_id = ? ORDER BY id", [String(saved.id)]);
    expect(audit.map((a: { action: string }) => a.action)).toEqual(['create', 'update', 'delete']);
  });
});
