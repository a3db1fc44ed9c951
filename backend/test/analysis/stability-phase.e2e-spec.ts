import { instrumentWithJob, khzRange, openRun, organizationIds, postReadings } from '../support/lab-fixtures.js';
import { expectPrinted, sp1065Suite, table31 } from '../support/sp1065.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

// Phase (time-interval) stability runs through the API. Expected values: NIST SP 1065 (Riley 2008) Table 31 as
// recorded in fixtures/stability, reached from phase data made by SP 1065's own definition x(i+1) = x(i) + y(i)·τ0
// (written out below, not taken from the code under test), and closed forms for a quadratic phase.

type Value = { deviation: number; terms: number; edf: number } | null;
type Row = { m: number; tau: number } & Record<'adev' | 'mdev' | 'hdev' | 'tdev' | 'totdev', Value>;

describe('phase (time-interval) stability runs (e2e, MariaDB)', () => {
  let t: TestApp;
  let orgs: Record<string, number>;
  let as: AsDemo;
  beforeAll(async () => {
    t = await createTestApp();
    as = await signInDemo(t.http);
    orgs = await organizationIds(t, as('admin'));
  });
  afterAll(async () => {
    await t.close();
  });
  const job = () => instrumentWithJob(t, as('tech'), { organizationId: orgs['Northgate Radio Club']!, ranges: [khzRange('Wide 1–25 MHz', 1000, 25000)] });
  const phaseRun = async () => {
    const { jobId, rangeIds } = await job();
    return openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind: 'stability', dataKind: 'phase' });
  };
  const analysis = (runId: number, query = '') => t.http.get(`/api/runs/${runId}/analysis${query}`).set(as('engineer'));

  it('opens a stability run for phase data, names its kind, and refuses phase data in any other kind of run', async () => {
    const runId = await phaseRun();
    const run = await t.http.get(`/api/runs/${runId}`).set(as('tech'));
    expect(run.body.dataKind).toBe('phase');
    const { jobId, rangeIds } = await job();
    const warmup = await t.http.post(`/api/jobs/${jobId}/runs`).set(as('tech')).send({ rangeId: rangeIds[0], kind: 'warmup', dataKind: 'phase' });
    expect(warmup.status).toBe(400);
    expect(warmup.body.message).toBe('dataKind: phase (time-interval) readings are kept in stability runs only, not in a warmup run');
    const odd = await t.http.post(`/api/jobs/${jobId}/runs`).set(as('tech')).send({ rangeId: rangeIds[0], kind: 'stability', dataKind: 'voltage' });
    expect(odd.status).toBe(400);
    expect(JSON.stringify(odd.body.message)).toContain('dataKind must be one of: frequency, phase');
  });

  it('refuses a mixed run: a frequency reading in a phase run, a time interval in a frequency run, both in one reading; nothing stored', async () => {
    const runId = await phaseRun();
    const frequency = await t.http
      .post(`/api/runs/${runId}/readings`)
      .set(as('tech'))
      .send({ readings: [{ t: 0, frequency: 7e6 }] });
    expect(frequency.status).toBe(400);
    expect(frequency.body.message).toEqual([
      `readings[0].frequency: run ${runId} holds phase readings (time interval, s): a frequency reading would make it a mixed run; send timeInterval`,
    ]);
    const both = await t.http
      .post(`/api/runs/${runId}/readings`)
      .set(as('tech'))
      .send({ readings: [{ t: 0, timeInterval: 0, frequency: 7e6 }] });
    expect(both.status).toBe(400);
    expect(both.body.message[0]).toContain('either frequency or timeInterval, not both');
    const { jobId, rangeIds } = await job();
    const freqRun = await openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind: 'stability' });
    const interval = await t.http
      .post(`/api/runs/${freqRun}/readings`)
      .set(as('tech'))
      .send({ readings: [{ t: 0, timeInterval: '12 ns' }] });
    expect(interval.status).toBe(400);
    expect(interval.body.message[0]).toContain(`run ${freqRun} holds frequency readings (Hz): a time-interval reading would make it a mixed run`);
    const stored = await t.dataSource.query('SELECT COUNT(*) AS n FROM readings WHERE run_id IN (?, ?)', [runId, freqRun]);
    expect(Number(stored[0].n)).toBe(0);
    // Typed with a unit, a time interval is stored in seconds.
    const typed = await t.http
      .post(`/api/runs/${runId}/readings`)
      .set(as('tech'))
      .send({ readings: [{ t: 0, timeInterval: '12.5 ns' }] });
    expect(typed.status).toBe(201);
    const [row] = await t.dataSource.query('SELECT frequency_hz AS value FROM readings WHERE run_id = ?', [runId]);
    expect(Number(row.value)).toBe(1.25e-8);
    // The readings export names the value column for what it holds.
    const csv = await t.http.get(`/api/runs/${runId}/readings.csv`).set(as('tech'));
    expect(csv.status).toBe(200);
    expect(csv.text.split(/\r?\n/)[0]).toBe('seq,t_s,dial,time_interval_s,aux,source,received_at,excluded,excluded_reason');
    expect(csv.text.split(/\r?\n/)[1]).toMatch(/^1,0,,1\.25e-8,/);
  });

  it('imports the SP 1065 suite as phase (time interval, ns) and gives its published ADEV, HDEV, TDEV and TOTDEV, saying it was computed from phase', async () => {
    const runId = await phaseRun();
    // x(0) = 0, x(i+1) = x(i) + y(i)·τ0 with τ0 = 1 s: 1001 phase points; written in ns, as a counter shows them.
    const y = sp1065Suite();
    const x = [0];
    for (const value of y) x.push(x[x.length - 1]! + value);
    const csv = ['Time (s),Time interval (ns)', ...x.map((value, i) => `${i},${(value * 1e9).toPrecision(17)}`)].join('\n');
    const imported = await t.http
      .post(`/api/runs/${runId}/imports`)
      .set(as('tech'))
      .attach('file', Buffer.from(csv), { filename: 'sp1065-phase.csv', contentType: 'text/csv' });
    expect(imported.status).toBe(201);
    expect(imported.body.imported).toBe(1001);
    const res = await analysis(runId, `?m=${table31.averaging_factors.join(',')}`);
    expect(res.status).toBe(200);
    expect(res.body.referenceHz).toBeNull();
    expect(res.body.toolkit.dataKind).toBe('phase');
    expect(res.body.toolkit.conversion).toMatch(
      /^computed from phase data: each reading a time interval x \(s\); fractional frequency y_i = \(x_\{i\+1\} − x_i\)\/τ0/,
    );
    const rows = res.body.toolkit.deviations as Row[];
    expect(rows.map((r) => r.tau)).toEqual([1, 10, 100]);
    const published = { adev: 'adev_overlapping', mdev: 'mdev', hdev: 'hdev_overlapping', tdev: 'tdev', totdev: 'totdev' } as const;
    for (const [deviation, key] of Object.entries(published) as Array<[keyof typeof published, string]>) {
      const printed = table31.results[key];
      if (!printed) continue;
      rows.forEach((row, i) => expectPrinted(row[deviation]!.deviation, printed[i]!, `${deviation} at τ = ${row.tau} s from phase`));
    }
  });

  it('gives the drift of a quadratic phase x = D·t²/2 exactly by all three estimators (closed form: the drift is D)', async () => {
    const runId = await phaseRun();
    const D = 2e-9; // per second
    await postReadings(
      t,
      as('tech'),
      runId,
      Array.from({ length: 201 }, (_, i) => ({ seq: i + 1, t: i, timeInterval: 0.5 * D * i * i })),
    );
    const res = await analysis(runId);
    expect(res.status).toBe(200);
    const drift = res.body.toolkit.drift;
    expect(Math.abs(drift.perSecond - D)).toBeLessThan(1e-6 * D);
    expect(Math.abs(drift.phaseEstimates.threePoint.perSecond - D)).toBeLessThan(1e-6 * D);
    expect(Math.abs(drift.phaseEstimates.bisection.perSecond - D)).toBeLessThan(1e-6 * D);
  });

  it('with a gap: the longest segment by default, fill on request with the points filled counted, and refuses to run across it or to fill frequency data', async () => {
    const runId = await phaseRun();
    // White phase at 1 s, readings 50–59 missing: 100 written, one gap of 10.
    const readings = [];
    let seed = 7;
    for (let i = 0; i < 110; i++) {
      seed = (16807 * seed) % 2147483647;
      if (i >= 50 && i < 60) continue;
      readings.push({ seq: readings.length + 1, t: i, timeInterval: (seed / 2147483647 - 0.5) * 1e-9 });
    }
    await postReadings(t, as('tech'), runId, readings);
    const longest = await analysis(runId);
    expect(longest.status).toBe(200);
    expect(longest.body.toolkit.segment).toMatchObject({ choice: 'longest', count: 50, leftOut: 50, gapCount: 1, filled: 0 });
    const filled = await analysis(runId, '?gaps=fill');
    expect(filled.status).toBe(200);
    expect(filled.body.toolkit.segment).toMatchObject({ choice: 'fill', count: 100, filled: 10, gapCount: 1 });
    expect(filled.body.toolkit.segment.statement).toContain('10 points filled');
    expect(filled.body.toolkit.conversion).toContain('with 10 phase points filled by straight lines across the gaps');
    // 110 phase points (100 read + 10 filled): the overlapping ADEV at m = 1 sums N − 2m = 108 terms (SP 1065, eq. for σ_y from phase).
    expect(filled.body.toolkit.deviations[0].adev.terms).toBe(108);
    expect(filled.body.toolkit.drift.spansGap).toBe(true);
    const reference = await analysis(runId, '?referenceHz=10000000');
    expect(reference.status).toBe(422);
    expect(reference.body.message).toContain('referenceHz: this run holds phase readings');
    const across = await analysis(runId, '?gaps=continuous');
    expect(across.status).toBe(422);
    expect(across.body.message).toContain('this is a phase run with 1 gap, and its phase jumps across each one');
    const { jobId, rangeIds } = await job();
    const freqRun = await openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind: 'stability' });
    await postReadings(
      t,
      as('tech'),
      freqRun,
      [0, 1, 2, 3, 4, 5].map((i) => ({ seq: i + 1, t: i, frequency: 7e6 + i })),
    );
    const fillFrequency = await analysis(freqRun, '?gaps=fill');
    expect(fillFrequency.status).toBe(422);
    expect(fillFrequency.body.message).toContain('gaps are filled in phase data only');
  });

  it("the demo's lab reference has a phase run with the counter's 20 s re-arm gap: longest segment by default, 20 points filled on request", async () => {
    const [run] = await t.dataSource.query("SELECT id FROM runs WHERE kind = 'stability' AND data_kind = 'phase' ORDER BY id LIMIT 1");
    const runId = Number(run.id);
    const longest = await analysis(runId);
    expect(longest.status).toBe(200);
    expect(longest.body.toolkit.dataKind).toBe('phase');
    // Readings 0–1799 before the gap, 1820–3599 after it: 1800 analysed, 1780 left out.
    expect(longest.body.toolkit.segment).toMatchObject({ choice: 'longest', gapCount: 1, count: 1800, leftOut: 1780 });
    // Offset 2.4e-9 summed into phase at 1 s: the least-squares drift is near zero and σ_y(1 s) lies near the white FM of 2e-11
    // plus the counter's 40 ps white PM (√(2e-11² + 3·4e-11²) ≈ 7.2e-11 by the closed forms for the two noises at τ0).
    const adev1 = longest.body.toolkit.deviations[0].adev.deviation;
    expect(adev1).toBeGreaterThan(5e-11);
    expect(adev1).toBeLessThan(1e-10);
    const filled = await analysis(runId, '?gaps=fill');
    expect(filled.status).toBe(200);
    expect(filled.body.toolkit.segment).toMatchObject({ choice: 'fill', count: 3580, filled: 20 });
  });

  it('refuses a phase run in a comparison, naming it', async () => {
    const runId = await phaseRun();
    const { jobId, rangeIds } = await job();
    const other = await openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind: 'stability' });
    const res = await t.http
      .post('/api/comparisons/compute')
      .set(as('engineer'))
      .send({ runIds: [runId, other] });
    expect(res.status).toBe(400);
    expect(res.body.message).toBe(`run ${runId} holds phase readings (time interval, s); a comparison takes runs of frequency readings`);
  });
});
