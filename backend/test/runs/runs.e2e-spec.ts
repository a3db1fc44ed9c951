import { instrumentWithJob, openRun, organizationIds, parseChanges } from '../support/lab-fixtures.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

type RunBody = { id: number; kind: string; status: string; jobNumber: string; rangeLabel: string; readingCount: number; refusal: string | null };

describe('runs (e2e, MariaDB)', () => {
  let t: TestApp;
  let orgs: Record<string, number>;
  let standards: Record<string, number>;
  let as: AsDemo;
  beforeAll(async () => {
    t = await createTestApp();
    as = await signInDemo(t.http);
    orgs = await organizationIds(t, as('admin'));
    const list = await t.http.get('/api/standards').set(as('admin'));
    standards = Object.fromEntries(list.body.items.map((s: { name: string; id: number }) => [s.name, s.id]));
  });
  afterAll(async () => {
    await t.close();
  });
  const fresh = () => instrumentWithJob(t, as('tech'), { organizationId: orgs['Northgate Radio Club'] });

  describe('GET /api/runs', () => {
    it('should page, sort and filter', async () => {
      const warmups = await t.http.get('/api/runs?kind=warmup&q=CR7-5520&sort=startedAt').set(as('engineer'));
      expect(warmups.status).toBe(200);
      expect(warmups.body.total).toBe(2);
      expect(warmups.body.items.map((r: RunBody) => r.readingCount)).toEqual([720, 720]);
      const open = await t.http.get('/api/runs?status=open&q=N-1187').set(as('tech'));
      expect(open.body.items.map((r: RunBody) => [r.kind, r.readingCount, r.refusal])).toEqual([['as_found', 0, null]]);
      const ids = (await t.dataSource.query('SELECT id FROM runs ORDER BY id')).map((r: { id: number }) => r.id);
      const page = await t.http.get('/api/runs?pageSize=2&page=2&sort=id').set(as('tech'));
      expect(page.body.total).toBe(ids.length);
      expect(page.body.items.map((r: RunBody) => r.id)).toEqual(ids.slice(2, 4));
      const closed = await t.http.get('/api/runs?status=closed&kind=as_found').set(as('tech'));
      expect(closed.body.items[0].refusal).toMatch(/is closed/);
    });

    it('should show a client only its organisation’s runs and 404 another’s by id', async () => {
      const mine = await t.http.get('/api/runs?pageSize=100').set(as('saltmarsh'));
      expect(mine.body.items.length).toBeGreaterThanOrEqual(2);
      expect(new Set(mine.body.items.map((r: RunBody & { organizationId: number }) => r.organizationId))).toEqual(
        new Set([orgs['Saltmarsh Restoration Works']]),
      );
      const northgateRun = (await t.http.get('/api/runs?kind=as_left').set(as('admin'))).body.items[0];
      expect((await t.http.get(`/api/runs/${northgateRun.id}`).set(as('saltmarsh'))).status).toBe(404);
      expect((await t.http.get(`/api/runs/${northgateRun.id}`).set(as('northgate'))).status).toBe(200);
      expect((await t.http.patch(`/api/runs/${northgateRun.id}`).set(as('northgate')).send({ notes: 'x' })).status).toBe(403);
    });
  });

  describe('POST /api/jobs/:id/runs', () => {
    it('should answer 400 naming the field, including a range of another instrument', async () => {
      const { jobId } = await fresh();
      const other = await fresh();
      const bad = await t.http.post(`/api/jobs/${jobId}/runs`).set(as('tech')).send({ rangeId: 'one', kind: 'as_seen' });
      expect(bad.status).toBe(400);
      expect(bad.body.message).toEqual(expect.arrayContaining(['rangeId must be a whole number', expect.stringContaining('kind must be one of')]));
      const foreign = await t.http.post(`/api/jobs/${jobId}/runs`).set(as('tech')).send({ rangeId: other.rangeIds[0], kind: 'as_found' });
      expect(foreign.status).toBe(400);
      expect(foreign.body.message).toContain('rangeId');
      expect((await t.http.post('/api/jobs/999999/runs').set(as('tech')).send({ rangeId: other.rangeIds[0], kind: 'as_found' })).status).toBe(404);
    });

    it('should let an engineer open studies but not calibrations', async () => {
      const { jobId, rangeIds } = await fresh();
      const calibration = await t.http.post(`/api/jobs/${jobId}/runs`).set(as('engineer')).send({ rangeId: rangeIds[0], kind: 'as_found' });
      expect(calibration.status).toBe(403);
      const study = await t.http
        .post(`/api/jobs/${jobId}/runs`)
        .set(as('engineer'))
        .send({ rangeId: rangeIds[0], kind: 'warmup', supplyVoltage: 230, configuration: 'cold start' });
      expect(study.status).toBe(201);
      expect(study.body).toMatchObject({ kind: 'warmup', status: 'open', supplyVoltage: 230, readingCount: 0, lastSeq: 0, createdByName: 'Ellis Okafor' });
      expect((await t.http.post(`/api/jobs/${jobId}/runs`).set(as('northgate')).send({ rangeId: rangeIds[0], kind: 'warmup' })).status).toBe(403);
    });

    it('should refuse a standard past its due date, and let a lead override it with a reason that is audited', async () => {
      const { jobId, rangeIds } = await fresh();
      const lapsed = standards['Bench counter B (spare)'];
      const body = { rangeId: rangeIds[0], kind: 'as_found', standardId: lapsed };
      const tech = await t.http
        .post(`/api/jobs/${jobId}/runs`)
        .set(as('tech'))
        .send({ ...body, standardOverrideReason: 'I would like to use it anyway' });
      expect(tech.status).toBe(409);
      expect(tech.body.message).toMatch(/Bench counter B \(spare\)" was due for calibration on \d{4}-\d{2}-\d{2}; only a lead can override/);
      const leadWithout = await t.http.post(`/api/jobs/${jobId}/runs`).set(as('lead')).send(body);
      expect(leadWithout.status).toBe(409);
      expect(leadWithout.body.message).toContain('standardOverrideReason');
      const reason = 'Counter A away for repair; B checked against the house reference this morning, within 0.2 ppm.';
      const lead = await t.http
        .post(`/api/jobs/${jobId}/runs`)
        .set(as('lead'))
        .send({ ...body, standardOverrideReason: reason });
      expect(lead.status).toBe(201);
      expect(lead.body).toMatchObject({ standardId: lapsed, standardName: 'Bench counter B (spare)', standardOverrideReason: reason });
      const [audit] = await t.dataSource.query(
        "SELECT actor_id, changes FROM audit_events WHERE entity = 'run' AND entity_id = ? AND action = 'standard_override'",
        [String(lead.body.id)],
      );
      const me = await t.http.get('/api/auth/me').set(as('lead'));
      expect(audit.actor_id).toBe(me.body.id);
      expect(parseChanges(audit.changes)).toMatchObject({ standardId: lapsed, reason });
      // An in-date standard needs no reason.
      const inDate = await t.http
        .post(`/api/jobs/${jobId}/runs`)
        .set(as('tech'))
        .send({ rangeId: rangeIds[0], kind: 'as_left', standardId: standards['Bench counter A'] });
      expect(inDate.status).toBe(201);
    });

    it('should take the bench’s default standard and allow one open run per bench', async () => {
      const { jobId, rangeIds } = await fresh();
      const result = await t.dataSource.query("INSERT INTO benches (name, default_standard_id, active) VALUES ('Runs test bench', ?, 1)", [
        standards['Bench counter A'],
      ]);
      const benchId = result.insertId;
      const first = await t.http.post(`/api/jobs/${jobId}/runs`).set(as('tech')).send({ rangeId: rangeIds[0], kind: 'warmup', benchId });
      expect(first.status).toBe(201);
      expect(first.body).toMatchObject({ benchId, benchName: 'Runs test bench', standardName: 'Bench counter A' });
      const second = await t.http.post(`/api/jobs/${jobId}/runs`).set(as('tech')).send({ rangeId: rangeIds[0], kind: 'stability', benchId });
      expect(second.status).toBe(409);
      expect(second.body.message).toContain(`run ${first.body.id} open`);
    });
  });

  describe('PATCH /api/runs/:id', () => {
    it('should close a run once, audit it, and then refuse readings and changes', async () => {
      const { jobId, rangeIds } = await fresh();
      const runId = await openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind: 'as_found' });
      const noted = await t.http.patch(`/api/runs/${runId}`).set(as('tech')).send({ notes: 'Lid off for the first half.', reason: 'noted after the run' });
      expect(noted.body.notes).toBe('Lid off for the first half.');
      const closed = await t.http.patch(`/api/runs/${runId}`).set(as('tech')).send({ status: 'closed' });
      expect(closed.status).toBe(200);
      expect(closed.body.status).toBe('closed');
      expect(closed.body.endedAt).not.toBeNull();
      expect(closed.body.refusal).toBe(`run ${runId} is closed`);
      expect((await t.http.patch(`/api/runs/${runId}`).set(as('tech')).send({ status: 'closed' })).status).toBe(409);
      expect((await t.http.patch(`/api/runs/${runId}`).set(as('tech')).send({ status: 'open' })).status).toBe(400);
      const readings = await t.http
        .post(`/api/runs/${runId}/readings`)
        .set(as('tech'))
        .send({ readings: [{ dial: 1500, frequency: 1.5e6 }] });
      expect(readings.status).toBe(409);
      expect(readings.body.message).toContain('closed');
      const events = await t.dataSource.query("SELECT action FROM audit_events WHERE entity = 'run' AND entity_id = ? ORDER BY id", [String(runId)]);
      expect(events.map((e: { action: string }) => e.action)).toEqual(['create', 'update', 'status']);
    });
  });
});
