// The capture guardrail of issue 12: a frequency outside the range's nominal span by more than 10 % of
// the span is refused with what it was read as and what was probably meant, on every way in (REST,
// bench ingest, CSV import), unless a person confirms it. The expected sentences are worked by hand:
// limits fMin − 0.1·span … fMax + 0.1·span; the probable value is the reading × 10³.
import type { Socket } from 'socket.io-client';
import { INGEST_EVENTS, NAMESPACES, type AttachReply, type IngestBatchReply } from '@kilocycle/common/events';
import type { ImportReport } from '@kilocycle/common/types';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { connect, createBench, createRun, listen, organizationId, readingCount, request } from '../ingest/ingest-fixtures.js';
import { instrumentWithJob, khzRange, openRun, organizationIds } from '../support/lab-fixtures.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

const SLIP_1900 = '1900 read as 1.900 kHz, outside this range (1 750–2 000 kHz) by more than 10 % of its span; did you mean 1 900 kHz?';
// The ingest fixtures' range is 3 500–7 500 kHz (limits 3 100–7 900 kHz).
const SLIP_7001 = '7001 read as 7.001 kHz, outside this range (3 500–7 500 kHz) by more than 10 % of its span; did you mean 7 001 kHz?';

describe('capture guardrail: readings outside the range span (e2e, MariaDB)', () => {
  let t: TestApp;
  let as: AsDemo;
  let orgs: Record<string, number>;
  let url: string;
  let sockets: Socket[] = [];
  beforeAll(async () => {
    t = await createTestApp();
    url = await listen(t);
    as = await signInDemo(t.http);
    orgs = await organizationIds(t, as('admin'));
  });
  afterEach(() => {
    for (const s of sockets) s.disconnect();
    sockets = [];
  });
  afterAll(async () => {
    await t.close();
  });
  const count = (runId: number) => readingCount(t.dataSource, runId);
  const rangeA = () => [khzRange('A  1750–2000 kHz', 1750, 2000)];
  const freshRun = async (kind = 'as_found') => {
    const { jobId, rangeIds } = await instrumentWithJob(t, as('tech'), { organizationId: orgs['Northgate Radio Club']!, ranges: rangeA() });
    const standardId = Number(
      (await t.dataSource.query("SELECT id FROM standards WHERE kind = 'counter' AND active = 1 AND due_date >= CURRENT_DATE() LIMIT 1"))[0].id,
    );
    return openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind, standardId });
  };
  const post = (runId: number, readings: unknown[]) => t.http.post(`/api/runs/${runId}/readings`).set(as('tech')).send({ readings });

  describe('POST /api/runs/:id/readings', () => {
    it('refuses dial 1900 with counter "1900" on 1.75–2.0 MHz with 422, says what it was read as and meant, and stores nothing', async () => {
      const runId = await freshRun();
      const res = await post(runId, [{ dial: 1900, frequency: '1900' }]);
      expect(res.status).toBe(422);
      expect(res.body.message).toEqual([`readings[0].frequency: ${SLIP_1900}`]);
      expect(res.body.rejected).toEqual([{ seq: null, index: 0, field: 'frequency', reason: SLIP_1900, confirmable: true }]);
      expect(res.body.hint).toContain('confirmed: true');
      expect(await count(runId)).toBe(0);
    });

    it('stores the same reading as given when it is confirmed', async () => {
      const runId = await freshRun();
      const res = await post(runId, [{ dial: 1900, frequency: '1900', confirmed: true }]);
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ accepted: 1, rejected: [] });
      const rows = await t.dataSource.query('SELECT dial, frequency_hz, source FROM readings WHERE run_id = ?', [runId]);
      expect(rows.map((r: Record<string, unknown>) => [Number(r.dial), Number(r.frequency_hz), r.source])).toEqual([[1900, 1900, 'manual']]);
    });

    it('takes a reading just inside the margin and refuses one just outside (limits 1 725 and 2 025 kHz)', async () => {
      const runId = await freshRun();
      expect(
        (
          await post(runId, [
            { dial: 1750, frequency: '1725 kHz' },
            { dial: 2000, frequency: '2025 kHz' },
          ])
        ).status,
      ).toBe(201);
      const low = await post(runId, [{ dial: 1750, frequency: '1724.9 kHz' }]);
      expect(low.status).toBe(422);
      expect(low.body.message[0]).toBe(
        'readings[0].frequency: 1724.9 kHz read as 1 724.900 kHz, outside this range (1 750–2 000 kHz) by more than 10 % of its span; check the unit and the reading',
      );
      expect(await count(runId)).toBe(2);
    });

    it('answers 400 when a plain error comes with the slip (a slip alone is not enough to confirm past it), and stores nothing', async () => {
      const runId = await freshRun();
      const res = await post(runId, [
        { dial: 1900, frequency: '1900' },
        { dial: 'nineteen', frequency: '1900 kHz' },
      ]);
      expect(res.status).toBe(400);
      expect(res.body.message).toEqual([`readings[0].frequency: ${SLIP_1900}`, expect.stringContaining('readings[1].dial:')]);
      const bad = await post(runId, [{ dial: 1900, frequency: '1900', confirmed: 'yes' }]);
      expect(bad.status).toBe(400);
      expect(bad.body.message).toEqual(['readings[0].confirmed: confirmed must be true or false']);
      expect(await count(runId)).toBe(0);
    });

    it('checks a warm-up run against its range too', async () => {
      const runId = await freshRun('warmup');
      const res = await post(runId, [{ t: 5, frequency: 1.9 }]);
      expect(res.status).toBe(422);
      expect(res.body.message[0]).toBe(
        'readings[0].frequency: 1.9 read as 1.9 Hz, outside this range (1 750–2 000 kHz) by more than 10 % of its span; did you mean 1 900 kHz?',
      );
      expect(await count(runId)).toBe(0);
    });
  });

  describe('bench ingest', () => {
    it('counts a reading outside the span as rejected with the reason, ignores confirmed from a bench, and stores the rest', async () => {
      const saltmarsh = await organizationId(t.dataSource, DEMO_CUSTOMERS.saltmarsh);
      const bench = await createBench(t.dataSource);
      const run = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: bench.benchId });
      const socket = await connect(url, NAMESPACES.ingest, bench.token, sockets);
      expect(await request<AttachReply>(socket, INGEST_EVENTS.attach, { runId: run.runId })).toMatchObject({ ok: true });
      const ack = await request<IngestBatchReply>(socket, INGEST_EVENTS.readings, {
        runId: run.runId,
        readings: [
          { seq: 1, t: 1, frequency: 7_001_000 },
          { seq: 2, t: 2, frequency: 7001 },
          { seq: 3, t: 3, frequency: 7001, confirmed: true },
          { seq: 4, t: 4, frequency: 7_001_100 },
        ],
      });
      expect(ack).toMatchObject({ ok: true, accepted: 2, duplicates: 0 });
      expect((ack as { rejected: unknown[] }).rejected).toEqual([
        { seq: 2, index: 1, field: 'frequency', reason: SLIP_7001 },
        { seq: 3, index: 2, field: 'frequency', reason: `${SLIP_7001} (a bench cannot confirm a reading outside the span)` },
      ]);
      expect(await count(run.runId)).toBe(2);
    });
  });

  describe('CSV import', () => {
    const csv = Buffer.from(['time,frequency', '0,7001000', '10,7001', '20,7002000'].join('\n') + '\n', 'utf8');
    const upload = (runId: number, query: Record<string, string>) =>
      t.http.post(`/api/runs/${runId}/imports`).query(query).set(as('tech')).attach('file', csv, { filename: 'log.csv', contentType: 'text/csv' });
    const newRun = async () => (await createRun(t.dataSource, { organizationId: orgs['Saltmarsh Restoration Works']!, benchId: null, kind: 'warmup' })).runId;

    it('mode=all: refuses the file naming the row outside the span, and writes nothing', async () => {
      const runId = await newRun();
      const res = await upload(runId, {});
      expect(res.status).toBe(400);
      const body = res.body as ImportReport;
      expect(body.rejected).toEqual([{ line: 3, column: 'frequency', reason: SLIP_7001 }]);
      expect(await count(runId)).toBe(0);
    });

    it('mode=valid: skips the row with its reason like any other bad row', async () => {
      const runId = await newRun();
      const res = await upload(runId, { mode: 'valid' });
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ imported: 2, rejectedCount: 1, rejected: [{ line: 3, column: 'frequency', reason: SLIP_7001 }] });
      expect(await count(runId)).toBe(2);
    });

    it('confirmed=true: stores every row as given; a bad value of confirmed is a 400', async () => {
      const runId = await newRun();
      const res = await upload(runId, { confirmed: 'true' });
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ imported: 3, rejectedCount: 0 });
      const rows = await t.dataSource.query('SELECT frequency_hz FROM readings WHERE run_id = ? ORDER BY seq', [runId]);
      expect(rows.map((r: { frequency_hz: number }) => Number(r.frequency_hz))).toEqual([7_001_000, 7001, 7_002_000]);
      const bad = await upload(await newRun(), { confirmed: 'perhaps' });
      expect(bad.status).toBe(400);
      expect(bad.body.message).toEqual(expect.arrayContaining(['confirmed must be true or false']));
    });
  });
});
