import type { Socket } from 'socket.io-client';
import { INGEST_EVENTS, NAMESPACES, type AttachReply, type IngestBatchReply } from '@kilocycle/common/events';
import type { QueryRunner } from 'typeorm';
import { AddRunCounters1764950000000 } from '../../src/database/migrations/1764950000000-AddRunCounters.js';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { connect, createBench, createRun, listen, organizationId, request, type RunFixture } from '../ingest/ingest-fixtures.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

// A run's counters (reading_count, excluded_count, last_seq on runs) are kept by the write path in each batch's
// and each exclusion's transaction. Checked here against the readings themselves, counted by MariaDB, after every
// way readings arrive: the bridge (with a replayed batch and a refused reading), typed readings, a CSV import and
// exclusions; and the migration's fill of existing runs.
describe('run counters (e2e, MariaDB)', () => {
  let t: TestApp;
  let url: string;
  let as: AsDemo;
  let run: RunFixture;
  let bench: { benchId: number; token: string };
  let socket: Socket;
  const sockets: Socket[] = [];

  /** What MariaDB counts in the readings tables, and what the run's counters say. */
  const counted = async (runId: number) => {
    const [row] = await t.dataSource.query(
      `SELECT (SELECT COUNT(*) FROM readings WHERE run_id = ?) AS n, (SELECT COALESCE(MAX(seq), 0) FROM readings WHERE run_id = ?) AS last,
              (SELECT COUNT(*) FROM reading_exclusions WHERE run_id = ?) AS x`,
      [runId, runId, runId],
    );
    return { readingCount: Number(row.n), lastSeq: Number(row.last), excludedCount: Number(row.x) };
  };
  const kept = async (runId: number) => {
    const [row] = await t.dataSource.query('SELECT reading_count, last_seq, excluded_count FROM runs WHERE id = ?', [runId]);
    return { readingCount: Number(row.reading_count), lastSeq: Number(row.last_seq), excludedCount: Number(row.excluded_count) };
  };
  const expectKeptEqualsCounted = async (runId: number, expected: { readingCount: number; lastSeq: number; excludedCount: number }) => {
    expect(await counted(runId)).toEqual(expected);
    expect(await kept(runId)).toEqual(expected);
    // The run's page and the runs list show the counters.
    const page = await t.http.get(`/api/runs/${runId}`).set(as('lead'));
    expect(page.status).toBe(200);
    expect(page.body).toMatchObject(expected);
  };
  const batch = (from: number, to: number) =>
    Array.from({ length: to - from + 1 }, (_, i) => ({ seq: from + i, t: (from + i) * 0.5, frequency: 7_050_000 + from + i }));
  const send = (readings: unknown[]) => request<IngestBatchReply>(socket, INGEST_EVENTS.readings, { runId: run.runId, readings });

  beforeAll(async () => {
    t = await createTestApp();
    url = await listen(t);
    as = await signInDemo(t.http);
    bench = await createBench(t.dataSource);
    run = await createRun(t.dataSource, { organizationId: await organizationId(t.dataSource, DEMO_CUSTOMERS.saltmarsh), benchId: bench.benchId });
    socket = await connect(url, NAMESPACES.ingest, bench.token, sockets);
    expect(await request<AttachReply>(socket, INGEST_EVENTS.attach, { runId: run.runId })).toMatchObject({ ok: true, lastSeq: 0 });
  });
  afterAll(async () => {
    for (const s of sockets) s.disconnect();
    await t.close();
  });

  it('should start a new run at zero', async () => {
    await expectKeptEqualsCounted(run.runId, { readingCount: 0, lastSeq: 0, excludedCount: 0 });
  });

  it('should follow the bridge, a replayed batch, an overlapping batch and a refused reading', async () => {
    expect(await send(batch(1, 50))).toMatchObject({ ok: true, accepted: 50, lastSeq: 50 });
    await expectKeptEqualsCounted(run.runId, { readingCount: 50, lastSeq: 50, excludedCount: 0 });
    // The same batch again (a bridge that lost the acknowledgement): nothing new is stored or counted.
    expect(await send(batch(1, 50))).toMatchObject({ ok: true, accepted: 0, duplicates: 50, lastSeq: 50 });
    await expectKeptEqualsCounted(run.runId, { readingCount: 50, lastSeq: 50, excludedCount: 0 });
    // 41–60: ten stored before, ten new; and a reading at seq 99 with no frequency is refused and not counted.
    const overlap = await send([...batch(41, 60), { seq: 99, t: 1 }]);
    expect(overlap).toMatchObject({ ok: true, accepted: 10, duplicates: 10, lastSeq: 60 });
    expect(overlap.ok && overlap.rejected.map((r) => r.seq)).toEqual([99]);
    await expectKeptEqualsCounted(run.runId, { readingCount: 60, lastSeq: 60, excludedCount: 0 });
    // A batch that starts after a gap moves the last seq to its top.
    expect(await send(batch(101, 105))).toMatchObject({ ok: true, accepted: 5, lastSeq: 105 });
    await expectKeptEqualsCounted(run.runId, { readingCount: 65, lastSeq: 105, excludedCount: 0 });
  });

  it('should follow typed readings, numbered after the last seq, and refuse a bad batch without counting it', async () => {
    const typed = await t.http
      .post(`/api/runs/${run.runId}/readings`)
      .set(as('engineer'))
      .send({ readings: [{ frequency: '7.051 MHz' }, { frequency: 7_051_100 }] });
    expect(typed.status).toBe(201);
    expect(typed.body).toMatchObject({ accepted: 2, lastSeq: 107 });
    await expectKeptEqualsCounted(run.runId, { readingCount: 67, lastSeq: 107, excludedCount: 0 });
    const refused = await t.http
      .post(`/api/runs/${run.runId}/readings`)
      .set(as('engineer'))
      .send({ readings: [{ frequency: 7_051_200 }, { frequency: 'not a number' }] });
    expect(refused.status).toBe(400);
    await expectKeptEqualsCounted(run.runId, { readingCount: 67, lastSeq: 107, excludedCount: 0 });
  });

  it('should follow a CSV import in one transaction, and a refused file not at all', async () => {
    const rows = Array.from({ length: 30 }, (_, i) => `${200 + i},${7_052_000 + i}`);
    const file = Buffer.from(['Elapsed (s),Counter (Hz)', ...rows].join('\n') + '\n', 'utf8');
    const res = await t.http.post(`/api/runs/${run.runId}/imports`).set(as('engineer')).attach('file', file, { filename: 'log.csv', contentType: 'text/csv' });
    expect(res.status).toBe(201);
    expect(res.body.imported).toBe(30);
    await expectKeptEqualsCounted(run.runId, { readingCount: 97, lastSeq: 137, excludedCount: 0 });
    const bad = Buffer.from(['Elapsed (s),Counter (Hz)', '300,7052000', '301,abc'].join('\n') + '\n', 'utf8');
    const refused = await t.http
      .post(`/api/runs/${run.runId}/imports`)
      .set(as('engineer'))
      .attach('file', bad, { filename: 'bad.csv', contentType: 'text/csv' });
    expect(refused.status).toBe(400);
    await expectKeptEqualsCounted(run.runId, { readingCount: 97, lastSeq: 137, excludedCount: 0 });
  });

  it('should follow exclusions, and not count a second exclusion of the same reading', async () => {
    const [a, b] = await t.dataSource.query('SELECT id FROM readings WHERE run_id = ? AND seq IN (5, 6) ORDER BY seq', [run.runId]);
    for (const reading of [a, b]) {
      const res = await t.http.post(`/api/runs/${run.runId}/readings/${reading.id}/exclusion`).set(as('engineer')).send({ reason: 'Counter gate glitch' });
      expect(res.status).toBe(201);
    }
    const again = await t.http.post(`/api/runs/${run.runId}/readings/${a.id}/exclusion`).set(as('engineer')).send({ reason: 'Twice' });
    expect(again.status).toBe(409);
    await expectKeptEqualsCounted(run.runId, { readingCount: 97, lastSeq: 137, excludedCount: 2 });
    // The readings list takes its totals from the counters.
    const list = await t.http.get(`/api/runs/${run.runId}/readings?excluded=false&pageSize=10&page=10`).set(as('engineer'));
    expect(list.body.total).toBe(95);
    expect(list.body.items.map((r: { seq: number }) => r.seq)).toEqual([133, 134, 135, 136, 137]);
    expect((await t.http.get(`/api/runs/${run.runId}/readings?excluded=true`).set(as('engineer'))).body.total).toBe(2);
  });

  it('should read a page past the middle from the other end in the same order as from the start', async () => {
    const fromStart = await t.http.get(`/api/runs/${run.runId}/readings?pageSize=40&page=1&sort=-seq`).set(as('engineer'));
    const secondHalf = await t.http.get(`/api/runs/${run.runId}/readings?pageSize=20&page=2&sort=-seq`).set(as('engineer'));
    const lastPage = await t.http.get(`/api/runs/${run.runId}/readings?pageSize=20&page=5&sort=-seq`).set(as('engineer'));
    const all = (await t.dataSource.query('SELECT seq FROM readings WHERE run_id = ? ORDER BY seq DESC', [run.runId])).map((r: { seq: number }) =>
      Number(r.seq),
    );
    expect(fromStart.body.items.map((r: { seq: number }) => r.seq)).toEqual(all.slice(0, 40));
    expect(secondHalf.body.items.map((r: { seq: number }) => r.seq)).toEqual(all.slice(20, 40));
    expect(lastPage.body.items.map((r: { seq: number }) => r.seq)).toEqual(all.slice(80, 97));
  });

  it('should answer each of many batches sent at once with exactly what it stored, whichever transaction wrote it', async () => {
    // Five benches on five runs send at the same moment, one of them the same batch twice: the write path may put
    // several batches in one transaction, and each answer, counter and audit event must still be its own.
    const org = await organizationId(t.dataSource, DEMO_CUSTOMERS.saltmarsh);
    const lanes = await Promise.all(
      Array.from({ length: 5 }, async () => {
        const own = await createBench(t.dataSource);
        const ownRun = await createRun(t.dataSource, { organizationId: org, benchId: own.benchId });
        const s = await connect(url, NAMESPACES.ingest, own.token, sockets);
        expect(await request<AttachReply>(s, INGEST_EVENTS.attach, { runId: ownRun.runId })).toMatchObject({ ok: true });
        return { socket: s, runId: ownRun.runId };
      }),
    );
    const sendTo = (lane: (typeof lanes)[number], readings: unknown[]) =>
      request<IngestBatchReply>(lane.socket, INGEST_EVENTS.readings, { runId: lane.runId, readings });
    const [twiceA, twiceB, ...others] = await Promise.all([
      sendTo(lanes[0]!, batch(1, 300)),
      sendTo(lanes[0]!, batch(1, 300)),
      ...lanes.slice(1).map((lane, i) => sendTo(lane, batch(1, 100 * (i + 1)))),
    ]);
    // The same batch twice: one stored it, the other found it stored.
    expect([twiceA, twiceB].map((a) => (a.ok ? [a.accepted, a.duplicates, a.lastSeq] : a)).sort()).toEqual([
      [0, 300, 300],
      [300, 0, 300],
    ]);
    others.forEach((ack, i) => expect(ack).toMatchObject({ ok: true, accepted: 100 * (i + 1), duplicates: 0, lastSeq: 100 * (i + 1) }));
    for (const [i, lane] of lanes.entries()) {
      const n = i === 0 ? 300 : 100 * i;
      await expectKeptEqualsCounted(lane.runId, { readingCount: n, lastSeq: n, excludedCount: 0 });
      // One audit event per batch that stored something, with its own counts.
      const events = await t.dataSource.query("SELECT changes FROM audit_events WHERE entity = 'run' AND entity_id = ? AND action = 'readings'", [
        String(lane.runId),
      ]);
      expect(events.map((e: { changes: unknown }) => (typeof e.changes === 'string' ? JSON.parse(e.changes) : e.changes).accepted)).toEqual([n]);
    }
  });

  it("should fill every existing run's counters from its readings when the migration runs", async () => {
    const runner: QueryRunner = t.dataSource.createQueryRunner();
    const migration = new AddRunCounters1764950000000();
    try {
      await migration.down(runner);
      await migration.up(runner);
    } finally {
      await runner.release();
    }
    const runs: Array<{ id: number }> = await t.dataSource.query('SELECT id FROM runs');
    expect(runs.length).toBeGreaterThan(5);
    for (const { id } of runs) expect(await kept(id)).toEqual(await counted(id));
    expect(await kept(run.runId)).toEqual({ readingCount: 97, lastSeq: 137, excludedCount: 2 });
  });
});
