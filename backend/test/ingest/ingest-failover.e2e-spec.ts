import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import type { Socket } from 'socket.io-client';
import { INGEST_EVENTS, NAMESPACES, type AttachReply, type IngestBatchReply } from '@kilocycle/common/events';
import { Bridge } from '../../src/bridge/bridge.js';
import type { Captured, CounterSource } from '../../src/bridge/sources/counter-source.js';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { appWith, clusterSettings } from '../support/app-with.js';
import { startPrivateRedis, type PrivateRedis } from '../support/private-redis.js';
import { startSwitchingRelay, type SwitchingRelay } from '../support/switching-relay.js';
import type { TestApp } from '../support/test-app.js';
import { connect, createBench, createRun, listen, organizationId, request } from './ingest-fixtures.js';

/** Readings numbered `from`..`to`, in the run's span (3.5–7.5 MHz). */
const numbered = (from: number, to: number) =>
  Array.from({ length: to - from + 1 }, (_, i) => ({ seq: from + i, t: from + i, frequency: 7_000_000 + from + i }));

/** A counter that gives `count` readings, one every `everyMs`: enough time for a node to die mid-stream. */
function pacedCounter(count: number, everyMs: number): CounterSource {
  let stopped = false;
  return {
    label: 'a paced test counter',
    skipped: 0,
    stop: () => {
      stopped = true;
    },
    async run(emit: (reading: Captured) => void) {
      for (let i = 1; i <= count && !stopped; i += 1) {
        emit({ t: i * 0.01, frequency: 7_000_000 + i });
        await new Promise((resolve) => setTimeout(resolve, everyMs));
      }
    },
  };
}

