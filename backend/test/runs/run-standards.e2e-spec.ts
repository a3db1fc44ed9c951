// Issue 12, capture guardrails: a calibration run needs a reference standard (at opening and at
// submission), and a run's details are corrected only with a reason, only while the job is open.
import { instrumentWithJob, khzRange, openRun, organizationIds, parseChanges, postReadings } from '../support/lab-fixtures.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

const RANGE = 'A  1750–2000 kHz';

describe('runs: reference standards and corrections (e2e, MariaDB)', () => {
  let t: TestApp;
  let as: AsDemo;
  let orgs: Record<string, number>;
  let standards: Record<string, number>;
  beforeAll(async () => {
    t = await createTestApp();
    as = await signInDemo(t.http);
    orgs = await organizationIds(t, as('admin'));
    const house = await t.http
      .post('/api/standards')
      .set(as('lead'))
      .send({
        name: 'House rubidium reference',
        kind: 'reference',
        makeModel: 'Quarry Lane RB-1',
        serial: 'QL-RB-02',
        certificateNumber: 'QL-C-2291',
        dueDate: `${new Date().getUTCFullYear() + 1}-06-30`,
        timebaseAccuracyPpm: 0.001,
        resolutionHz: 0.001,
        calibrationUPpm: 0.0005,
        calibrationK: 2,
      });
    if (house.status !== 201) throw new Error(`standard: ${house.status} ${JSON.stringify(house.body)}`);
    const rows = await t.dataSource.query('SELECT id, name FROM standards');
    standards = Object.fromEntries(rows.map((r: { id: number; name: string }) => [r.name, Number(r.id)]));
  });
  afterAll(async () => {
    await t.close();
  });
  const fresh = () => instrumentWithJob(t, as('tech'), { organizationId: orgs['Northgate Radio Club']!, ranges: [khzRange(RANGE, 1750, 2000)] });
  const runCount = async (jobId: number) => Number((await t.dataSource.query('SELECT COUNT(*) AS n FROM runs WHERE job_id = ?', [jobId]))[0].n);
  const runRow = async (id: number) => (await t.dataSource.query('SELECT standard_id, supply_voltage, configuration, notes FROM runs WHERE id = ?', [id]))[0];
  const events = (id: number) =>
    t.dataSource.query("SELECT action, changes, actor_id FROM audit_events WHERE entity = 'run' AND entity_id = ? ORDER BY id", [String(id)]) as Promise<
      Array<{ action: string; changes: unknown; actor_id: number }>
    >;
  const inSpan = [1750, 1800, 1850, 1900, 1950, 2000].map((d) => ({ dial: d, frequency: d * 1000 + 400 }));

  describe('opening a calibration run', () => {
    it('refuses an as-found or as-left run without a standard with 400 naming standardId, and opens nothing', async () => {
      const { jobId, rangeIds } = await fresh();
      for (const kind of ['as_found', 'as_left']) {
        const res = await t.http.post(`/api/jobs/${jobId}/runs`).set(as('tech')).send({ rangeId: rangeIds[0], kind });
        expect(res.status).toBe(400);
        expect(res.body.message).toBe(
          `standardId: an ${kind.replace('_', '-')} run needs a reference standard; choose the counter or reference the readings are taken with`,
        );
        const explicit = await t.http.post(`/api/jobs/${jobId}/runs`).set(as('tech')).send({ rangeId: rangeIds[0], kind, standardId: null });
        expect(explicit.status).toBe(400);
      }
      expect(await runCount(jobId)).toBe(0);
      // A study needs none.
      expect((await t.http.post(`/api/jobs/${jobId}/runs`).set(as('tech')).send({ rangeId: rangeIds[0], kind: 'warmup' })).status).toBe(201);
    });

    it("takes the bench's default standard, and says so when the bench has none", async () => {
      const { jobId, rangeIds } = await fresh();
      const withDefault = (
        await t.dataSource.query("INSERT INTO benches (name, default_standard_id, active) VALUES ('Std bench A', ?, 1)", [standards['Bench counter A']])
      ).insertId;
      const without = (await t.dataSource.query("INSERT INTO benches (name, default_standard_id, active) VALUES ('Std bench none', NULL, 1)")).insertId;
      const bare = await t.http.post(`/api/jobs/${jobId}/runs`).set(as('tech')).send({ rangeId: rangeIds[0], kind: 'as_found', benchId: without });
      expect(bare.status).toBe(400);
      expect(bare.body.message).toContain('(the bench has no default standard)');
      const ok = await t.http.post(`/api/jobs/${jobId}/runs`).set(as('tech')).send({ rangeId: rangeIds[0], kind: 'as_found', benchId: withDefault });
      expect(ok.status).toBe(201);
      expect(ok.body).toMatchObject({ standardId: standards['Bench counter A'], standardName: 'Bench counter A' });
    });
  });

  describe('submission', () => {
    it('is refused with 409 naming each calibration run without a standard, then goes through once it is corrected', async () => {
      const { jobId, rangeIds, jobNumber } = await fresh();
      const asFound = await openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind: 'as_found' });
      await postReadings(t, as('tech'), asFound, inSpan);
      // A run opened before the rule existed (or written around it): no standard.
      const [creator] = await t.dataSource.query("SELECT id FROM users WHERE role = 'technician' LIMIT 1");
      const asLeft = Number(
        (
          await t.dataSource.query(
            "INSERT INTO runs (job_id, range_id, kind, status, started_at, created_by) VALUES (?, ?, 'as_left', 'open', UTC_TIMESTAMP(3), ?)",
            [jobId, rangeIds[0], creator.id],
          )
        ).insertId,
      );
      await postReadings(t, as('tech'), asLeft, inSpan);
      const refused = await t.http.post(`/api/jobs/${jobId}/submit`).set(as('tech')).send({});
      expect(refused.status).toBe(409);
      expect(refused.body.message).toBe(
        `job ${jobNumber} cannot go to review: run ${asLeft} (as-left, ${RANGE}) has no reference standard. Set the standard with "Correct run details" on the run's page.`,
      );
      expect((await t.http.get(`/api/jobs/${jobId}`).set(as('tech'))).body.status).toBe('in_progress');

      const fixed = await t.http
        .patch(`/api/runs/${asLeft}`)
        .set(as('tech'))
        .send({ standardId: standards['Bench counter A'], reason: 'Counter A was used; the run was opened without it' });
      expect(fixed.status).toBe(200);
      expect((await t.http.post(`/api/jobs/${jobId}/submit`).set(as('tech')).send({})).status).toBe(200);

      // In review, a correction is refused with 409 and nothing changes.
      const late = await t.http.patch(`/api/runs/${asLeft}`).set(as('tech')).send({ notes: 'after submission', reason: 'forgot to note it' });
      expect(late.status).toBe(409);
      expect(late.body.message).toContain('which is in review');
      expect((await runRow(asLeft)).notes).toBeNull();
    });
  });

  describe('PATCH /api/runs/:id corrections', () => {
    it('stores a correction of standard, supply, configuration and notes with its reason, audited with from and to', async () => {
      const { jobId, rangeIds } = await fresh();
      const runId = await openRun(t, as('tech'), jobId, {
        rangeId: rangeIds[0],
        kind: 'as_found',
        standardId: standards['Bench counter A'],
        configuration: 'In its case',
      });
      const reason = 'The reference was the house standard, not counter A; supply read on the variac';
      const res = await t.http
        .patch(`/api/runs/${runId}`)
        .set(as('tech'))
        .send({ standardId: standards['House rubidium reference'], supplyVoltage: 117.5, configuration: 'Out of its case', notes: 'Lid off', reason });
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({
        standardId: standards['House rubidium reference'],
        standardName: 'House rubidium reference',
        supplyVoltage: 117.5,
        configuration: 'Out of its case',
        notes: 'Lid off',
      });
      expect(await runRow(runId)).toMatchObject({
        standard_id: standards['House rubidium reference'],
        supply_voltage: 117.5,
        configuration: 'Out of its case',
        notes: 'Lid off',
      });
      const trail = await events(runId);
      expect(trail.map((e) => e.action)).toEqual(['create', 'update']);
      const me = await t.http.get('/api/auth/me').set(as('tech'));
      expect(trail[1]!.actor_id).toBe(me.body.id);
      expect(parseChanges(trail[1]!.changes)).toEqual({
        standardId: { from: standards['Bench counter A'], to: standards['House rubidium reference'] },
        standardName: { from: 'Bench counter A', to: 'House rubidium reference' },
        supplyVoltage: { from: null, to: 117.5 },
        configuration: { from: 'In its case', to: 'Out of its case' },
        notes: { from: null, to: 'Lid off' },
        reason,
      });
    });

    it('refuses a correction without a reason (400) or that removes the standard of a calibration run (400), changing nothing', async () => {
      const { jobId, rangeIds } = await fresh();
      const runId = await openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind: 'as_found' });
      const noReason = await t.http.patch(`/api/runs/${runId}`).set(as('tech')).send({ supplyVoltage: 230 });
      expect(noReason.status).toBe(400);
      expect(noReason.body.message).toContain('reason');
      const noStandard = await t.http.patch(`/api/runs/${runId}`).set(as('tech')).send({ standardId: null, reason: 'no counter was used' });
      expect(noStandard.status).toBe(400);
      expect(noStandard.body.message).toMatch(/^standardId: an as-found run needs a reference standard/);
      const lonelyReason = await t.http.patch(`/api/runs/${runId}`).set(as('tech')).send({ reason: 'just because' });
      expect(lonelyReason.status).toBe(400);
      expect(await runRow(runId)).toMatchObject({ supply_voltage: null });
      expect((await events(runId)).map((e) => e.action)).toEqual(['create']);
    });

    it('keeps the overdue-standard rule: a technician is refused, a lead overrides with a reason that is audited', async () => {
      const { jobId, rangeIds } = await fresh();
      const runId = await openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind: 'as_found' });
      const lapsed = standards['Bench counter B (spare)'];
      const tech = await t.http.patch(`/api/runs/${runId}`).set(as('tech')).send({ standardId: lapsed, reason: 'B was on the bench' });
      expect(tech.status).toBe(409);
      expect(tech.body.message).toContain('only a lead can override');
      const leadWithout = await t.http.patch(`/api/runs/${runId}`).set(as('lead')).send({ standardId: lapsed, reason: 'B was on the bench' });
      expect(leadWithout.status).toBe(409);
      expect(leadWithout.body.message).toContain('standardOverrideReason');
      const override = 'Counter A away for repair; B checked against the house reference the same day.';
      const lead = await t.http
        .patch(`/api/runs/${runId}`)
        .set(as('lead'))
        .send({ standardId: lapsed, standardOverrideReason: override, reason: 'B was on the bench' });
      expect(lead.status).toBe(200);
      expect(lead.body).toMatchObject({ standardId: lapsed, standardOverrideReason: override });
      expect((await events(runId)).map((e) => e.action)).toEqual(['create', 'update', 'standard_override']);
    });

    it('lets a closed run of an open job be corrected; refuses an engineer on a calibration run and a client', async () => {
      const { jobId, rangeIds } = await fresh();
      const runId = await openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind: 'as_found' });
      expect((await t.http.patch(`/api/runs/${runId}`).set(as('tech')).send({ status: 'closed' })).status).toBe(200);
      const corrected = await t.http.patch(`/api/runs/${runId}`).set(as('tech')).send({ configuration: 'Output into 50 Ω', reason: 'load was not noted' });
      expect(corrected.status).toBe(200);
      expect(corrected.body).toMatchObject({ status: 'closed', configuration: 'Output into 50 Ω' });
      expect((await t.http.patch(`/api/runs/${runId}`).set(as('engineer')).send({ notes: 'x', reason: 'engineer note' })).status).toBe(403);
      expect((await t.http.patch(`/api/runs/${runId}`).set(as('northgate')).send({ notes: 'x', reason: 'client note' })).status).toBe(403);
    });
  });
});
