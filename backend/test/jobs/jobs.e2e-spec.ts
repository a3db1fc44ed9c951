import { instrumentWithJob, openRun, organizationIds, parseChanges } from '../support/lab-fixtures.js';
import { createTestApp, DEMO, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

type JobBody = {
  id: number;
  number: string;
  status: string;
  organizationName: string;
  instrumentLabel: string;
  runCount: number;
  returnComment: string | null;
};

describe('jobs and their workflow (e2e, MariaDB)', () => {
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
  const demoJob = async (serial: string): Promise<JobBody> => (await t.http.get(`/api/jobs?q=${serial}`).set(as('admin'))).body.items[0];

  describe('GET /api/jobs', () => {
    it('should page, sort and filter by status (one or several)', async () => {
      const count = async (where = '', params: unknown[] = []) => Number((await t.dataSource.query(`SELECT COUNT(*) AS n FROM jobs ${where}`, params))[0].n);
      const all = await t.http.get('/api/jobs?sort=number&pageSize=3').set(as('tech'));
      expect(all.status).toBe(200);
      expect(all.body.total).toBe(await count());
      expect(all.body.items).toHaveLength(3);
      const numbers = all.body.items.map((j: JobBody) => j.number);
      expect([...numbers].sort()).toEqual(numbers);
      const review = await t.http.get('/api/jobs?status=in_review').set(as('lead'));
      expect(review.body.items.map((j: JobBody) => j.instrumentLabel)).toContain('Harwick Radio SG-4 signal generator s/n N-1041');
      expect(new Set(review.body.items.map((j: JobBody) => j.status))).toEqual(new Set(['in_review']));
      const several = await t.http.get('/api/jobs?status=in_review,in_progress').set(as('lead'));
      expect(several.body.total).toBe(await count("WHERE status IN ('in_review', 'in_progress')"));
      const bad = await t.http.get('/api/jobs?status=lost').set(as('lead'));
      expect(bad.status).toBe(400);
      expect(bad.body.message[0]).toContain('status must be one of');
    });

    it('should carry the run count and filter by instrument and organisation', async () => {
      const job = await demoJob('N-1041');
      expect(job.runCount).toBe(2);
      const northgate = await t.http.get(`/api/jobs?organizationId=${orgs['Northgate Radio Club']}&sort=-number`).set(as('engineer'));
      const [{ n }] = await t.dataSource.query('SELECT COUNT(*) AS n FROM jobs WHERE organization_id = ?', [orgs['Northgate Radio Club']]);
      expect(northgate.body.total).toBe(Number(n));
      expect(northgate.body.items.map((j: JobBody) => j.instrumentLabel)).toEqual(
        expect.arrayContaining([expect.stringContaining('N-1041'), expect.stringContaining('N-1187')]),
      );
    });

    it('should show a client only its organisation’s jobs, 404 another’s by id, and 403 on writes', async () => {
      const mine = await t.http.get('/api/jobs').set(as('saltmarsh'));
      // Only its own organisation's jobs (the demo's current job and its earlier, invoiced visits).
      expect([...new Set(mine.body.items.map((j: JobBody) => j.organizationName))]).toEqual(['Saltmarsh Restoration Works']);
      const northgateJob = await demoJob('N-1041');
      expect((await t.http.get(`/api/jobs/${northgateJob.id}`).set(as('saltmarsh'))).status).toBe(404);
      expect((await t.http.get(`/api/jobs/${northgateJob.id}/runs`).set(as('saltmarsh'))).status).toBe(404);
      expect((await t.http.get(`/api/jobs/${northgateJob.id}`).set(as('northgate'))).status).toBe(200);
      expect((await t.http.patch(`/api/jobs/${northgateJob.id}`).set(as('northgate')).send({ notes: 'hello' })).status).toBe(403);
      expect((await t.http.post('/api/jobs').set(as('northgate')).send({ instrumentId: 1, receivedDate: '2025-01-01' })).status).toBe(403);
    });
  });

  describe('POST /api/jobs', () => {
    it('should answer 400 naming the field', async () => {
      const res = await t.http.post('/api/jobs').set(as('tech')).send({ receivedDate: 'yesterday', humidityPct: 140 });
      expect(res.status).toBe(400);
      expect(res.body.message).toEqual(
        expect.arrayContaining(['instrumentId must be a whole number', 'receivedDate must be a date (YYYY-MM-DD)', 'humidityPct must not be greater than 100']),
      );
      const missing = await t.http.post('/api/jobs').set(as('tech')).send({ instrumentId: 999999, receivedDate: '2025-01-01' });
      expect(missing.status).toBe(400);
      expect(missing.body.message).toContain('instrumentId');
    });

    it('should number the job, start it as received, copy the owner and audit it', async () => {
      const { jobId, jobNumber } = await instrumentWithJob(t, as('tech'), { organizationId: orgs['Saltmarsh Restoration Works'] });
      expect(jobNumber).toMatch(/^J2025-\d{4}$/);
      const job = (await t.http.get(`/api/jobs/${jobId}`).set(as('saltmarsh'))).body;
      expect(job).toMatchObject({ status: 'received', receivedDate: '2025-03-01', organizationName: 'Saltmarsh Restoration Works', runCount: 0 });
      const [audit] = await t.dataSource.query("SELECT action FROM audit_events WHERE entity = 'job' AND entity_id = ?", [String(jobId)]);
      expect(audit.action).toBe('create');
    });

    it('should refuse a second active job for one instrument', async () => {
      const job = await demoJob('N-1187');
      const detail = (await t.http.get(`/api/jobs/${job.id}`).set(as('tech'))).body;
      const res = await t.http.post('/api/jobs').set(as('tech')).send({ instrumentId: detail.instrumentId, receivedDate: '2025-05-01' });
      expect(res.status).toBe(409);
      expect(res.body.message).toContain(job.number);
    });
  });

  describe('PATCH /api/jobs/:id status', () => {
    it('should follow received → in_progress → in_review → returned → in_review, with the rules at each step', async () => {
      const { jobId, rangeIds } = await instrumentWithJob(t, as('tech'), { organizationId: orgs['Northgate Radio Club'] });
      const patch = (who: keyof typeof DEMO, body: Record<string, unknown>) => t.http.patch(`/api/jobs/${jobId}`).set(as(who)).send(body);

      expect((await patch('tech', { status: 'approved' })).status).toBe(409);
      // Opening the first run moves the job on by itself.
      const runId = await openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind: 'as_found' });
      expect((await t.http.get(`/api/jobs/${jobId}`).set(as('tech'))).body.status).toBe('in_progress');
      const empty = await patch('tech', { status: 'in_review' });
      expect(empty.status).toBe(409);
      expect(empty.body.message).toContain('no readings');
      await t.http
        .post(`/api/runs/${runId}/readings`)
        .set(as('tech'))
        .send({ readings: [{ dial: 1500, frequency: '1.4991 MHz' }] });
      expect((await patch('tech', { status: 'in_review', comment: 'Ready' })).body.status).toBe('in_review');

      // While in review the record takes no readings.
      const frozen = await t.http
        .post(`/api/runs/${runId}/readings`)
        .set(as('tech'))
        .send({ readings: [{ dial: 1600, frequency: 1.6e6 }] });
      expect(frozen.status).toBe(409);
      expect(frozen.body.message).toContain('in review');

      // Leaving review is never a plain status change: approval is signing, a return goes with comments and a mail.
      const approve = await patch('lead', { status: 'approved' });
      expect(approve.status).toBe(409);
      expect(approve.body.message).toContain('/sign');
      expect((await patch('lead', { status: 'returned', comment: 'Please add the high end.' })).status).toBe(409);
      const noComment = await t.http.post(`/api/jobs/${jobId}/return`).set(as('lead')).send({});
      expect(noComment.status).toBe(400);
      expect(noComment.body.message.join(' ')).toContain('comment');
      const returned = await t.http.post(`/api/jobs/${jobId}/return`).set(as('lead')).send({ comment: 'Add the high end of the range.' });
      expect(returned.status).toBeLessThan(300);
      expect((await t.http.get(`/api/jobs/${jobId}`).set(as('tech'))).body).toMatchObject({
        status: 'returned',
        returnComment: 'Add the high end of the range.',
      });
      expect(
        (
          await t.http
            .post(`/api/runs/${runId}/readings`)
            .set(as('tech'))
            .send({ readings: [{ dial: 2000, frequency: 1.9987e6 }] })
        ).status,
      ).toBe(201);
      expect((await patch('tech', { status: 'in_review' })).body).toMatchObject({ status: 'in_review', returnComment: null });

      const issued = await patch('lead', { status: 'issued' });
      expect(issued.status).toBe(409);
      expect(issued.body.message).toContain('sign');

      const events = await t.dataSource.query("SELECT changes FROM audit_events WHERE entity = 'job' AND entity_id = ? AND action = 'status' ORDER BY id", [
        String(jobId),
      ]);
      expect(events.map((e: { changes: unknown }) => parseChanges(e.changes).to)).toEqual(['in_progress', 'in_review', 'returned', 'in_review']);
    });

    it('should update the job’s fields and audit from and to', async () => {
      const job = await demoJob('CR7-5520');
      const res = await t.http.patch(`/api/jobs/${job.id}`).set(as('tech')).send({ ambientTempC: 23.5, notes: 'Owner collects on Friday.' });
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ ambientTempC: 23.5, notes: 'Owner collects on Friday.' });
      const [row] = await t.dataSource.query("SELECT changes FROM audit_events WHERE entity = 'job' AND entity_id = ? AND action = 'update'", [String(job.id)]);
      expect(parseChanges(row.changes).ambientTempC).toEqual({ from: 22, to: 23.5 });
    });
  });

  describe('GET /api/audit', () => {
    it('should give a job’s history with its runs, for lab staff only', async () => {
      const job = await demoJob('N-1041');
      const res = await t.http.get(`/api/audit?jobId=${job.id}&sort=at`).set(as('lead'));
      expect(res.status).toBe(200);
      expect(res.body.items.map((e: { entity: string; action: string }) => `${e.entity}:${e.action}`)).toEqual([
        'job:create',
        'run:create',
        'job:status',
        'run:status',
        'run:create',
        'run:status',
        'job:status',
      ]);
      expect(res.body.items[0].actorName).toBe('Tomas Reyes');
      expect((await t.http.get(`/api/audit?entity=job&entityId=${job.id}`).set(as('tech'))).body.total).toBe(3);
      expect((await t.http.get('/api/audit').set(as('northgate'))).status).toBe(403);
    });
  });
});
