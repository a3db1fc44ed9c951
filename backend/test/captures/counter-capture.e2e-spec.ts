import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PassThrough, Writable } from 'node:stream';
import type { Socket } from 'socket.io-client';
import {
  INGEST_EVENTS,
  LIVE_EVENTS,
  NAMESPACES,
  type IngestBatchReply,
  type JoinReply,
  type LiveBridgeEvent,
  type LiveCaptureEvent,
} from '@kilocycle/common/events';
import type { CaptureStatus, CounterCapture, JobResults, Run } from '@kilocycle/common/types';
import { Bridge } from '../../src/bridge/bridge.js';
import { StdinSource } from '../../src/bridge/sources/stdin-source.js';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { connect, createBench, createRun, listen, organizationId, request, type RunFixture } from '../ingest/ingest-fixtures.js';
import { createTestApp, signInDemo, tokenFor, DEMO, type AsDemo, type TestApp } from '../support/test-app.js';

/**
 * Bridge presence and counter-assisted capture. Expected values are worked by hand from the readings sent
 * (the settle rule: the last N within the band; mean and sample SD of those N, GUM 4.2.2).
 */
describe('bridge presence and counter-assisted capture (e2e, MariaDB)', () => {
  let t: TestApp;
  let url: string;
  let as: AsDemo;
  let org: number;
  let techToken: string;
  let sockets: Socket[] = [];
  let procedureId: number;

  beforeAll(async () => {
    t = await createTestApp();
    url = await listen(t);
    as = await signInDemo(t.http);
    techToken = await tokenFor(t.http, DEMO.tech);
    org = await organizationId(t.dataSource, DEMO_CUSTOMERS.saltmarsh);
    const [procedure] = await t.dataSource.query('SELECT id FROM procedures WHERE is_default = 1');
    procedureId = Number(procedure.id);
  });
  afterEach(() => {
    for (const s of sockets) s.disconnect();
    sockets = [];
  });
  afterAll(async () => {
    await t.close();
  });

  /** An as-found run on a fresh bench (3.5–7.5 MHz, dial in kHz) with a reference standard, so its budget can be stated. */
  const calibrationRun = async (): Promise<RunFixture & { token: string; benchId: number }> => {
    const bench = await createBench(t.dataSource);
    const run = await createRun(t.dataSource, { organizationId: org, benchId: bench.benchId, kind: 'as_found' });
    const [standard] = await t.dataSource.query('SELECT id FROM standards ORDER BY due_date DESC LIMIT 1');
    await t.dataSource.query('UPDATE runs SET standard_id = ? WHERE id = ?', [standard.id, run.runId]);
    return { ...run, token: bench.token, benchId: bench.benchId };
  };
  const attachBridge = async (token: string, runId: number) => {
    const socket = await connect(url, NAMESPACES.ingest, token, sockets);
    expect(await request(socket, INGEST_EVENTS.attach, { runId })).toMatchObject({ ok: true });
    return socket;
  };
  const watch = async (runId: number) => {
    const page = await connect(url, NAMESPACES.live, techToken, sockets);
    expect(await request<JoinReply>(page, LIVE_EVENTS.join, { runId })).toMatchObject({ ok: true });
    return page;
  };
  const nextCapture = (page: Socket, status: CaptureStatus) =>
    new Promise<LiveCaptureEvent>((resolve) => {
      const on = (event: LiveCaptureEvent) => {
        if (event.capture.status !== status) return;
        page.off(LIVE_EVENTS.capture, on);
        resolve(event);
      };
      page.on(LIVE_EVENTS.capture, on);
    });
  const getRun = async (runId: number) => (await t.http.get(`/api/runs/${runId}`).set(as('tech')).expect(200)).body as Run;
  let seq = 0;
  const send = (socket: Socket, runId: number, frequencies: number[]) =>
    request<IngestBatchReply>(socket, INGEST_EVENTS.readings, { runId, readings: frequencies.map((frequency) => ({ seq: ++seq, frequency })) });

  describe('bridge presence', () => {
    it('should show no bridge on a run none has fed, Live while one is attached, and offline since it dropped, pushing each change to the room', async () => {
      const run = await calibrationRun();
      expect((await getRun(run.runId)).bridge).toEqual({ connected: false, since: null, lastReadingAt: null });

      const page = await watch(run.runId);
      const online = new Promise<LiveBridgeEvent>((resolve) => page.once(LIVE_EVENTS.bridge, resolve));
      const before = Date.now();
      const bridge = await attachBridge(run.token, run.runId);
      const up = await online;
      expect(up).toMatchObject({ runId: run.runId, connected: true });
      expect(Date.parse(up.since)).toBeGreaterThanOrEqual(before - 5);
      const live = (await getRun(run.runId)).bridge;
      expect(live).toEqual({ connected: true, since: up.since, lastReadingAt: null });

      const offline = new Promise<LiveBridgeEvent>((resolve) => page.once(LIVE_EVENTS.bridge, resolve));
      bridge.disconnect();
      const down = await offline;
      expect(down).toMatchObject({ runId: run.runId, connected: false });
      expect(Date.parse(down.since)).toBeGreaterThanOrEqual(Date.parse(up.since));
      expect((await getRun(run.runId)).bridge).toMatchObject({ connected: false, since: down.since });
    });

    it('should keep showing no bridge on a run with typed readings only, with the age of its newest reading', async () => {
      const run = await calibrationRun();
      await t.http
        .post(`/api/runs/${run.runId}/readings`)
        .set(as('tech'))
        .send({ readings: [{ dial: 5000, frequency: 5_000_100 }] })
        .expect(201);
      const bridge = (await getRun(run.runId)).bridge;
      expect(bridge.connected).toBe(false);
      expect(bridge.since).toBeNull();
      expect(Date.now() - Date.parse(bridge.lastReadingAt!)).toBeLessThan(60_000);
    });
  });

  describe('refusals', () => {
    it('should refuse a setting with a 409 naming the problem when no bridge is connected, and store nothing', async () => {
      const run = await calibrationRun();
      const answer = await t.http.post(`/api/runs/${run.runId}/capture`).set(as('tech')).send({ dial: 5000 }).expect(409);
      expect(answer.body.message).toContain(`no bridge is connected for run ${run.runId}`);
      // Once a bridge has come and gone, the refusal says since when it is offline.
      (await attachBridge(run.token, run.runId)).disconnect();
      await new Promise((resolve) => setTimeout(resolve, 100));
      const again = await t.http.post(`/api/runs/${run.runId}/capture`).set(as('tech')).send({ dial: 5000 }).expect(409);
      expect(again.body.message).toMatch(/offline since \d\d:\d\d:\d\d UTC/);
      const [{ n }] = await t.dataSource.query('SELECT COUNT(*) AS n FROM readings WHERE run_id = ?', [run.runId]);
      expect(Number(n)).toBe(0);
    });

    it('should refuse a dial it cannot read or outside the span (400), a study run (409), a client (403) and a second setting while one waits (409)', async () => {
      const run = await calibrationRun();
      await attachBridge(run.token, run.runId);
      expect((await t.http.post(`/api/runs/${run.runId}/capture`).set(as('tech')).send({ dial: 'abc' }).expect(400)).body.message).toMatch(/^dial: /);
      expect((await t.http.post(`/api/runs/${run.runId}/capture`).set(as('tech')).send({ dial: 9000 }).expect(400)).body.message).toContain(
        'outside the range',
      );
      await t.http.post(`/api/runs/${run.runId}/capture`).set(as('tech')).send({}).expect(400);
      await t.http
        .post(`/api/runs/${run.runId}/capture`)
        .set(as('tech'))
        .send({ dial: { x: 1 } })
        .expect(400);
      await t.http.post(`/api/runs/${run.runId}/capture`).set(as('saltmarsh')).send({ dial: 5000 }).expect(403);
      const study = await createRun(t.dataSource, { organizationId: org, benchId: run.benchId, kind: 'warmup' });
      expect((await t.http.post(`/api/runs/${study.runId}/capture`).set(as('tech')).send({ dial: 5000 }).expect(409)).body.message).toContain('warm-up run');
      await t.http.post(`/api/runs/${run.runId}/capture`).set(as('tech')).send({ dial: 5000 }).expect(201);
      expect((await t.http.post(`/api/runs/${run.runId}/capture`).set(as('tech')).send({ dial: 6000 }).expect(409)).body.message).toContain(
        'dial 5000 is still waiting',
      );
      await t.http.delete(`/api/runs/${run.runId}/capture`).set(as('tech')).expect(200);
    });
  });

  describe('capture', () => {
    it('should take only counter readings after Enter, store the mean of the last N that agree with the links, and use their spread for repeatability', async () => {
      const run = await calibrationRun();
      const bridge = await attachBridge(run.token, run.runId);
      // Before a setting waits, a reading without a dial is refused in an as-found run (as it always was).
      const early = await send(bridge, run.runId, [5_000_000]);
      expect(early).toMatchObject({ ok: true, accepted: 0, rejected: [{ field: 'dial' }] });

      const page = await watch(run.runId);
      const settled = nextCapture(page, 'settled');
      const started = await t.http.post(`/api/runs/${run.runId}/capture`).set(as('tech')).send({ dial: '5000' }).expect(201);
      expect(started.body).toMatchObject({ runId: run.runId, dial: 5000, status: 'waiting', count: 0, settleCount: 5, toleranceHz: 5, timeoutS: 30 });
      const progress = nextCapture(page, 'waiting');
      // Still warming: the first is 90 Hz away. Then five within 3 Hz (≤ 5 Hz): 10, 12, 11, 13, 12 Hz above 5 MHz.
      await send(bridge, run.runId, [5_000_100, 5_000_010]);
      const waiting = await progress;
      expect(waiting.capture).toMatchObject({ status: 'waiting', count: 2, spreadHz: 90, lastHz: 5_000_010 });
      await send(bridge, run.runId, [5_000_012, 5_000_011]);
      await send(bridge, run.runId, [5_000_013, 5_000_012]);
      const { capture } = await settled;
      // By hand: mean = 5 000 000 + 58/5 = 5 000 011.6; deviations −1.6, 0.4, −0.6, 1.4, 0.4; s² = 5.2/4 = 1.3.
      expect(capture.status).toBe('settled');
      expect(capture.n).toBe(5);
      expect(capture.mean).toBeCloseTo(5_000_011.6, 6);
      expect(capture.sd).toBeCloseTo(Math.sqrt(1.3), 9);
      expect(capture.reading).toMatchObject({ dial: 5000, source: 'bridge' });
      expect(capture.reading!.frequency).toBeCloseTo(5_000_011.6, 6);
      expect(Date.parse(capture.settledAt!)).toBeGreaterThanOrEqual(Date.parse(capture.startedAt));

      const [row] = await t.dataSource.query('SELECT * FROM counter_captures WHERE run_id = ?', [run.runId]);
      expect(row).toMatchObject({ dial: 5000, n: 5, settle_count: 5, tolerance_hz: 5, spread_hz: 3 });
      const linked = await t.dataSource.query(
        'SELECT s.frequency_hz FROM counter_capture_samples cs JOIN readings s ON s.id = cs.reading_id WHERE cs.capture_id = ? ORDER BY s.seq',
        [row.id],
      );
      expect(linked.map((r: { frequency_hz: number }) => Number(r.frequency_hz))).toEqual([5_000_010, 5_000_012, 5_000_011, 5_000_013, 5_000_012]);
      // Every counter reading stays in the record (the warming one too), without a dial; the setting's reading has one.
      const stored = await t.dataSource.query('SELECT dial, frequency_hz FROM readings WHERE run_id = ? ORDER BY seq', [run.runId]);
      expect(stored.filter((r: { dial: number | null }) => r.dial === null)).toHaveLength(6);
      expect(stored.filter((r: { dial: number | null }) => r.dial !== null)).toHaveLength(1);
      const [audit] = await t.dataSource.query(
        "SELECT actor_id, changes FROM audit_events WHERE entity = 'run' AND entity_id = ? AND action = 'counter_capture'",
        [String(run.runId)],
      );
      expect(audit).toBeDefined();

      // After it settles, a reading without a dial is refused again.
      expect(await send(bridge, run.runId, [5_000_012])).toMatchObject({ accepted: 0 });

      // Repeatability (GUM 4.2.3): s/√n of the five linked counter readings, ν = n − 1 = 4 (not "one reading").
      const results = (await t.http.get(`/api/jobs/${run.jobId}/results`).set(as('lead')).expect(200)).body as JobResults;
      const point = results.ranges.flatMap((r) => r.points).find((p) => p.dial === 5000)!;
      const line = point.asFound!.budget!.lines.find((l) => l.name.startsWith('Repeatability'))!;
      expect(line.value).toBeCloseTo(Math.sqrt(1.3) / Math.sqrt(5), 9);
      expect(line.dof).toBe(4);
    });

    it('should abandon a waiting setting on request (Esc) and store nothing for it', async () => {
      const run = await calibrationRun();
      const bridge = await attachBridge(run.token, run.runId);
      await t.http.post(`/api/runs/${run.runId}/capture`).set(as('tech')).send({ dial: 4000 }).expect(201);
      await send(bridge, run.runId, [4_000_020, 4_000_021]);
      const answer = await t.http.delete(`/api/runs/${run.runId}/capture`).set(as('tech')).expect(200);
      expect(answer.body).toMatchObject({ status: 'abandoned', dial: 4000, count: 2 } satisfies Partial<CounterCapture>);
      expect((await t.http.delete(`/api/runs/${run.runId}/capture`).set(as('tech')).expect(409)).body.message).toContain('no setting is waiting');
      expect((await t.http.get(`/api/runs/${run.runId}/capture`).set(as('tech')).expect(200)).body.capture).toBeNull();
      const [{ n }] = await t.dataSource.query('SELECT COUNT(*) AS n FROM readings WHERE run_id = ? AND dial IS NOT NULL', [run.runId]);
      expect(Number(n)).toBe(0);
    });

    it("should end with the procedure's timeout and a message saying why, and end when the bridge drops", async () => {
      const run = await calibrationRun();
      // The procedure's settings: validated (N of 1 is refused), then a 5 s timeout and N = 3.
      await t.http.patch(`/api/procedures/${procedureId}`).set(as('lead')).send({ captureSettleCount: 1 }).expect(400);
      await t.http
        .patch(`/api/procedures/${procedureId}`)
        .set(as('lead'))
        .send({ captureTimeoutS: 5, captureSettleCount: 3, dialMarks: [3500, 4000, 5000] })
        .expect(200);
      try {
        const bridge = await attachBridge(run.token, run.runId);
        const page = await watch(run.runId);
        // The procedure's marks, in order: the first the run has no reading at is proposed.
        await t.http
          .post(`/api/runs/${run.runId}/readings`)
          .set(as('tech'))
          .send({ readings: [{ dial: 3500, frequency: 3_500_100 }] })
          .expect(201);
        expect((await t.http.get(`/api/runs/${run.runId}/capture`).set(as('tech')).expect(200)).body).toMatchObject({ capture: null, nextMark: 4000 });

        const ended = nextCapture(page, 'timed_out');
        await t.http.post(`/api/runs/${run.runId}/capture`).set(as('tech')).send({ dial: 4000 }).expect(201);
        await send(bridge, run.runId, [4_000_020, 4_000_090]);
        const { capture } = await ended;
        expect(capture.message).toContain('did not settle within 5 s: only 2 counter readings arrived');

        const failed = nextCapture(page, 'failed');
        await t.http.post(`/api/runs/${run.runId}/capture`).set(as('tech')).send({ dial: 4000 }).expect(201);
        bridge.disconnect();
        expect((await failed).capture.message).toContain('the bridge went offline');
      } finally {
        await t.http.patch(`/api/procedures/${procedureId}`).set(as('lead')).send({ captureTimeoutS: 30, captureSettleCount: 5, dialMarks: [] }).expect(200);
      }
    }, 20_000);

    it('should work from the bridge reading standard input (the source does not matter: captures ride the ingest path)', async () => {
      const run = await calibrationRun();
      const input = new PassThrough();
      const quiet = new Writable({ write: (_chunk, _encoding, done) => done() });
      const bridge = new Bridge({
        server: url,
        token: run.token,
        runId: run.runId,
        source: new StdinSource(input),
        spoolPath: join(mkdtempSync(join(tmpdir(), 'kc-capture-')), 'spool.jsonl'),
        batchSize: 10,
        window: 4,
        timeZero: 'run',
        ackTimeoutMs: 5000,
        flushTimeoutMs: 2000,
        statusEveryMs: 60_000,
        stderr: quiet,
      });
      const finished = bridge.run();
      try {
        for (let i = 0; i < 50 && !(await getRun(run.runId)).bridge.connected; i++) await new Promise((resolve) => setTimeout(resolve, 50));
        const page = await watch(run.runId);
        const settled = nextCapture(page, 'settled');
        await t.http.post(`/api/runs/${run.runId}/capture`).set(as('tech')).send({ dial: 7000 }).expect(201);
        // Counter lines as a serial counter prints them: 7.000 020 MHz … by hand, mean 7 000 021 Hz, s = √2.5.
        input.write(['7.000020 MHz', '7000022', '7000019', '7000023', '7000021'].join('\n') + '\n');
        const { capture } = await settled;
        expect(capture.mean).toBeCloseTo(7_000_021, 6);
        expect(capture.sd).toBeCloseTo(Math.sqrt(2.5), 9);
        expect(capture.n).toBe(5);
      } finally {
        input.end();
        bridge.stop();
        await finished;
      }
    });
  });
});
