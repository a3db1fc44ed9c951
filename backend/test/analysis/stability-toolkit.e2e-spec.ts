import { instrumentWithJob, khzRange, openRun, organizationIds, postReadings } from '../support/lab-fixtures.js';
import { expectPrinted, sp1065Suite, table31 } from '../support/sp1065.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

// The stability toolkit through the API. Expected values: NIST SP 1065 (Riley 2008) Table 31 as recorded in
// fixtures/stability, and closed forms derived beside each check; none is computed by the code under test.

const relClose = (actual: number, expected: number, tolerance: number) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tolerance * Math.abs(expected));

type Row = { m: number; tau: number; noise: { status: string }; edfNoise: string } & Record<
  'adev' | 'mdev' | 'hdev' | 'tdev' | 'totdev',
  { deviation: number; terms: number; edf: number; ciLow: number; ciHigh: number } | null
>;

describe('stability toolkit (e2e, MariaDB)', () => {
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
  const freshRun = async () => {
    const { jobId, rangeIds } = await instrumentWithJob(t, as('tech'), {
      organizationId: orgs['Northgate Radio Club']!,
      ranges: [khzRange('Wide 1–25 MHz', 1000, 25000)],
    });
    return openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind: 'stability' });
  };
  const analysis = (runId: number, query = '') => t.http.get(`/api/runs/${runId}/analysis${query}`).set(as('engineer'));
  const F0 = 10e6;

  it('imports the SP 1065 1000-point suite and gives its published ADEV, HDEV, TDEV and TOTDEV at τ = 1, 10, 100 s', async () => {
    const runId = await freshRun();
    // The suite's fractional frequencies y put onto a 10 MHz nominal: f = f0·(1 + y), so y = (f − f0)/f0 with referenceHz = f0.
    const csv = ['Time (s),Frequency (Hz)', ...sp1065Suite().map((y, i) => `${i},${F0 * (1 + y)}`)].join('\n');
    const imported = await t.http
      .post(`/api/runs/${runId}/imports`)
      .set(as('tech'))
      .attach('file', Buffer.from(csv), { filename: 'sp1065-suite.csv', contentType: 'text/csv' });
    expect(imported.status).toBe(201);
    expect(imported.body.imported).toBe(1000);
    const res = await analysis(runId, `?referenceHz=${F0}&m=${table31.averaging_factors.join(',')}`);
    expect(res.status).toBe(200);
    const rows = res.body.toolkit.deviations as Row[];
    expect(rows.map((r) => r.tau)).toEqual([1, 10, 100]);
    const published = { adev: 'adev_overlapping', mdev: 'mdev', hdev: 'hdev_overlapping', tdev: 'tdev', totdev: 'totdev' } as const;
    for (const [deviation, key] of Object.entries(published) as Array<[keyof typeof published, string]>) {
      rows.forEach((row, i) => expectPrinted(row[deviation]!.deviation, table31.results[key]![i]!, `${deviation} at τ = ${row.tau} s`));
    }
    // Terms: N − 2m for the overlapping ADEV and N − 3m for the overlapping Hadamard, N = 1001 phase points.
    expect(rows.map((r) => r.adev!.terms)).toEqual([999, 981, 801]);
    expect(rows.map((r) => r.hdev!.terms)).toEqual([998, 971, 701]);
    expect(res.body.toolkit).toMatchObject({ dataKind: 'frequency', confidence: 0.95, factors: { spacing: 'list', list: [1, 10, 100] } });
    expect(res.body.toolkit.segment).toMatchObject({ choice: 'longest', count: 1000, leftOut: 0, gapCount: 0, fromSeconds: 0, toSeconds: 999 });
    expect(res.body.toolkit.drift).toMatchObject({ method: 'linear_frequency', removed: false, spansGap: false, points: 1000 });
    for (const row of rows) expect(row.adev!.ciLow).toBeLessThan(row.adev!.deviation);
    // The earlier fields carry the same numbers.
    expectPrinted(res.body.adev[1].deviation, table31.results.adev_overlapping![1]!, 'adev field at 10 s');

    const decades = await analysis(runId, `?referenceHz=${F0}&factors=decades`);
    expect(decades.body.toolkit.deviations.map((r: Row) => r.m)).toEqual([1, 2, 5, 10, 20, 50, 100, 200, 500]);
    const octaves = await analysis(runId, `?referenceHz=${F0}`);
    expect(octaves.body.toolkit.factors.spacing).toBe('octaves');
    expect(octaves.body.toolkit.deviations.map((r: Row) => r.m)).toEqual([1, 2, 4, 8, 16, 32, 64, 128, 256]);
  });

  it('refuses averaging factors that are not positive whole numbers (400) or too long for the run (422, naming the τ)', async () => {
    const runId = await freshRun();
    await postReadings(
      t,
      as('engineer'),
      runId,
      Array.from({ length: 100 }, (_, i) => ({ t: 2 * i, frequency: F0 + (i % 2 === 0 ? 1 : -1) })),
    );
    for (const bad of ['0', '1,0', '-1', '1.5', 'abc', '1,,2', '']) {
      const res = await analysis(runId, `?m=${encodeURIComponent(bad)}`);
      expect(res.status).toBe(400);
      expect(JSON.stringify(res.body.message)).toContain('positive whole numbers');
    }
    // 100 readings every 2 s allow m up to 50 (τ = 100 s).
    const tooLong = await analysis(runId, '?m=1,10,51');
    expect(tooLong.status).toBe(422);
    expect(tooLong.body.message).toContain('τ = 102 s (m = 51) is too long');
    expect(tooLong.body.message).toContain('τ = 100 s (m = 50)');
    expect((await analysis(runId, '?m=1,50')).status).toBe(200);
    expect((await analysis(runId, '?factors=weekly')).status).toBe(400);
  });

  it('with a known linear drift: removing it leaves the Hadamard deviation as it was and drops the Allan deviation', async () => {
    // y_i = a·(−1)^i + D·i at τ0 = 1 s. Closed forms: the second difference of y kills the line and is ±4a for the
    // alternation, so HDEV(1 s) = 4a/√6 with or without the drift; any two consecutive readings average the
    // alternation away, so ADEV(2 s) = D·τ/√2 = √2·D from the drift alone. The least-squares slope is
    // D + a·Σ(i − ī)(−1)^i / Stt = D − 500a/Stt, Stt = M(M² − 1)/12 for M = 1000.
    const a = 1e-7;
    const D = 1e-9;
    const M = 1000;
    const runId = await freshRun();
    await postReadings(
      t,
      as('engineer'),
      runId,
      Array.from({ length: M }, (_, i) => ({ t: i, frequency: F0 * (1 + (i % 2 === 0 ? a : -a) + D * i) })),
    );
    const kept = await analysis(runId, `?referenceHz=${F0}&m=1,2`);
    const removed = await analysis(runId, `?referenceHz=${F0}&m=1,2&drift=removed`);
    expect(kept.status).toBe(200);
    expect(removed.status).toBe(200);
    const stt = (M * (M * M - 1)) / 12;
    relClose(kept.body.toolkit.drift.perSecond, D - (500 * a) / stt, 1e-6);
    expect(kept.body.toolkit.drift.standardError).toBeGreaterThan(0);
    expect(kept.body.toolkit.drift.removed).toBe(false);
    expect(removed.body.toolkit.drift.removed).toBe(true);
    const [keptRows, removedRows] = [kept.body.toolkit.deviations as Row[], removed.body.toolkit.deviations as Row[]];
    relClose(keptRows[0]!.hdev!.deviation, (4 * a) / Math.sqrt(6), 1e-6);
    relClose(removedRows[0]!.hdev!.deviation, (4 * a) / Math.sqrt(6), 1e-6);
    relClose(keptRows[1]!.adev!.deviation, Math.SQRT2 * D, 1e-6);
    expect(removedRows[1]!.adev!.deviation).toBeLessThan(1e-3 * Math.SQRT2 * D);
  });

  it('analyses the longest continuous segment of a run with a gap and says so; as if continuous on request, the drift flagged', async () => {
    // t = 0 … 299, then a gap, then 310 … 999: 300 and 690 readings. Alternating ±1 Hz on 10 MHz: ADEV(τ0) = √2·a, a = 1e-7.
    const runId = await freshRun();
    const times = [...Array.from({ length: 300 }, (_, i) => i), ...Array.from({ length: 690 }, (_, i) => 310 + i)];
    await postReadings(
      t,
      as('engineer'),
      runId,
      times.map((time, i) => ({ t: time, frequency: F0 + (i % 2 === 0 ? 1 : -1) })),
    );
    const res = await analysis(runId, `?referenceHz=${F0}`);
    expect(res.status).toBe(200);
    expect(res.body.usedCount).toBe(690);
    expect(res.body.toolkit.segment).toMatchObject({ choice: 'longest', count: 690, leftOut: 300, fromSeconds: 310, toSeconds: 999, gapCount: 1 });
    expect(res.body.toolkit.segment.statement).toContain('the longest continuous segment: 690 of 990');
    expect(res.body.toolkit.drift).toMatchObject({ points: 690, fromSeconds: 310, spansGap: false });
    // m = 1 over 690 readings: 691 phase points, 691 − 2 terms.
    expect(res.body.toolkit.deviations[0].adev.terms).toBe(689);
    relClose(res.body.toolkit.deviations[0].adev.deviation, Math.SQRT2 * 1e-7, 1e-6);
    const across = await analysis(runId, `?referenceHz=${F0}&gaps=continuous`);
    expect(across.status).toBe(200);
    expect(across.body.toolkit.segment).toMatchObject({ choice: 'continuous', count: 990, leftOut: 0, gapCount: 1 });
    expect(across.body.toolkit.drift.spansGap).toBe(true);
    expect(across.body.toolkit.segment.statement).toContain('as if continuous');
  });

  it('lists the readings the MAD screen flags, excluded only when the engineer excludes them with a reason', async () => {
    // 50 readings at +1 Hz, 50 at −1 Hz and one at +50 Hz: median +1 Hz, MAD 2 Hz, so 5 × 1.4826 × 2 Hz = 14.8 Hz; only the 50 Hz one is beyond.
    const runId = await freshRun();
    await postReadings(
      t,
      as('engineer'),
      runId,
      Array.from({ length: 101 }, (_, i) => ({ t: i, frequency: F0 + (i === 50 ? 50 : i % 2 === 0 ? 1 : -1) })),
    );
    const res = await analysis(runId, `?referenceHz=${F0}`);
    expect(res.status).toBe(200);
    expect(res.body.toolkit.outliers).toMatchObject({ k: 5, screened: 101, flaggedCount: 1 });
    const [flagged] = res.body.toolkit.outliers.flagged;
    expect(flagged).toMatchObject({ seq: 51, t: 50, frequency: F0 + 50 });
    expect(res.body.excludedCount).toBe(0);
    const excluded = await t.http
      .post(`/api/runs/${runId}/readings/${flagged.readingId}/exclusion`)
      .set(as('engineer'))
      .send({ reason: 'MAD screen: counter miscount' });
    expect(excluded.status).toBe(201);
    expect(excluded.body.seq).toBe(51);
    const after = await analysis(runId, `?referenceHz=${F0}`);
    expect(after.body.excludedCount).toBe(1);
    expect(after.body.toolkit.outliers.flaggedCount).toBe(0);
  });
});
