import type { Socket } from 'socket.io-client';
import { INGEST_EVENTS, NAMESPACES, type AttachReply, type IngestBatchReply } from '@kilocycle/common/events';
import { DEMO_CUSTOMERS, DEMO_PASSWORD } from '../../src/seed/demo-seed.js';
import { connect, createBench, createRun, listen, organizationId, request } from '../ingest/ingest-fixtures.js';
import { instrumentWithJob, khzRange, openRun, organizationIds, parseChanges } from '../support/lab-fixtures.js';
import { createTestApp, DEMO, signInDemo, tokenFor, type AsDemo, type TestApp } from '../support/test-app.js';

type AuditRow = { actor_id: number | null; entity: string; entity_id: string; action: string; changes: unknown };
const MEANING = 'reviewed and approved for issue';

describe('who captured the data: reading authors, batch audit events, sign-in audit, no self-signing (e2e, MariaDB)', () => {
  let t: TestApp;
  let url: string;
  let as: AsDemo;
  let ids: Record<'lead' | 'tech' | 'lead2', number>;
  let lead2: { Authorization: string };
  let northgate: number;
  let standardId: number;
  let sockets: Socket[] = [];

  beforeAll(async () => {
    t = await createTestApp();
    url = await listen(t);
    as = await signInDemo(t.http);
    northgate = (await organizationIds(t, as('admin')))[DEMO_CUSTOMERS.northgate]!;
    const labId = (await t.http.get('/api/organizations?kind=lab').set(as('admin'))).body.items[0].id;
    const created = await t.http
      .post('/api/users')
      .set(as('admin'))
      .send({ email: 'second.lead@kilocycle.test', name: 'Second Lead', role: 'lead', organizationId: labId, password: 'second-lead-password' });
    expect(created.status).toBe(201);
    lead2 = { Authorization: `Bearer ${await tokenFor(t.http, 'second.lead@kilocycle.test', 'second-lead-password')}` };
    const users: Array<{ id: number; email: string }> = await t.dataSource.query('SELECT id, email FROM users');
    const idOf = (email: string) => Number(users.find((u) => u.email === email)!.id);
    ids = { lead: idOf(DEMO.lead), tech: idOf(DEMO.tech), lead2: idOf('second.lead@kilocycle.test') };
    const standards = await t.http.get('/api/standards?pageSize=100').set(as('lead'));
    standardId = standards.body.items.find((s: { overdue: boolean; active: boolean }) => !s.overdue && s.active).id;
  });
  afterEach(() => {
    for (const s of sockets) s.disconnect();
    sockets = [];
  });
  afterAll(async () => {
    await t.close();
  });

  const events = async (entity: string, entityId: string | number, action: string): Promise<AuditRow[]> =>
    t.dataSource.query('SELECT actor_id, entity, entity_id, action, changes FROM audit_events WHERE entity = ? AND entity_id = ? AND action = ? ORDER BY id', [
      entity,
      String(entityId),
      action,
    ]);
  /** A job for a 1000–2000 kHz range with an as-found run the technician opened. */
  const technicianJob = async () => {
    const job = await instrumentWithJob(t, as('tech'), { organizationId: northgate, ranges: [khzRange('Main 1000–2000 kHz', 1000, 2000)] });
    const runId = await openRun(t, as('tech'), job.jobId, { rangeId: job.rangeIds[0], kind: 'as_found', standardId });
    return { ...job, runId };
  };
  // Ten settings across the range, each a little high: plainly within ±0.5 % of setting.
  const tenReadings = () => Array.from({ length: 10 }, (_, i) => ({ dial: 1050 + 100 * i, frequency: `${1050 + 100 * i}.15 kHz` }));
  const sign = (headers: { Authorization: string }, jobId: number) =>
    t.http
      .post(`/api/jobs/${jobId}/sign`)
      .set(headers)
      .send({ password: headers === lead2 ? 'second-lead-password' : DEMO_PASSWORD, meaning: MEANING });

  describe('reading authors and one audit event per batch', () => {
    it('should name the user who typed readings, and write one event for the batch in the same request', async () => {
      const { runId } = await technicianJob();
      const res = await t.http.post(`/api/runs/${runId}/readings`).set(as('lead')).send({ readings: tenReadings() });
      expect(res.status).toBe(201);
      expect(res.body.stored[0].author).toEqual({ kind: 'user', id: ids.lead, name: 'Lena Brandt' });
      const rows: Array<{ entered_by: number | null; bench_id: number | null; source: string }> = await t.dataSource.query(
        'SELECT entered_by, bench_id, source FROM readings WHERE run_id = ?',
        [runId],
      );
      expect(rows).toHaveLength(10);
      for (const r of rows) expect(r).toEqual({ entered_by: ids.lead, bench_id: null, source: 'manual' });
      const list = await t.http.get(`/api/runs/${runId}/readings`).set(as('tech'));
      expect(list.body.items.map((r: { author: unknown }) => r.author)).toEqual(Array(10).fill({ kind: 'user', id: ids.lead, name: 'Lena Brandt' }));
      const batch = await events('run', runId, 'readings');
      expect(batch).toHaveLength(1);
      expect(batch[0]!.actor_id).toBe(ids.lead);
      expect(parseChanges(batch[0]!.changes)).toEqual({
        source: 'manual',
        accepted: 10,
        duplicates: 0,
        rejected: 0,
        firstSeq: 1,
        lastSeq: 10,
        author: { kind: 'user', id: ids.lead, name: 'Lena Brandt' },
      });
    });

    it('should name the bench for bridge readings, with one event per stored batch of a multi-batch ingest', async () => {
      const bench = await createBench(t.dataSource, 'Bench East');
      const run = await createRun(t.dataSource, { organizationId: await organizationId(t.dataSource, DEMO_CUSTOMERS.saltmarsh), benchId: bench.benchId });
      const socket = await connect(url, NAMESPACES.ingest, bench.token, sockets);
      expect(await request<AttachReply>(socket, INGEST_EVENTS.attach, { runId: run.runId })).toMatchObject({ ok: true });
      const batch = (from: number, n: number) => Array.from({ length: n }, (_, i) => ({ seq: from + i, t: from + i, frequency: 7_000_000 + from + i }));
      const send = (readings: unknown[]) => request<IngestBatchReply>(socket, INGEST_EVENTS.readings, { runId: run.runId, readings });
      expect(await send(batch(1, 250))).toMatchObject({ ok: true, accepted: 250 });
      expect(await send(batch(251, 250))).toMatchObject({ ok: true, accepted: 250 });
      // Half new, half a resend: one event, counting both.
      expect(await send(batch(376, 250))).toMatchObject({ ok: true, accepted: 125, duplicates: 125 });
      // A pure resend stores nothing and changes nothing: no event.
      expect(await send(batch(1, 250))).toMatchObject({ ok: true, accepted: 0, duplicates: 250 });
      const [authors] = await t.dataSource.query(
        'SELECT COUNT(*) AS n, SUM(bench_id = ?) AS bench, SUM(entered_by IS NULL) AS no_user, SUM(source = ?) AS bridge FROM readings WHERE run_id = ?',
        [bench.benchId, 'bridge', run.runId],
      );
      expect([Number(authors.n), Number(authors.bench), Number(authors.no_user), Number(authors.bridge)]).toEqual([625, 625, 625, 625]);
      const batches = await events('run', run.runId, 'readings');
      expect(batches).toHaveLength(3);
      expect(batches.map((e) => e.actor_id)).toEqual([null, null, null]);
      expect(batches.map((e) => parseChanges(e.changes))).toEqual([
        {
          source: 'bridge',
          accepted: 250,
          duplicates: 0,
          rejected: 0,
          firstSeq: 1,
          lastSeq: 250,
          author: { kind: 'bench', id: bench.benchId, name: 'Bench East' },
        },
        {
          source: 'bridge',
          accepted: 250,
          duplicates: 0,
          rejected: 0,
          firstSeq: 251,
          lastSeq: 500,
          author: { kind: 'bench', id: bench.benchId, name: 'Bench East' },
        },
        {
          source: 'bridge',
          accepted: 125,
          duplicates: 125,
          rejected: 0,
          firstSeq: 501,
          lastSeq: 625,
          author: { kind: 'bench', id: bench.benchId, name: 'Bench East' },
        },
      ]);
      const list = await t.http.get(`/api/runs/${run.runId}/readings?pageSize=1`).set(as('engineer'));
      expect(list.body.items[0].author).toEqual({ kind: 'bench', id: bench.benchId, name: 'Bench East' });
    });

    it('should name the importing user on every imported reading, with one event for the import', async () => {
      const { runId } = await technicianJob();
      const csv = Buffer.from(['dial,frequency', ...tenReadings().map((r) => `${r.dial},${r.frequency}`)].join('\n') + '\n', 'utf8');
      const res = await t.http.post(`/api/runs/${runId}/imports`).set(as('tech')).attach('file', csv, { filename: 'points.csv', contentType: 'text/csv' });
      expect(res.status).toBe(201);
      expect(res.body.imported).toBe(10);
      const [row] = await t.dataSource.query(
        'SELECT COUNT(*) AS n, SUM(entered_by = ?) AS mine, SUM(bench_id IS NULL) AS no_bench FROM readings WHERE run_id = ? AND source = ?',
        [ids.tech, runId, 'import'],
      );
      expect([Number(row.n), Number(row.mine), Number(row.no_bench)]).toEqual([10, 10, 10]);
      expect(await events('run', runId, 'readings')).toHaveLength(0);
      const imports = await events('run', runId, 'import');
      expect(imports).toHaveLength(1);
      expect(imports[0]!.actor_id).toBe(ids.tech);
      expect(parseChanges(imports[0]!.changes)).toMatchObject({ imported: 10, source: 'import', author: { kind: 'user', id: ids.tech, name: 'Tomas Reyes' } });
    });

    it('should audit an exclusion and a budget edit, naming the run and the job', async () => {
      const { runId, jobId, jobNumber } = await technicianJob();
      await t.http.post(`/api/runs/${runId}/readings`).set(as('tech')).send({ readings: tenReadings() }).expect(201);
      const reading = (await t.http.get(`/api/runs/${runId}/readings`).set(as('tech'))).body.items[3];
      await t.http.post(`/api/runs/${runId}/readings/${reading.id}/exclusion`).set(as('tech')).send({ reason: 'counter gate left at 10 ms' }).expect(201);
      expect(parseChanges((await events('reading', reading.id, 'exclude'))[0]!.changes)).toMatchObject({ runId, seq: 4 });
      await t.http.put(`/api/runs/${runId}/budget`).set(as('tech')).send({ driftPpm: 0.5 }).expect(200);
      const budget = await events('run', runId, 'budget');
      expect(budget).toHaveLength(1);
      expect(parseChanges(budget[0]!.changes)).toMatchObject({ jobId, jobNumber, driftPpm: { from: null, to: 0.5 } });
    });
  });

  describe('no self-signing: what the lead did to a job a technician opened', () => {
    const submit = async (jobId: number) => expect((await t.http.post(`/api/jobs/${jobId}/submit`).set(as('tech')).send({})).status).toBe(200);
    const refusedFlag = async (jobId: number) => (await t.http.get(`/api/reviews/${jobId}`).set(as('lead'))).body;

    it('should refuse a lead who only entered readings, naming them, and let another lead sign', async () => {
      const { jobId, runId } = await technicianJob();
      await t.http.post(`/api/runs/${runId}/readings`).set(as('lead')).send({ readings: tenReadings() }).expect(201);
      await submit(jobId);
      const words = `you entered 10 readings of run ${runId}: another lead must sign`;
      const review = await refusedFlag(jobId);
      expect(review.flags).toContainEqual({ kind: 'self_captured', severity: 'blocker', message: words });
      expect(review.canSign).toBe(false);
      expect(review.signBlockers).toContain(words);
      const refused = await sign(as('lead'), jobId);
      expect(refused.status).toBe(403);
      expect(refused.body.message).toBe(`You entered 10 readings of run ${runId}: another lead must sign (or an admin allows self-signing)`);
      expect(parseChanges((await events('job', jobId, 'sign_refused'))[0]!.changes)).toEqual({ reason: words });
      expect((await t.http.get(`/api/reviews/${jobId}`).set(lead2)).body.flags.some((f: { kind: string }) => f.kind === 'self_captured')).toBe(false);
      const signed = await sign(lead2, jobId);
      expect(signed.status).toBe(200);
      expect(signed.body.status).toBe('issued');
    });

    it('should refuse a lead who only excluded one reading, and let another lead sign', async () => {
      const { jobId, runId } = await technicianJob();
      await t.http.post(`/api/runs/${runId}/readings`).set(as('tech')).send({ readings: tenReadings() }).expect(201);
      const reading = (await t.http.get(`/api/runs/${runId}/readings`).set(as('tech'))).body.items[3];
      await t.http.post(`/api/runs/${runId}/readings/${reading.id}/exclusion`).set(as('lead')).send({ reason: 'counter caught a harmonic' }).expect(201);
      await submit(jobId);
      const words = `you excluded reading #4 of run ${runId}: another lead must sign`;
      expect((await refusedFlag(jobId)).signBlockers).toContain(words);
      const refused = await sign(as('lead'), jobId);
      expect(refused.status).toBe(403);
      expect(refused.body.message).toBe(`You excluded reading #4 of run ${runId}: another lead must sign (or an admin allows self-signing)`);
      expect((await sign(lead2, jobId)).status).toBe(200);
    });

    it('should refuse a lead who only edited a budget, and let another lead sign', async () => {
      const { jobId, runId } = await technicianJob();
      await t.http.post(`/api/runs/${runId}/readings`).set(as('tech')).send({ readings: tenReadings() }).expect(201);
      await t.http.put(`/api/runs/${runId}/budget`).set(as('lead')).send({ driftPpm: 0.2 }).expect(200);
      await submit(jobId);
      const words = `you edited the budget of run ${runId}: another lead must sign`;
      expect((await refusedFlag(jobId)).signBlockers).toContain(words);
      const refused = await sign(as('lead'), jobId);
      expect(refused.status).toBe(403);
      expect(refused.body.message).toBe(`You edited the budget of run ${runId}: another lead must sign (or an admin allows self-signing)`);
      expect((await sign(lead2, jobId)).status).toBe(200);
    });

    it('should name every deed together, and let the lead sign once the admin allows self-signing', async () => {
      const { jobId, runId } = await technicianJob();
      await t.http.post(`/api/runs/${runId}/readings`).set(as('lead')).send({ readings: tenReadings() }).expect(201);
      const reading = (await t.http.get(`/api/runs/${runId}/readings`).set(as('tech'))).body.items[3];
      await t.http.post(`/api/runs/${runId}/readings/${reading.id}/exclusion`).set(as('lead')).send({ reason: 'counter caught a harmonic' }).expect(201);
      await t.http.put(`/api/runs/${runId}/budget`).set(as('lead')).send({ driftPpm: 0.2 }).expect(200);
      await submit(jobId);
      const refused = await sign(as('lead'), jobId);
      expect(refused.status).toBe(403);
      expect(refused.body.message).toBe(
        `You entered 10 readings of run ${runId}, excluded reading #4 of run ${runId} and edited the budget of run ${runId}: another lead must sign (or an admin allows self-signing)`,
      );
      await t.http.patch('/api/settings').set(as('admin')).send({ allowSelfSign: true }).expect(200);
      try {
        const review = await refusedFlag(jobId);
        expect(review.flags.find((f: { kind: string }) => f.kind === 'self_captured')).toMatchObject({ severity: 'info' });
        expect((await sign(as('lead'), jobId)).status).toBe(200);
      } finally {
        await t.http.patch('/api/settings').set(as('admin')).send({ allowSelfSign: false }).expect(200);
      }
    });
  });

  describe('sign-in, sign-out and refused sign-ins', () => {
    it('should audit a sign-in and a sign-out with the e-mail and the client address', async () => {
      const login = await t.http.post('/api/auth/login').send({ email: DEMO.engineer, password: DEMO_PASSWORD });
      expect(login.status).toBe(200);
      const userId = login.body.user.id;
      const signIns = await events('user', userId, 'sign_in');
      expect(signIns.length).toBeGreaterThanOrEqual(1);
      const last = signIns[signIns.length - 1]!;
      expect(last.actor_id).toBe(userId);
      expect(parseChanges(last.changes)).toEqual({ email: DEMO.engineer, address: expect.stringMatching(/127\.0\.0\.1|::1/) });
      await t.http
        .post('/api/auth/logout')
        .set({ Authorization: `Bearer ${login.body.accessToken}` })
        .expect(204);
      const out = await events('user', userId, 'sign_out');
      expect(out).toHaveLength(1);
      expect(out[0]!.actor_id).toBe(userId);
      expect(parseChanges(out[0]!.changes)).toEqual({ email: DEMO.engineer, address: expect.stringMatching(/127\.0\.0\.1|::1/) });
    });

    it('should audit refused sign-ins with the e-mail tried and the address, never the password, and a flood of throttled ones once a minute', async () => {
      const wrong = 'not-the-password-4711';
      expect((await t.http.post('/api/auth/login').send({ email: DEMO.tech, password: wrong })).status).toBe(401);
      expect((await t.http.post('/api/auth/login').send({ email: 'nobody@kilocycle.test', password: wrong })).status).toBe(401);
      const onTech = await events('user', ids.tech, 'sign_in_refused');
      expect(onTech).toHaveLength(1);
      expect(onTech[0]!.actor_id).toBeNull();
      expect(parseChanges(onTech[0]!.changes)).toEqual({ email: DEMO.tech, address: expect.stringMatching(/127\.0\.0\.1|::1/), reason: 'wrong password' });
      const unknown = await events('user', 'unknown', 'sign_in_refused');
      expect(parseChanges(unknown[unknown.length - 1]!.changes)).toMatchObject({ email: 'nobody@kilocycle.test', reason: 'unknown e-mail' });
      // Five failures of one account from one address, then that pair must wait; each try meanwhile is a 429.
      for (let i = 0; i < 4; i++) expect((await t.http.post('/api/auth/login').send({ email: DEMO.tech, password: wrong })).status).toBe(401);
      for (let i = 0; i < 5; i++) expect((await t.http.post('/api/auth/login').send({ email: DEMO.tech, password: wrong })).status).toBe(429);
      const refusals = (await events('user', ids.tech, 'sign_in_refused')).map((e) => parseChanges(e.changes).reason);
      expect(refusals.filter((r) => r === 'wrong password')).toHaveLength(5);
      expect(refusals.filter((r) => r === 'too many failed sign-ins')).toHaveLength(1);
      const [{ n }] = await t.dataSource.query("SELECT COUNT(*) AS n FROM audit_events WHERE action LIKE 'sign_%' AND changes LIKE ?", [`%${wrong}%`]);
      expect(Number(n)).toBe(0);
    });
  });
});
