import { instrumentWithJob, khzRange, openRun, organizationIds, postReadings } from '../support/lab-fixtures.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

// Expected values below come from the formulas that generate the readings, not from the code under test.

const relClose = (actual: number, expected: number, tolerance: number) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tolerance * Math.abs(expected));

describe('run analysis (e2e, MariaDB)', () => {
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
  const freshRun = async (kind: string, org = 'Northgate Radio Club') => {
    // Studies here run at 3.5 to 10 MHz: their range spans that (readings far outside a range are refused).
    const ranges = kind === 'as_found' || kind === 'as_left' ? undefined : [khzRange('Wide 1–12 MHz', 1000, 12000)];
    const { jobId, rangeIds } = await instrumentWithJob(t, as('tech'), { organizationId: orgs[org]!, ranges });
    return openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind });
  };
  const analysis = (runId: number, query = '') => t.http.get(`/api/runs/${runId}/analysis${query}`).set(as('tech'));

  describe('calibration runs', () => {
    // Range 1000–2000 kHz, direct kHz dial. Error line: error(f) = 150 Hz − 0.004·f, i.e. measured = 150 + 0.996·nominal.
    const offset = 150;
    const slope = -0.004;
    const dials = [1000, 1100, 1250, 1400, 1500, 1650, 1800, 1900, 2000];
    const measured = (dial: number) => offset + (1 + slope) * dial * 1e3;

    it('should give back the line the readings were generated from', async () => {
      const runId = await freshRun('as_found');
      await postReadings(
        t,
        as('tech'),
        runId,
        dials.flatMap((dial) => [
          { dial, frequency: measured(dial) },
          { dial, frequency: measured(dial) },
        ]),
      );
      const res = await analysis(runId);
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ state: 'ready', analysis: 'calibration', runKind: 'as_found', readingCount: 18, excludedCount: 0, usedCount: 18 });
      relClose(res.body.fit.offsetHz, offset, 1e-6);
      relClose(res.body.fit.slope, slope, 1e-9);
      expect(res.body.fit.r2).toBeCloseTo(1, 12);
      expect(res.body.points).toHaveLength(dials.length);
      res.body.points.forEach(
        (
          p: { dial: number; nominal: number; measured: number; n: number; errorHz: number; errorPpm: number; errorPercent: number; toleranceHz: number },
          i: number,
        ) => {
          const nominal = dials[i]! * 1e3;
          const error = offset + slope * nominal;
          expect(p).toMatchObject({ dial: dials[i], nominal, n: 2 });
          relClose(p.errorHz, error, 1e-9);
          relClose(p.errorPpm, (error / nominal) * 1e6, 1e-9);
          relClose(p.errorPercent, (error / nominal) * 100, 1e-9);
          relClose(p.toleranceHz, nominal * 0.005, 1e-12);
        },
      );
      // A straight error line leaves no tracking error against either line.
      expect(res.body.tracking.bestFit.maxAbsHz).toBeLessThan(1e-6);
      expect(res.body.tracking.endPoint.maxAbsHz).toBeLessThan(1e-6);
      expect(res.body.corrections[0]).toMatchObject({ dial: 1000, nominal: 1e6 });
      relClose(res.body.corrections[0].correctionHz, offset + slope * 1e6, 1e-9);
      expect(res.body.outliers).toEqual([]);
    });

    it('should work out the LC alignment from the two range ends when the run covers both', async () => {
      const runId = await freshRun('as_found');
      await postReadings(
        t,
        as('tech'),
        runId,
        dials.map((dial) => ({ dial, frequency: measured(dial) })),
      );
      const res = await analysis(runId, '?tuningCapLowPf=300');
      const { alignment } = res.body;
      expect(alignment.low).toMatchObject({ dial: 1000, target: 1e6 });
      expect(alignment.high).toMatchObject({ dial: 2000, target: 2e6 });
      // Independent check from f ∝ 1/√(L·C): after ΔL/L and a parallel δ·C_low, both ends land on their targets.
      const { inductanceChange: dL, parallelCapChangeFraction: delta } = alignment;
      const rho = (measured(2000) / measured(1000)) ** 2; // C_low / C_high
      relClose(measured(1000) / Math.sqrt((1 + dL) * (1 + delta)), 1e6, 1e-9);
      relClose(measured(2000) / Math.sqrt((1 + dL) * (1 + delta * rho)), 2e6, 1e-9);
      relClose(alignment.parallelCapChangePf, delta * 300, 1e-12);
      expect(res.body.alignmentNote).toBeNull();

      const partial = await freshRun('as_found');
      await postReadings(
        t,
        as('tech'),
        partial,
        [1000, 1200, 1400].map((dial) => ({ dial, frequency: measured(dial) })),
      );
      const half = await analysis(partial);
      expect(half.body.alignment).toBeNull();
      expect(half.body.alignmentNote).toContain('both ends');
    });

    it('should flag an outlier, and drop it once excluded', async () => {
      const runId = await freshRun('as_found');
      const readings = dials.map((dial) => ({ dial, frequency: measured(dial) + (dial === 1500 ? 900 : 0) }));
      await postReadings(t, as('tech'), runId, readings);
      const flagged = await analysis(runId);
      expect(flagged.body.outliers.map((o: { dial: number }) => o.dial)).toEqual([1500]);
      const list = await t.http.get(`/api/runs/${runId}/readings?pageSize=20`).set(as('tech'));
      const bad = list.body.items.find((r: { dial: number }) => r.dial === 1500);
      await t.http.post(`/api/runs/${runId}/readings/${bad.id}/exclusion`).set(as('tech')).send({ reason: 'Counter gate glitch' });
      const cleaned = await analysis(runId);
      expect(cleaned.body).toMatchObject({ excludedCount: 1, usedCount: 8, outliers: [] });
      relClose(cleaned.body.fit.slope, slope, 1e-9);
    });

    it('should give the first reading its error at once, with no fit before there are three settings', async () => {
      const runId = await freshRun('as_found');
      await postReadings(t, as('tech'), runId, [{ dial: 1000, frequency: measured(1000) }]);
      const res = await analysis(runId);
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ state: 'ready', analysis: 'calibration', usedCount: 1, fit: null, tracking: null });
      relClose(res.body.points[0].errorHz, offset + slope * 1e6, 1e-9);
    });

    it('should show the demo as-found error of about −0.9 % at the low end and an as-left within tolerance', async () => {
      const runs = await t.http.get('/api/runs?kind=as_found&q=N-1041').set(as('northgate'));
      const found = await t.http.get(`/api/runs/${runs.body.items[0].id}/analysis`).set(as('northgate'));
      expect(found.status).toBe(200);
      expect(found.body.points[0].dial).toBe(1750);
      expect(found.body.points[0].errorPercent).toBeCloseTo(-0.91, 1);
      expect(found.body.alignment).not.toBeNull();
      const left = (await t.http.get('/api/runs?kind=as_left&q=N-1041').set(as('northgate'))).body.items[0];
      const after = await t.http.get(`/api/runs/${left.id}/analysis`).set(as('northgate'));
      for (const p of after.body.points as Array<{ errorHz: number; toleranceHz: number }>) expect(Math.abs(p.errorHz)).toBeLessThan(p.toleranceHz / 10);
      expect((await t.http.get(`/api/runs/${left.id}/analysis`).set(as('saltmarsh'))).status).toBe(404);
    });
  });

  describe('runs with no readings yet', () => {
    // A run just opened has nothing to compute: that is a state of the run (200, state "empty"), not an error.
    it.each(['as_found', 'as_left', 'warmup', 'stability', 'supply_sensitivity', 'keying'])(
      'should answer 200 with state "empty" for a new %s run',
      async (kind) => {
        const runId = await freshRun(kind);
        const res = await analysis(runId);
        expect(res.status).toBe(200);
        expect(res.body).toEqual({ runId, runKind: kind, readingCount: 0, excludedCount: 0, usedCount: 0, state: 'empty', analysis: 'none' });
      },
    );

    it('should answer "empty" once every reading is excluded, and the analysis again when readings arrive', async () => {
      const runId = await freshRun('as_found');
      await postReadings(t, as('tech'), runId, [{ dial: 1000, frequency: 999_000 }]);
      const list = await t.http.get(`/api/runs/${runId}/readings`).set(as('tech'));
      await t.http.post(`/api/runs/${runId}/readings/${list.body.items[0].id}/exclusion`).set(as('tech')).send({ reason: 'Wrong range selected' });
      const excluded = await analysis(runId);
      expect(excluded.status).toBe(200);
      expect(excluded.body).toMatchObject({ state: 'empty', analysis: 'none', readingCount: 1, excludedCount: 1, usedCount: 0 });
      await postReadings(
        t,
        as('tech'),
        runId,
        [1000, 1500, 2000].map((dial) => ({ dial, frequency: dial * 1e3 + 100 })),
      );
      const ready = await analysis(runId);
      expect(ready.body).toMatchObject({ state: 'ready', analysis: 'calibration', readingCount: 4, excludedCount: 1, usedCount: 3 });
    });

    it("should still hide another organisation's empty run (404)", async () => {
      const runId = await freshRun('warmup');
      expect((await t.http.get(`/api/runs/${runId}/analysis`).set(as('saltmarsh'))).status).toBe(404);
    });
  });

  describe('warm-up runs', () => {
    // f(t) = f∞ + A·e^(−t/τ), one reading every 4 s for 3 h, with a ±0.05 Hz alternating ripple.
    const fInf = 7_000_000;
    const amplitude = 1200;
    const tau = 900;
    const readings = Array.from({ length: 2700 }, (_, i) => ({
      t: 4 * i,
      frequency: fInf + amplitude * Math.exp((-4 * i) / tau) + (i % 2 === 0 ? 0.05 : -0.05),
    }));

    it('should fit f∞, A and τ, give both settling times, windowed drift, and a series of at most 2,000 points', async () => {
      const runId = await freshRun('warmup');
      await postReadings(t, as('tech'), runId, readings);
      const res = await analysis(runId);
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ analysis: 'warmup', readingCount: 2700, usedCount: 2700 });
      relClose(res.body.fit.fInf, fInf, 1e-9);
      relClose(res.body.fit.amplitude, amplitude, 1e-4);
      relClose(res.body.fit.tau, tau, 1e-4);
      // Within 5 Hz: t = τ·ln(A/5); rate below 1 Hz/min: (A/τ)·e^(−t/τ) = 1/60 ⇒ t = τ·ln(60·A/τ).
      relClose(res.body.settling.withinSeconds, tau * Math.log(amplitude / 5), 1e-3);
      relClose(res.body.settling.rateSeconds, tau * Math.log((60 * amplitude) / tau), 1e-3);
      // Both times (≈ 4 932 s and 3 944 s) lie inside the record, which ends at 4 × 2 699 = 10 796 s.
      expect(res.body.settling).toMatchObject({ withinHz: 5, rateHzPerMin: 1, withinExtrapolated: false, rateExtrapolated: false, lastReadingSeconds: 10_796 });
      // Ten-minute windows: the record ends at 10 796 s, so 17 whole windows; the first is falling fastest.
      expect(res.body.drift.windowSeconds).toBe(600);
      expect(res.body.drift.windows).toHaveLength(17);
      expect(res.body.drift.windows[0].rateHzPerMin).toBeLessThan(res.body.drift.windows[16].rateHzPerMin);
      expect(res.body.series.t.length).toBeLessThanOrEqual(2000);
      expect(res.body.series.frequency).toHaveLength(res.body.series.t.length);
      expect(res.body.series.fitted).toHaveLength(res.body.series.t.length);
      relClose(res.body.series.fitted[0], fInf + amplitude, 1e-7);

      // The same request again (answered from the cache) gives the same figures.
      expect((await analysis(runId)).body).toEqual(res.body);

      const tighter = await analysis(runId, '?withinHz=1&rateHzPerMin=0.5&windowSeconds=1800');
      relClose(tighter.body.settling.withinSeconds, tau * Math.log(amplitude / 1), 1e-3);
      relClose(tighter.body.settling.rateSeconds, tau * Math.log((60 * amplitude) / (0.5 * tau)), 1e-3);
      // The last reading is at 10 796 s, so 30-min windows fit five times.
      expect(tighter.body.drift.windows).toHaveLength(5);
      expect((await analysis(runId, '?withinHz=-1')).status).toBe(400);
    });

    it('should count excluded readings and fit without them (two counter glitches of +5 kHz)', async () => {
      const runId = await freshRun('warmup');
      const glitches = [
        { t: 402, frequency: fInf + 5000 },
        { t: 6002, frequency: fInf + 5000 },
      ];
      await postReadings(
        t,
        as('tech'),
        runId,
        [...readings, ...glitches].sort((a, b) => a.t - b.t),
      );
      const spoilt = await analysis(runId);
      expect(spoilt.body).toMatchObject({ readingCount: 2702, excludedCount: 0, usedCount: 2702 });
      expect(Math.abs(spoilt.body.fit.fInf - fInf)).toBeGreaterThan(0.5);
      const highest = (await t.http.get(`/api/runs/${runId}/readings?sort=-frequency&pageSize=2`).set(as('tech'))).body.items;
      expect(highest.map((r: { frequency: number }) => r.frequency)).toEqual([fInf + 5000, fInf + 5000]);
      for (const reading of highest) {
        await t.http.post(`/api/runs/${runId}/readings/${reading.id}/exclusion`).set(as('tech')).send({ reason: 'Counter gate glitch' }).expect(201);
      }
      const res = await analysis(runId);
      expect(res.body).toMatchObject({ analysis: 'warmup', readingCount: 2702, excludedCount: 2, usedCount: 2700 });
      relClose(res.body.fit.fInf, fInf, 1e-9);
      relClose(res.body.fit.amplitude, amplitude, 1e-4);
      relClose(res.body.fit.tau, tau, 1e-4);
      expect(res.body.series.frequency).not.toContain(fInf + 5000);
    });

    it('should mark a settling time beyond the last reading as extrapolated (18 s recorded of a τ = 20 s warm-up)', async () => {
      const runId = await freshRun('warmup');
      // f = 7 MHz + 1 200 Hz·e^(−t/20 s), a reading every 2 s up to 18 s: within 5 Hz only at 20·ln(240) ≈ 110 s.
      await postReadings(
        t,
        as('tech'),
        runId,
        Array.from({ length: 10 }, (_, i) => ({ t: 2 * i, frequency: fInf + amplitude * Math.exp((-2 * i) / 20) })),
      );
      const res = await analysis(runId);
      expect(res.status).toBe(200);
      relClose(res.body.settling.withinSeconds, 20 * Math.log(amplitude / 5), 1e-3);
      expect(res.body.settling).toMatchObject({ withinExtrapolated: true, rateExtrapolated: true, lastReadingSeconds: 18 });
    });
    it('should answer 422 for a warm-up with too few readings', async () => {
      const runId = await freshRun('warmup');
      await postReadings(
        t,
        as('tech'),
        runId,
        [0, 10, 20, 30].map((time) => ({ t: time, frequency: fInf + 10 - time / 10 })),
      );
      const res = await analysis(runId);
      expect(res.status).toBe(422);
      expect(res.body.code).toBe('too_few_points');
    });

    it('should analyse both demo warm-ups of the Saltmarsh receiver, the second settling sooner', async () => {
      const runs = (await t.http.get('/api/runs?kind=warmup&q=CR7-5520&sort=startedAt').set(as('saltmarsh'))).body.items;
      const [before, after] = await Promise.all(runs.map((r: { id: number }) => t.http.get(`/api/runs/${r.id}/analysis`).set(as('saltmarsh'))));
      // Generated with A = 2350 Hz, τ = 840 s before and A = 900 Hz, τ = 520 s after, 2 Hz of noise.
      relClose(before.body.fit.tau, 840, 0.05);
      relClose(after.body.fit.tau, 520, 0.05);
      relClose(before.body.fit.amplitude, 2350, 0.05);
      expect(after.body.settling.withinSeconds).toBeLessThan(before.body.settling.withinSeconds);
    });
  });

  describe('stability, supply-sensitivity and keying runs', () => {
    it('should give the overlapping and modified Allan deviation at octave τ and report gaps', async () => {
      // Alternating ±1 Hz on 10 MHz at τ0 = 1 s: y alternates ±1e-7, so σ_y(τ0) = √(⟨(y₂−y₁)²⟩/2) = 2e-7/√2.
      const runId = await freshRun('stability');
      const readings = Array.from({ length: 1000 }, (_, i) => ({ t: i < 500 ? i : i + 5, frequency: 10e6 + (i % 2 === 0 ? 1 : -1) }));
      await postReadings(t, as('engineer'), runId, readings);
      const res = await t.http.get(`/api/runs/${runId}/analysis?referenceHz=10000000`).set(as('engineer'));
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ analysis: 'stability', tau0: 1, referenceHz: 10e6 });
      expect(res.body.adev.map((p: { tau: number }) => p.tau).slice(0, 4)).toEqual([1, 2, 4, 8]);
      relClose(res.body.adev[0].deviation, 2e-7 / Math.SQRT2, 1e-9);
      expect(res.body.mdev[0].tau).toBe(1);
      expect(res.body.gaps.gaps).toEqual([{ index: 500, tStart: 499, tEnd: 505, missing: 5 }]);
    });

    it('should give the supply sensitivity in Hz per volt', async () => {
      // f = 3.5 MHz + 2.5 Hz/V × (V − 230).
      const runId = await freshRun('supply_sensitivity');
      const volts = [207, 215, 223, 230, 237, 245, 253];
      await postReadings(
        t,
        as('engineer'),
        runId,
        volts.map((v, i) => ({ t: 30 * i, frequency: 3.5e6 + 2.5 * (v - 230), aux: v })),
      );
      const res = await t.http.get(`/api/runs/${runId}/analysis`).set(as('engineer'));
      expect(res.status).toBe(200);
      relClose(res.body.sensitivity.hzPerVolt, 2.5, 1e-9);
      expect(res.body.sensitivity.n).toBe(7);
    });

    it('should give the keying shift (key down minus key up)', async () => {
      const runId = await freshRun('keying');
      const up = [7_030_000.4, 7_030_000.6, 7_030_000.5, 7_030_000.5];
      const down = [7_029_965.3, 7_029_965.7, 7_029_965.5, 7_029_965.5];
      await postReadings(t, as('engineer'), runId, [
        ...up.map((f, i) => ({ t: i, frequency: f, aux: 0 })),
        ...down.map((f, i) => ({ t: 10 + i, frequency: f, aux: 1 })),
      ]);
      const res = await t.http.get(`/api/runs/${runId}/analysis`).set(as('engineer'));
      expect(res.status).toBe(200);
      relClose(res.body.shift.shiftHz, 7_029_965.5 - 7_030_000.5, 1e-9);
      expect(res.body.shift).toMatchObject({ nUp: 4, nDown: 4 });
      const empty = await freshRun('keying');
      await postReadings(t, as('engineer'), empty, [{ t: 0, frequency: 7e6 }]);
      expect((await t.http.get(`/api/runs/${empty}/analysis`).set(as('engineer'))).status).toBe(422);
    });
  });
});