describe('a bench moving between app nodes (e2e, MariaDB + redis-server)', () => {
  let redis: PrivateRedis;
  let settings: ReturnType<typeof clusterSettings>;
  const nodes: TestApp[] = [];
  /** Node B, which outlives the others. */
  let survivor: { node: TestApp; url: string };
  let sockets: Socket[] = [];
  let dir: string;

  beforeAll(async () => {
    redis = await startPrivateRedis();
    settings = clusterSettings(redis.url);
    dir = mkdtempSync(join(tmpdir(), 'kc-failover-'));
  });
  afterEach(() => {
    for (const s of sockets) s.disconnect();
    sockets = [];
  });
  afterAll(async () => {
    for (const node of nodes) await node.close().catch(() => undefined);
    await redis?.stop();
    settings?.remove();
    rmSync(dir, { recursive: true, force: true });
  });

  const startNode = async (reset = false) => {
    const node = await appWith(settings.env, reset);
    nodes.push(node);
    return { node, url: await listen(node) };
  };
  /** What MariaDB holds for the run: rows, distinct seqs, the run's counters. */
  const stateOf = async (node: TestApp, runId: number) => {
    const [rows] = await node.dataSource.query(
      'SELECT COUNT(*) AS n, COUNT(DISTINCT seq) AS seqs, MIN(seq) AS first, MAX(seq) AS last FROM readings WHERE run_id = ?',
      [runId],
    );
    const [run] = await node.dataSource.query('SELECT reading_count, last_seq FROM runs WHERE id = ?', [runId]);
    return {
      rows: Number(rows.n),
      seqs: Number(rows.seqs),
      first: Number(rows.first),
      last: Number(rows.last),
      readingCount: Number(run.reading_count),
      lastSeq: Number(run.last_seq),
    };
  };

  it('should store each reading once when a bench re-sends its unacknowledged batches to node B after node A died, and B should say which were new', async () => {
    const a = await startNode(true);
    const b = await startNode();
    survivor = b;
    const bench = await createBench(a.node.dataSource);
    const run = await createRun(a.node.dataSource, {
      organizationId: await organizationId(a.node.dataSource, DEMO_CUSTOMERS.saltmarsh),
      benchId: bench.benchId,
    });

    const onA = await connect(a.url, NAMESPACES.ingest, bench.token, sockets);
    expect(await request<AttachReply>(onA, INGEST_EVENTS.attach, { runId: run.runId })).toMatchObject({ ok: true, lastSeq: 0 });
    for (const [from, to] of [
      [1, 10],
      [11, 20],
      [21, 30],
    ])
      expect(await request<IngestBatchReply>(onA, INGEST_EVENTS.readings, { runId: run.runId, readings: numbered(from, to) })).toMatchObject({ accepted: 10 });
    // Two batches A commits but whose acknowledgements never reach the bench: it still holds seqs 31–50.
    await request(onA, INGEST_EVENTS.readings, { runId: run.runId, readings: numbered(31, 40) });
    await request(onA, INGEST_EVENTS.readings, { runId: run.runId, readings: numbered(41, 50) });
    // Node A dies.
    await a.node.close();

    const onB = await connect(b.url, NAMESPACES.ingest, bench.token, sockets);
    // B never saw this run: its answer comes from MariaDB.
    expect(await request<AttachReply>(onB, INGEST_EVENTS.attach, { runId: run.runId })).toMatchObject({ ok: true, lastSeq: 50 });
    // The bench re-sends what it holds, then new readings (51–60, with 41–50 in one batch).
    const again = await request<IngestBatchReply>(onB, INGEST_EVENTS.readings, { runId: run.runId, readings: numbered(31, 40) });
    expect(again).toMatchObject({ ok: true, accepted: 0, duplicates: 10, duplicateSeqs: numbered(31, 40).map((r) => r.seq), conflictSeqs: [], lastSeq: 50 });
    const mixed = await request<IngestBatchReply>(onB, INGEST_EVENTS.readings, { runId: run.runId, readings: numbered(41, 60) });
    expect(mixed).toMatchObject({ ok: true, accepted: 10, duplicates: 10, duplicateSeqs: numbered(41, 50).map((r) => r.seq), conflictSeqs: [], lastSeq: 60 });
    // A bench that numbered a held seq afresh (another reading under 55) is told it conflicts, not that it is a resend.
    const other = await request<IngestBatchReply>(onB, INGEST_EVENTS.readings, { runId: run.runId, readings: [{ seq: 55, t: 99, frequency: 7_123_456 }] });
    expect(other).toMatchObject({ ok: true, accepted: 0, duplicates: 0, duplicateSeqs: [], conflictSeqs: [55] });

    expect(await stateOf(b.node, run.runId)).toEqual({ rows: 60, seqs: 60, first: 1, last: 60, readingCount: 60, lastSeq: 60 });
  });

  it('should carry the real bridge through a node dying mid-stream: it reconnects through the balancer to the other node and every seq is stored once', async () => {
    const b = survivor.node;
    const c = await startNode();
    const bench = await createBench(b.dataSource);
    const run = await createRun(b.dataSource, { organizationId: await organizationId(b.dataSource, DEMO_CUSTOMERS.saltmarsh), benchId: bench.benchId });
    const portOf = (url: string) => Number(new URL(url).port);
    const relay: SwitchingRelay = await startSwitchingRelay(portOf(c.url));
    let log = '';
    const stderr = new Writable({
      write(chunk: Buffer, _encoding, done) {
        log += chunk.toString();
        done();
      },
    });
    const total = 600;
    const bridge = new Bridge({
      server: relay.url,
      token: bench.token,
      runId: run.runId,
      source: pacedCounter(total, 4),
      spoolPath: join(dir, `run-${run.runId}.jsonl`),
      batchSize: 25,
      window: 4,
      count: total,
      timeZero: 'now',
      ackTimeoutMs: 3000,
      flushTimeoutMs: 10_000,
      statusEveryMs: 60_000,
      stderr,
    });
    try {
      const finished = bridge.run();
      // Once part of the stream is stored through node C, C dies: its connections drop, the balancer sends the bridge to B.
      let before = 0;
      for (let i = 0; i < 200 && before < 150; i += 1) {
        await new Promise((resolve) => setTimeout(resolve, 25));
        before = (await stateOf(b, run.runId)).rows;
      }
      expect(before).toBeGreaterThanOrEqual(150);
      relay.switchTo(portOf(survivor.url), { drop: true });
      await c.node.close();
      const outcome = await finished;
      expect({ exitCode: outcome.exitCode, log }).toEqual({ exitCode: 0, log: expect.any(String) });
      expect(before).toBeLessThan(total);
      expect(outcome.stats.stored + outcome.stats.duplicates).toBeGreaterThanOrEqual(total);
      expect(await stateOf(b, run.runId)).toEqual({ rows: total, seqs: total, first: 1, last: total, readingCount: total, lastSeq: total });
    } finally {
      bridge.abort();
      await relay.close();
    }
  });
});
