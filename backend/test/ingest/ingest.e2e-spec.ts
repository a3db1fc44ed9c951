import type { Socket } from 'socket.io-client';
import { INGEST_EVENTS, NAMESPACES, type AttachReply, type IngestBatchReply, type RefusedEvent } from '@kilocycle/common/events';
import { jest } from '@jest/globals';
import { ReadingsWriter } from '../../src/readings/readings-writer.service.js';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { createTestApp, type TestApp } from '../support/test-app.js';
import { connect, createBench, createRun, listen, organizationId, readingCount, request, type RunFixture } from './ingest-fixtures.js';

describe('/ingest namespace (e2e, MariaDB)', () => {
  let t: TestApp;
  let url: string;
  let sockets: Socket[] = [];
  let bench: { benchId: number; token: string; name: string };
  let other: { benchId: number; token: string; name: string };
  let run: RunFixture;
  let saltmarsh: number;

  beforeAll(async () => {
    t = await createTestApp();
    url = await listen(t);
    saltmarsh = await organizationId(t.dataSource, DEMO_CUSTOMERS.saltmarsh);
    bench = await createBench(t.dataSource);
    other = await createBench(t.dataSource);
    run = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: bench.benchId });
  });
  afterEach(() => {
    for (const s of sockets) s.disconnect();
    sockets = [];
  });
  afterAll(async () => {
    await t.close();
  });

  const attached = async (token = bench.token, runId = run.runId) => {
    const socket = await connect(url, NAMESPACES.ingest, token, sockets);
    const ack = await request<AttachReply>(socket, INGEST_EVENTS.attach, { runId });
    expect(ack).toMatchObject({ ok: true, runId });
    return socket;
  };
  const send = (socket: Socket, payload: unknown) => request<IngestBatchReply>(socket, INGEST_EVENTS.readings, payload);
  const readings = (from: number, n: number) => Array.from({ length: n }, (_, i) => ({ seq: from + i, t: from + i, frequency: 7_000_000 + from + i }));

  describe('handshake', () => {
    it('should refuse a connection without a token, naming what to send', async () => {
      await expect(connect(url, NAMESPACES.ingest, undefined, sockets)).rejects.toMatchObject({
        message: expect.stringContaining('no bench token'),
        data: { code: 'no_token' },
      });
    });

    it('should refuse a wrong token with a reason', async () => {
      await expect(connect(url, NAMESPACES.ingest, 'kcb_not-a-real-token', sockets)).rejects.toMatchObject({
        message: expect.stringContaining('not valid'),
        data: { code: 'bad_token' },
      });
    });

    it('should refuse a deactivated bench', async () => {
      const off = await createBench(t.dataSource);
      await t.dataSource.query('UPDATE benches SET active = 0 WHERE id = ?', [off.benchId]);
      await expect(connect(url, NAMESPACES.ingest, off.token, sockets)).rejects.toMatchObject({ data: { code: 'bench_inactive' } });
    });
  });

  describe('attach', () => {
    it('should answer the run, its last seq and its range', async () => {
      const socket = await connect(url, NAMESPACES.ingest, bench.token, sockets);
      const ack = await request<AttachReply>(socket, INGEST_EVENTS.attach, { runId: run.runId });
      expect(ack).toMatchObject({
        ok: true,
        runId: run.runId,
        lastSeq: 0,
        kind: 'warmup',
        benchId: bench.benchId,
        range: { dialUnit: 'kHz', dialMin: 3500, dialMax: 7500 },
      });
    });

    it("should refuse someone else's run with a reason and an error event, and store nothing", async () => {
      const socket = await connect(url, NAMESPACES.ingest, other.token, sockets);
      const refused = new Promise<RefusedEvent>((resolve) => socket.once(INGEST_EVENTS.refused, resolve));
      const ack = await request<AttachReply>(socket, INGEST_EVENTS.attach, { runId: run.runId });
      expect(ack).toEqual({ ok: false, code: 'not_assigned', error: expect.stringContaining(`not assigned to bench "${other.name}"`) });
      expect(await refused).toMatchObject({ request: 'attach', runId: run.runId, code: 'not_assigned' });
      const batch = await send(socket, { runId: run.runId, readings: readings(1, 3) });
      expect(batch).toMatchObject({ ok: false, code: 'not_attached' });
      expect(await readingCount(t.dataSource, run.runId)).toBe(0);
    });

    it('should refuse a closed run, a run whose job is in review, and a run that does not exist', async () => {
      const closed = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: bench.benchId, status: 'closed' });
      const review = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: bench.benchId, jobStatus: 'in_review' });
      const socket = await connect(url, NAMESPACES.ingest, bench.token, sockets);
      expect(await request(socket, INGEST_EVENTS.attach, { runId: closed.runId })).toEqual({
        ok: false,
        code: 'run_closed',
        error: expect.stringContaining('closed'),
      });
      expect(await request(socket, INGEST_EVENTS.attach, { runId: review.runId })).toEqual({
        ok: false,
        code: 'job_locked',
        error: expect.stringContaining('in review'),
      });
      expect(await request(socket, INGEST_EVENTS.attach, { runId: 999999 })).toEqual({ ok: false, code: 'run_not_found', error: 'there is no run 999999' });
      expect(await request(socket, INGEST_EVENTS.attach, { runId: 'seven' })).toMatchObject({ ok: false, code: 'bad_request' });
    });

    it('should refuse further batches once the run is closed, storing nothing', async () => {
      const closing = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: bench.benchId });
      const socket = await attached(bench.token, closing.runId);
      expect(await send(socket, { runId: closing.runId, readings: readings(1, 2) })).toMatchObject({ ok: true, accepted: 2 });
      await t.dataSource.query("UPDATE runs SET status = 'closed' WHERE id = ?", [closing.runId]);
      expect(await send(socket, { runId: closing.runId, readings: readings(3, 2) })).toMatchObject({ ok: false, code: 'run_closed' });
      expect(await readingCount(t.dataSource, closing.runId)).toBe(2);
    });
  });

  describe('readings', () => {
    it('should store a batch, acknowledge after the commit, and count a resend as duplicates', async () => {
      const fresh = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: bench.benchId });
      const socket = await attached(bench.token, fresh.runId);
      const first = await send(socket, { runId: fresh.runId, readings: readings(1, 100) });
      expect(first).toEqual({ ok: true, runId: fresh.runId, accepted: 100, duplicates: 0, rejected: [], lastSeq: 100, duplicateSeqs: [], conflictSeqs: [] });
      expect(await readingCount(t.dataSource, fresh.runId)).toBe(100);
      const again = await send(socket, { runId: fresh.runId, readings: readings(91, 20) });
      expect(again).toMatchObject({ ok: true, accepted: 10, duplicates: 10, lastSeq: 110 });
      expect(again.ok && again.duplicateSeqs).toEqual(readings(91, 10).map((r) => r.seq));
      // A different reading under a stored seq is a conflict, not a duplicate: the sender renumbers it.
      const clash = await send(socket, {
        runId: fresh.runId,
        readings: [
          { seq: 5, t: 5, frequency: 7_100_000 },
          { seq: 6, t: 6, frequency: 7_000_006 },
        ],
      });
      expect(clash).toMatchObject({ ok: true, accepted: 0, duplicates: 1, duplicateSeqs: [6], conflictSeqs: [5] });
      const [row] = await t.dataSource.query('SELECT COUNT(*) AS n, COUNT(DISTINCT seq) AS d, MIN(source) AS s FROM readings WHERE run_id = ?', [fresh.runId]);
      expect({ n: Number(row.n), d: Number(row.d), s: row.s }).toEqual({ n: 110, d: 110, s: 'bridge' });
      // A new connection continues after the last seq.
      const second = await connect(url, NAMESPACES.ingest, bench.token, sockets);
      expect(await request(second, INGEST_EVENTS.attach, { runId: fresh.runId })).toMatchObject({ ok: true, lastSeq: 110 });
    });

    it('should refuse a batch of 1,001 whole, with a reason', async () => {
      const socket = await attached();
      const before = await readingCount(t.dataSource, run.runId);
      const ack = await send(socket, { runId: run.runId, readings: readings(1, 1001) });
      expect(ack).toEqual({ ok: false, code: 'batch_too_large', error: expect.stringContaining('at most 1000 readings and this one has 1001') });
      expect(await readingCount(t.dataSource, run.runId)).toBe(before);
    });

    it('should answer malformed payloads with a reason and keep the connection', async () => {
      const socket = await attached();
      expect(await send(socket, '{"runId": 1, "readings": [')).toMatchObject({
        ok: false,
        code: 'bad_request',
        error: expect.stringContaining('not valid JSON'),
      });
      expect(await send(socket, 42)).toMatchObject({ ok: false, code: 'bad_request', error: expect.stringContaining('must be an object') });
      expect(await send(socket, null)).toMatchObject({ ok: false, code: 'bad_request' });
      expect(await send(socket, { runId: run.runId, readings: 'lots' })).toMatchObject({
        ok: false,
        code: 'bad_request',
        error: expect.stringContaining('readings must be a list'),
      });
      expect(await send(socket, { readings: [] })).toMatchObject({ ok: false, code: 'bad_request', error: expect.stringContaining('runId') });
      expect(socket.connected).toBe(true);
      expect(await readingCount(t.dataSource, run.runId)).toBe(0);
    });

    it('should accept a batch sent as JSON text', async () => {
      const textRun = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: bench.benchId });
      const socket = await attached(bench.token, textRun.runId);
      expect(await send(socket, JSON.stringify({ runId: textRun.runId, readings: readings(1, 3) }))).toMatchObject({ ok: true, accepted: 3 });
    });

    it('should drop a connection that sends broken packets, and keep serving the others', async () => {
      const good = await attached();
      const bad = await attached();
      const closed = new Promise<string>((resolve) => bad.once('disconnect', resolve));
      // A raw socket.io packet whose JSON is cut off: the parser cannot read it, so no ack can name it.
      bad.io.engine.send('42/ingest,7["readings",{"runId":1,"readings":[{"seq":1,');
      expect(await closed).toBeTruthy();
      const after = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: bench.benchId });
      await request(good, INGEST_EVENTS.attach, { runId: after.runId });
      expect(await send(good, { runId: after.runId, readings: readings(1, 5) })).toMatchObject({ ok: true, accepted: 5 });
      expect(await readingCount(t.dataSource, run.runId)).toBe(0);
    });

    it('should refuse NaN, negative, huge and otherwise bad values one by one with reasons, writing none of them', async () => {
      const socket = await attached();
      const bad = [
        { seq: 1, frequency: NaN },
        { seq: 2, frequency: 'NaN' },
        { seq: 3, frequency: -7_000_000 },
        { seq: 4, frequency: 1e300 },
        { seq: 5, frequency: Infinity },
        { seq: 6, frequency: 0 },
        { seq: 7, frequency: 'seven megacycles' },
        { seq: 8, t: -1, frequency: 7e6 },
        { seq: 9, t: 1e12, frequency: 7e6 },
        { seq: 10, dial: 20_000, frequency: 7e6 },
        { seq: -1, frequency: 7e6 },
        { seq: 1.5, frequency: 7e6 },
        { frequency: 7e6 },
        { seq: 14, frequency: 7e6, aux: 'high' },
        'a reading',
      ];
      const ack = await send(socket, { runId: run.runId, readings: bad });
      if (!ack.ok) throw new Error(ack.error);
      expect(ack.accepted).toBe(0);
      expect(ack.rejected.map((r) => [r.index, r.field])).toEqual([
        [0, 'frequency'],
        [1, 'frequency'],
        [2, 'frequency'],
        [3, 'frequency'],
        [4, 'frequency'],
        [5, 'frequency'],
        [6, 'frequency'],
        [7, 't'],
        [8, 't'],
        [9, 'dial'],
        [10, 'seq'],
        [11, 'seq'],
        [12, 'seq'],
        [13, 'aux'],
        [14, 'reading'],
      ]);
      for (const r of ack.rejected) expect(r.reason.length).toBeGreaterThan(10);
      expect(ack.rejected[2].reason).toMatch(/negative/i);
      expect(ack.rejected[3].reason).toMatch(/limit/);
      expect(await readingCount(t.dataSource, run.runId)).toBe(0);
      // Good readings in a batch with bad ones are stored; the bad ones are each named.
      const mixed = await send(socket, {
        runId: run.runId,
        readings: [
          { seq: 1, frequency: 7e6 },
          { seq: 2, frequency: -1 },
          { seq: 3, frequency: '7.000 001 MHz' },
        ],
      });
      expect(mixed).toMatchObject({ ok: true, accepted: 2, duplicates: 0, rejected: [{ seq: 2, index: 1, field: 'frequency' }], lastSeq: 3 });
    });

    it('should refuse readings for a run the socket has not attached to', async () => {
      const socket = await connect(url, NAMESPACES.ingest, bench.token, sockets);
      expect(await send(socket, { runId: run.runId, readings: readings(50, 1) })).toMatchObject({ ok: false, code: 'not_attached' });
    });

    it('should serve many benches at once, each its own run', async () => {
      const runs = await Promise.all(
        Array.from({ length: 5 }, async () => {
          const b = await createBench(t.dataSource);
          return { b, r: await createRun(t.dataSource, { organizationId: saltmarsh, benchId: b.benchId }) };
        }),
      );
      const acks = await Promise.all(
        runs.map(async ({ b, r }) => {
          const socket = await attached(b.token, r.runId);
          const results = [];
          for (let k = 0; k < 5; k++) results.push(await send(socket, { runId: r.runId, readings: readings(1 + k * 200, 200) }));
          return results;
        }),
      );
      for (const list of acks) expect(list.every((a) => a.ok && a.accepted === 200)).toBe(true);
      for (const { r } of runs) expect(await readingCount(t.dataSource, r.runId)).toBe(1000);
    });
  });

  describe('refusals', () => {
    it('should not let a refused reading with the largest seq move the numbering of later bridges', async () => {
      const fresh = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: bench.benchId });
      const first = await attached(bench.token, fresh.runId);
      // 2147483647 is the largest seq the column holds; the reading is refused for its frequency.
      const refused = await send(first, { runId: fresh.runId, readings: [{ seq: 2_147_483_647, t: 1, frequency: -1 }] });
      expect(refused).toMatchObject({ ok: true, accepted: 0, rejected: [{ seq: 2_147_483_647, field: 'frequency' }] });
      first.disconnect();
      // A later bridge on the same run is told nothing was stored and numbers from 1.
      const later = await connect(url, NAMESPACES.ingest, bench.token, sockets);
      expect(await request<AttachReply>(later, INGEST_EVENTS.attach, { runId: fresh.runId })).toMatchObject({ ok: true, lastSeq: 0 });
      expect(await send(later, { runId: fresh.runId, readings: readings(1, 5) })).toEqual({
        ok: true,
        runId: fresh.runId,
        accepted: 5,
        duplicates: 0,
        rejected: [],
        lastSeq: 5,
        duplicateSeqs: [],
        conflictSeqs: [],
      });
      const third = await connect(url, NAMESPACES.ingest, bench.token, sockets);
      expect(await request<AttachReply>(third, INGEST_EVENTS.attach, { runId: fresh.runId })).toMatchObject({ ok: true, lastSeq: 5 });
      expect(await readingCount(t.dataSource, fresh.runId)).toBe(5);
    });

    it('should refuse with a plain sentence when the database fails, keeping its address and SQL out of the answer', async () => {
      const socket = await attached();
      const events: RefusedEvent[] = [];
      socket.on(INGEST_EVENTS.refused, (e: RefusedEvent) => events.push(e));
      // What mysql2 says when the database is unreachable mid-batch.
      const failure = Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:3317 while running INSERT IGNORE INTO readings (run_id, seq) VALUES (1, 2)'), {
        code: 'ECONNREFUSED',
        errno: -111,
        address: '127.0.0.1',
        port: 3317,
      });
      const writer = t.app.get(ReadingsWriter);
      const spy = jest.spyOn(writer, 'append').mockRejectedValueOnce(failure);
      try {
        const reply = await send(socket, { runId: run.runId, readings: readings(900, 1) });
        expect(reply).toMatchObject({ ok: false, code: 'server_error' });
        const text = JSON.stringify([reply, events]);
        expect(text).toContain('nothing was stored');
        for (const leak of ['127.0.0.1', '3317', 'ECONNREFUSED', 'INSERT', 'readings (']) expect(text).not.toContain(leak);
        expect(events).toHaveLength(1);
      } finally {
        spy.mockRestore();
      }
    });
  });
});
