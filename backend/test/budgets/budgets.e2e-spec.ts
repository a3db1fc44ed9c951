import type { JobResults, Procedure } from '@kilocycle/common/types';
import { budgetByHand, decisionByHand, directSlope } from '../support/gum-by-hand.js';
import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';

type Who = keyof typeof DEMO;

describe('procedures, budgets and results (e2e, MariaDB)', () => {
  let t: TestApp;
  const tokens = {} as Record<Who, string>;
  const as = (who: Who) => ({ Authorization: `Bearer ${tokens[who]}` });
  let jobId: number;
  beforeAll(async () => {
    t = await createTestApp();
    for (const key of Object.keys(DEMO) as Who[]) tokens[key] = await tokenFor(t.http, DEMO[key]);
    const [row] = await t.dataSource.query("SELECT j.id FROM jobs j JOIN instruments i ON i.id = j.instrument_id WHERE i.serial = 'N-1041'");
    jobId = Number(row.id);
  });
  afterAll(async () => {
    await t.close();
  });

  it('should list procedures to lab staff only, exactly one of them the default', async () => {
    const res = await t.http.get('/api/procedures?sort=name').set(as('tech'));
    expect(res.status).toBe(200);
    expect(res.body.items.filter((p: Procedure) => p.isDefault)).toHaveLength(1);
    expect((await t.http.get('/api/procedures').set(as('northgate'))).status).toBe(403);
  });

  it('should let the lead create a procedure and validate it', async () => {
    const body = {
      name: 'Guarded, coarse dials',
      method: 'Direct comparison; three readings a setting.',
      decisionRule: 'guarded_binary',
      dialHalfDivisionPercentOfSpan: 0.5,
      driftPpm: 5,
      driftHz: 1,
      extraComponents: [{ name: 'Cable movement', distribution: 'normal', value: 2, unit: 'Hz', divisor: 2 }],
    };
    expect((await t.http.post('/api/procedures').set(as('tech')).send(body)).status).toBe(403);
    expect(
      (
        await t.http
          .post('/api/procedures')
          .set(as('lead'))
          .send({ ...body, decisionRule: 'lenient' })
      ).status,
    ).toBe(400);
    expect(
      (
        await t.http
          .post('/api/procedures')
          .set(as('lead'))
          .send({ ...body, extraComponents: [{ name: 'x', distribution: 'normal', value: -1, unit: 'Hz' }] })
      ).status,
    ).toBe(400);
    const created = await t.http.post('/api/procedures').set(as('lead')).send(body);
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ ...body, isDefault: false, active: true });
    expect((await t.http.post('/api/procedures').set(as('lead')).send(body)).status).toBe(409);
  });

  it('should compute the job results under the procedure the job uses, with each point’s budget table', async () => {
    const before: JobResults = (await t.http.get(`/api/jobs/${jobId}/results`).set(as('lead'))).body;
    expect(before.decisionRule).toBe('simple');
    const range = before.ranges[0]!;
    expect(range.points).toHaveLength(11);
    const point = range.points[0]!;
    expect(point.asFound && point.asLeft).toBeTruthy();
    expect(point.asLeft!.budget!.lines.map((l) => l.name)).toEqual([
      'Reference standard time-base accuracy',
      'Counter resolution (±1 count)',
      'Repeatability (s/√n)',
      'Dial reading resolution (half a division)',
      'Drift during the measurement',
      'Reference standard calibration (U/k)',
    ]);
    // ILAC-G8: the TUR, like the guard band, takes U before it is rounded for printing.
    expect(point.asLeft!.tur).toBeCloseTo(point.toleranceHz / point.asLeft!.budget!.Uunrounded, 12);
    const list = (await t.http.get('/api/procedures?q=coarse').set(as('lead'))).body.items as Procedure[];
    const put = await t.http.put(`/api/jobs/${jobId}/procedure`).set(as('tech')).send({ procedureId: list[0]!.id });
    expect(put.status).toBe(200);
    const after: JobResults = (await t.http.get(`/api/jobs/${jobId}/results`).set(as('lead'))).body;
    expect(after.decisionRule).toBe('guarded_binary');
    expect(after.decisionRuleText).toContain('4.2.2');
    const lines = after.ranges[0]!.points[0]!.asLeft!.budget!.lines;
    expect(lines.at(-1)).toMatchObject({ name: 'Cable movement', divisor: 2, standardUncertainty: 1, contributionHz: 1 });
    expect((await t.http.get(`/api/jobs/${jobId}/procedure`).set(as('engineer'))).body.name).toBe('Guarded, coarse dials');
  });

  it('should state at every point the U, k, ν_eff, guard band and decision that a GUM budget and ILAC-G8 worked by hand give', async () => {
    // The job now uses the guarded binary procedure made above (w = U, and a normal extra line of 2 Hz at k = 2).
    const results: JobResults = (await t.http.get(`/api/jobs/${jobId}/results`).set(as('lead'))).body;
    expect(results.decisionRule).toBe('guarded_binary');
    const [procedure] = await t.dataSource.query('SELECT p.* FROM procedures p JOIN job_procedures jp ON jp.procedure_id = p.id WHERE jp.job_id = ?', [jobId]);
    const json = <T>(v: unknown): T => (typeof v === 'string' ? JSON.parse(v) : v) as T;
    const num = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));
    let checked = 0;
    let roundedAway = 0;
    const decisions = new Set<string>();
    for (const range of results.ranges) {
      const [row] = await t.dataSource.query('SELECT dial_law, dial_min, dial_max, tolerance FROM instrument_ranges WHERE id = ?', [range.rangeId]);
      const slope = directSlope(json(row.dial_law));
      const tolerance = json<{ kind: 'percent'; percent: number } | { kind: 'ppm_hz'; ppm: number; hz: number }>(row.tolerance);
      const span = Math.abs(Number(row.dial_max) - Number(row.dial_min));
      for (const kind of ['asFound', 'asLeft'] as const) {
        const runId = kind === 'asFound' ? range.asFoundRunId : range.asLeftRunId;
        if (runId === null) continue;
        const [std] = await t.dataSource.query('SELECT s.* FROM runs r JOIN standards s ON s.id = r.standard_id WHERE r.id = ?', [runId]);
        const [override] = await t.dataSource.query('SELECT * FROM run_budgets WHERE run_id = ?', [runId]);
        const readings: Array<{ dial: number; frequency_hz: number }> = await t.dataSource.query(
          'SELECT r.dial, r.frequency_hz FROM readings r LEFT JOIN reading_exclusions e ON e.reading_id = r.id WHERE r.run_id = ? AND e.reading_id IS NULL AND r.dial IS NOT NULL',
          [runId],
        );
        for (const p of range.points) {
          const m = p[kind];
          expect(m).toBeTruthy();
          const nominal = p.dial * slope; // a direct-reading dial
          expect(p.nominal).toBeCloseTo(nominal, 6);
          const TL = tolerance.kind === 'percent' ? (nominal * tolerance.percent) / 100 : nominal * tolerance.ppm * 1e-6 + tolerance.hz;
          expect(p.toleranceHz).toBeCloseTo(TL, 6);
          const hand = budgetByHand({
            nominalHz: nominal,
            samples: readings.filter((r) => Number(r.dial) === p.dial).map((r) => Number(r.frequency_hz)),
            timebasePpm: Number(std.timebase_accuracy_ppm),
            resolutionHz: num(override?.counter_resolution_hz) ?? Number(std.resolution_hz),
            calibrationUPpm: Number(std.calibration_u_ppm),
            calibrationK: Number(std.calibration_k),
            dialHalfDivision: num(override?.dial_half_division) ?? (Number(procedure.dial_half_division_pct) / 100) * span,
            slopeHzPerDial: slope,
            driftPpm: num(override?.drift_ppm) ?? Number(procedure.drift_ppm),
            driftHz: num(override?.drift_hz) ?? Number(procedure.drift_hz),
            extras: (override?.extra_components ? json(override.extra_components) : null) ?? json(procedure.extra_components) ?? [],
          });
          const stated = m!.budget!;
          expect(m!.n).toBe(hand.n);
          expect(m!.measured).toBeCloseTo(hand.mean, 6);
          expect(m!.errorHz).toBeCloseTo(hand.mean - nominal, 6);
          expect(stated.ucHz / hand.uc).toBeCloseTo(1, 9);
          if (Number.isFinite(hand.nuEff)) {
            expect(stated.nuEff).not.toBeNull();
            expect(stated.nuEff! / hand.nuEff).toBeCloseTo(1, 9);
          } else {
            expect(stated.nuEff).toBeNull();
          }
          expect(stated.k).toBeCloseTo(hand.k, 6);
          expect(stated.U).toBeCloseTo(hand.U, 10);
          // ILAC-G8 4.2.2: w = U before rounding.
          const d = decisionByHand(hand.mean - nominal, TL, hand.Uunrounded, 'guarded_binary');
          // Relative checks: k from jstat agrees with the server's to about 1e-7 (relative) where ν_eff is large.
          expect(m!.guardBandHz! / d.guardBandHz).toBeCloseTo(1, 6);
          expect((m!.acceptanceLimitHz! - d.acceptanceLimitHz) / TL).toBeCloseTo(0, 6);
          expect(m!.tur! / d.tur).toBeCloseTo(1, 6);
          expect(m!.decision).toBe(d.decision);
          decisions.add(d.decision);
          if (Math.abs(hand.Uunrounded - hand.U) > 1e-9 * hand.U) roundedAway += 1;
          checked += 1;
        }
      }
    }
    expect(checked).toBe(results.ranges.reduce((a, r) => a + r.points.filter((p) => p.asFound).length + r.points.filter((p) => p.asLeft).length, 0));
    expect(checked).toBeGreaterThanOrEqual(20);
    // The checks tell rounded from unrounded U, and passes from fails.
    expect(roundedAway).toBeGreaterThan(checked / 2);
    expect([...decisions].sort()).toEqual(['fail', 'pass']);
  });

  it('should flag excluded readings and outliers and scope the results to the customer', async () => {
    const [run] = await t.dataSource.query("SELECT id FROM runs WHERE job_id = ? AND kind = 'as_left'", [jobId]);
    const [reading] = await t.dataSource.query('SELECT id FROM readings WHERE run_id = ? ORDER BY seq LIMIT 1', [run.id]);
    // The lab-records rules refuse exclusions in review; this one is recorded as if made before submission.
    await t.dataSource.query('INSERT INTO reading_exclusions (reading_id, run_id, reason, excluded_by) VALUES (?, ?, ?, 3)', [
      reading.id,
      run.id,
      'counter gate left on 0.1 s',
    ]);
    const results: JobResults = (await t.http.get(`/api/jobs/${jobId}/results`).set(as('northgate'))).body;
    expect(results.flags).toContainEqual(expect.objectContaining({ kind: 'excluded_reading', readingId: Number(reading.id), severity: 'info' }));
    expect(results.ranges[0]!.points[0]!.asLeft!.n).toBe(1);
    expect((await t.http.get(`/api/jobs/${jobId}/results`).set(as('saltmarsh'))).status).toBe(404);
    const review = (await t.http.get(`/api/reviews/${jobId}`).set(as('lead'))).body;
    expect(review.excludedReadings).toEqual([expect.objectContaining({ readingId: Number(reading.id), reason: 'counter gate left on 0.1 s' })]);
  });

  it('should refuse a submission without calibration data and a return of a job not in review', async () => {
    const [job] = await t.dataSource.query("SELECT j.id FROM jobs j JOIN instruments i ON i.id = j.instrument_id WHERE i.serial = 'CR7-5520'");
    const submit = await t.http.post(`/api/jobs/${job.id}/submit`).set(as('tech')).send({});
    expect(submit.status).toBe(409);
    expect(submit.body.message).toMatch(/no as-found or as-left run/);
    expect((await t.http.post(`/api/jobs/${job.id}/return`).set(as('lead')).send({ comment: 'nothing to return' })).status).toBe(409);
    expect((await t.http.post(`/api/jobs/${job.id}/return`).set(as('lead')).send({ comment: '' })).status).toBe(400);
  });
});
