import type { Socket } from 'socket.io-client';
import {
  INGEST_EVENTS,
  LIVE_EVENTS,
  NAMESPACES,
  type JoinReply,
  type LiveExclusionEvent,
  type LiveReadingsEvent,
  liveReadings,
} from '@kilocycle/common/events';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { connect, createBench, createRun, listen, organizationId, request, type RunFixture } from '../ingest/ingest-fixtures.js';
import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';

describe('/live namespace (e2e, MariaDB)', () => {
  let t: TestApp;
  let url: string;
  let sockets: Socket[] = [];
  let bench: { benchId: number; token: string };
  let saltmarshRun: RunFixture;
  let northgateRun: RunFixture;
  const tokens: Partial<Record<keyof typeof DEMO, string>> = {};

  beforeAll(async () => {
    t = await createTestApp();
    url = await listen(t);
    bench = await createBench(t.dataSource);
    saltmarshRun = await createRun(t.dataSource, { organizationId: await organizationId(t.dataSource, DEMO_CUSTOMERS.saltmarsh), benchId: bench.benchId });
    northgateRun = await createRun(t.dataSource, { organizationId: await organizationId(t.dataSource, DEMO_CUSTOMERS.northgate), benchId: bench.benchId });
    for (const who of ['tech', 'saltmarsh', 'northgate', 'engineer'] as const) tokens[who] = await tokenFor(t.http, DEMO[who]);
  });
  afterEach(() => {
    for (const s of sockets) s.disconnect();
    sockets = [];
  });
  afterAll(async () => {
    await t.close();
  });

  const browser = (who: keyof typeof DEMO) => connect(url, NAMESPACES.live, tokens[who], sockets);
  const benchSocket = async (runId: number) => {
    const socket = await connect(url, NAMESPACES.ingest, bench.token, sockets);
    expect(await request(socket, INGEST_EVENTS.attach, { runId })).toMatchObject({ ok: true });
    return socket;
  };
  const nextLive = (socket: Socket) => new Promise<LiveReadingsEvent>((resolve) => socket.once(LIVE_EVENTS.readings, resolve));

  it('should refuse a browser without a session or with a bad one', async () => {
    await expect(connect(url, NAMESPACES.live, undefined, sockets)).rejects.toMatchObject({
      message: expect.stringContaining('sign in'),
      data: { code: 'bad_session' },
    });
    await expect(connect(url, NAMESPACES.live, 'not.a.jwt', sockets)).rejects.toMatchObject({ data: { code: 'bad_session' } });
  });

  it("should push readings stored from a bench to the run's room, in seq order, after the commit", async () => {
    const page = await browser('tech');
    expect(await request<JoinReply>(page, LIVE_EVENTS.join, { runId: saltmarshRun.runId })).toEqual({ ok: true, runId: saltmarshRun.runId, lastSeq: 0 });
    const arriving = nextLive(page);
    const source = await benchSocket(saltmarshRun.runId);
    await request(source, INGEST_EVENTS.readings, {
      runId: saltmarshRun.runId,
      readings: [
        { seq: 2, t: 2, frequency: 7_000_020 },
        { seq: 1, t: 1, frequency: 7_000_010 },
        { seq: 3, frequency: -1 },
      ],
    });
    const event = await arriving;
    expect(event.runId).toBe(saltmarshRun.runId);
    expect(liveReadings(event).map((r) => [r.seq, r.t, r.frequency, r.source])).toEqual([
      [1, 1, 7_000_010, 'bridge'],
      [2, 2, 7_000_020, 'bridge'],
    ]);
    // The batch's author (the bench) once, beside the readings' columns, not on each one.
    expect(event.author).toMatchObject({ kind: 'bench' });
    expect(Object.keys(event).sort()).toEqual(['author', 'aux', 'dial', 'frequency', 'id', 'receivedAt', 'runId', 'seq', 'source', 't']);
    const [stored] = await t.dataSource.query('SELECT COUNT(*) AS n FROM readings WHERE run_id = ?', [saltmarshRun.runId]);
    expect(Number(stored.n)).toBe(2);
  });

  it("should let a client watch its own organisation's run, and not another's", async () => {
    const own = await browser('saltmarsh');
    expect(await request<JoinReply>(own, LIVE_EVENTS.join, { runId: saltmarshRun.runId })).toMatchObject({ ok: true });
    const foreign = await browser('northgate');
    expect(await request<JoinReply>(foreign, LIVE_EVENTS.join, { runId: saltmarshRun.runId })).toEqual({
      ok: false,
      code: 'run_not_found',
      error: `there is no run ${saltmarshRun.runId}`,
    });
    expect(await request<JoinReply>(foreign, LIVE_EVENTS.join, { runId: northgateRun.runId })).toMatchObject({ ok: true });
    // The northgate page must hear nothing from the saltmarsh run.
    const leaked: LiveReadingsEvent[] = [];
    foreign.on(LIVE_EVENTS.readings, (e: LiveReadingsEvent) => leaked.push(e));
    const arriving = nextLive(own);
    const source = await benchSocket(saltmarshRun.runId);
    await request(source, INGEST_EVENTS.readings, { runId: saltmarshRun.runId, readings: [{ seq: 10, frequency: 7_000_100 }] });
    expect((await arriving).seq).toEqual([10]);
    await new Promise((r) => setTimeout(r, 100));
    expect(leaked).toEqual([]);
  });

  it('should stop pushing after leave, and refuse malformed joins with a reason', async () => {
    const page = await browser('engineer');
    expect(await request(page, LIVE_EVENTS.join, { runId: 'x' })).toMatchObject({ ok: false, code: 'bad_request' });
    expect(await request(page, LIVE_EVENTS.join, '{oops')).toMatchObject({ ok: false, code: 'bad_request', error: expect.stringContaining('not valid JSON') });
    await request(page, LIVE_EVENTS.join, { runId: northgateRun.runId });
    expect(await request(page, LIVE_EVENTS.leave, { runId: northgateRun.runId })).toEqual({ ok: true, runId: northgateRun.runId });
    const heard: LiveReadingsEvent[] = [];
    page.on(LIVE_EVENTS.readings, (e: LiveReadingsEvent) => heard.push(e));
    const source = await benchSocket(northgateRun.runId);
    expect(await request(source, INGEST_EVENTS.readings, { runId: northgateRun.runId, readings: [{ seq: 1, frequency: 7e6 }] })).toMatchObject({
      ok: true,
      accepted: 1,
    });
    await new Promise((r) => setTimeout(r, 100));
    expect(heard).toEqual([]);
  });

  it('should push readings typed at the bench page and exclusions through the same room', async () => {
    const run = await createRun(t.dataSource, { organizationId: saltmarshRun.organizationId, benchId: null });
    const page = await browser('engineer');
    await request(page, LIVE_EVENTS.join, { runId: run.runId });
    const arriving = nextLive(page);
    const typed = await t.http
      .post(`/api/runs/${run.runId}/readings`)
      .set('Authorization', `Bearer ${tokens.tech}`)
      .send({ readings: [{ frequency: '7.050 MHz' }] });
    expect(typed.status).toBeLessThan(300);
    const event = await arriving;
    expect(liveReadings(event).map((r) => [r.seq, r.frequency, r.source])).toEqual([[1, 7_050_000, 'manual']]);
    const excluded = new Promise<LiveExclusionEvent>((resolve) => page.once(LIVE_EVENTS.excluded, resolve));
    const res = await t.http
      .post(`/api/runs/${run.runId}/readings/${event.id[0]}/exclusion`)
      .set('Authorization', `Bearer ${tokens.tech}`)
      .send({ reason: 'counter gate left at 10 ms' });
    expect(res.status).toBeLessThan(300);
    expect(await excluded).toMatchObject({ runId: run.runId, reading: { seq: 1, excluded: true, excludedReason: 'counter gate left at 10 ms' } });
  });

  it('should close the socket at sign-out and refuse to connect with that token again', async () => {
    const token = await tokenFor(t.http, DEMO.lead);
    const page = await connect(url, NAMESPACES.live, token, sockets);
    const closed = new Promise<string>((resolve) => page.once('disconnect', resolve));
    expect((await t.http.post('/api/auth/logout').set('Authorization', `Bearer ${token}`)).status).toBeLessThan(300);
    expect(await closed).toBe('io server disconnect');
    await expect(connect(url, NAMESPACES.live, token, sockets)).rejects.toMatchObject({ data: { code: 'bad_session' } });
  });
});
