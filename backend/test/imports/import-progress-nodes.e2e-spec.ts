import { Redis } from 'ioredis';
import type { Socket } from 'socket.io-client';
import { LIVE_EVENTS, NAMESPACES, type LiveImportProgressEvent } from '@kilocycle/common/events';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { connect, createRun, listen, organizationId, readingCount } from '../ingest/ingest-fixtures.js';
import { appWith, clusterSettings } from '../support/app-with.js';
import { startPrivateRedis, type PrivateRedis } from '../support/private-redis.js';
import { DEMO, tokenFor, type TestApp } from '../support/test-app.js';

/** A warm-up series of `rows` readings (time, frequency in Hz): big enough to take several progress pushes. */
function series(rows: number): Buffer {
  const lines = ['time,frequency'];
  for (let i = 0; i < rows; i += 1) lines.push(`${i},${7_000_000 + (i % 1000) / 10}`);
  return Buffer.from(lines.join('\n') + '\n');
}

describe('import progress over the live socket, two app nodes (e2e, MariaDB + redis-server)', () => {
  let redis: PrivateRedis;
  let settings: ReturnType<typeof clusterSettings>;
  let nodeA: TestApp;
  let nodeB: TestApp;
  let urlB: string;
  let sockets: Socket[] = [];
  let tech: string;

  beforeAll(async () => {
    redis = await startPrivateRedis();
    settings = clusterSettings(redis.url);
    nodeA = await appWith(settings.env, true);
    nodeB = await appWith(settings.env, false);
    urlB = await listen(nodeB);
    tech = await tokenFor(nodeA.http, DEMO.tech);
  });
  afterEach(() => {
    for (const s of sockets) s.disconnect();
    sockets = [];
  });
  afterAll(async () => {
    await nodeA?.close();
    await nodeB?.close();
    await redis?.stop();
    settings?.remove();
  });

  it('should push the progress of an import running on node A to the user’s page connected to node B, and answer its state on B afterwards', async () => {
    const run = await createRun(nodeA.dataSource, { organizationId: await organizationId(nodeA.dataSource, DEMO_CUSTOMERS.saltmarsh), benchId: null });
    const page = await connect(urlB, NAMESPACES.live, tech, sockets);
    // Another user's page on B hears nothing of it.
    const engineerPage = await connect(urlB, NAMESPACES.live, await tokenFor(nodeA.http, DEMO.engineer), sockets);
    const heardByEngineer: LiveImportProgressEvent[] = [];
    engineerPage.on(LIVE_EVENTS.importProgress, (event: LiveImportProgressEvent) => heardByEngineer.push(event));
    const events: LiveImportProgressEvent[] = [];
    const ended = new Promise<void>((resolve) =>
      page.on(LIVE_EVENTS.importProgress, (event: LiveImportProgressEvent) => {
        events.push(event);
        if (event.phase === 'done' || event.phase === 'failed') resolve();
      }),
    );
    const importId = 'node-b-watches-0001';
    const file = series(60_000);
    const res = await nodeA.http
      .post(`/api/runs/${run.runId}/imports`)
      .query({ importId })
      .set({ Authorization: `Bearer ${tech}` })
      .attach('file', file, { filename: 'warmup.csv', contentType: 'text/csv' });
    expect(res.status).toBe(201);
    await Promise.race([ended, new Promise((_, reject) => setTimeout(() => reject(new Error('no end of the import on node B in 5 s')), 5000))]);

    expect(events.every((e) => e.importId === importId && e.runId === run.runId)).toBe(true);
    // The passes in order (mode all: receiving, validating, writing), the bar never going back, and the end.
    const phases = events.map((e) => e.phase).filter((p, i, all) => all[i - 1] !== p);
    expect(phases).toEqual(['receiving', 'validating', 'writing', 'done']);
    const fractions = events.map((e) => e.fraction);
    expect(fractions).toEqual([...fractions].sort((x, y) => x - y));
    expect(events.at(-1)).toMatchObject({ phase: 'done', fraction: 1, imported: 60_000, rowsDone: 60_000, bytesDone: file.length });
    expect(heardByEngineer).toEqual([]);
    expect(await readingCount(nodeB.dataSource, run.runId)).toBe(60_000);

    // After a reload the page asks node B, which never ran the import: the state comes from Redis.
    const progress = await nodeB.http.get(`/api/imports/${importId}/progress`).set({ Authorization: `Bearer ${tech}` });
    expect(progress.status).toBe(200);
    expect(progress.body).toEqual(events.at(-1));
    expect(
      (await nodeB.http.get(`/api/imports/${importId}/progress`).set({ Authorization: `Bearer ${await tokenFor(nodeB.http, DEMO.engineer)}` })).status,
    ).toBe(404);
  });

  it('should refuse a second import under an id that is still running on another node', async () => {
    const importId = 'still-running-0001';
    const client = new Redis(redis.url);
    try {
      // The key as node A writes it mid-import.
      await client.set(`kc:import:${importId}`, JSON.stringify({ userId: 1, finishedAt: null, progress: { importId, phase: 'writing' } }), 'PX', 60_000);
      const run = await createRun(nodeB.dataSource, { organizationId: await organizationId(nodeB.dataSource, DEMO_CUSTOMERS.saltmarsh), benchId: null });
      const res = await nodeB.http
        .post(`/api/runs/${run.runId}/imports`)
        .query({ importId })
        .set({ Authorization: `Bearer ${tech}` })
        .attach('file', series(10), { filename: 'warmup.csv', contentType: 'text/csv' });
      expect(res.status).toBe(409);
      expect(res.body.message).toBe(`an import with id ${importId} is already running`);
      expect(await readingCount(nodeB.dataSource, run.runId)).toBe(0);
    } finally {
      client.disconnect();
    }
  });
});
