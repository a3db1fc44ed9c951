import { mkdtempSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { DataSource } from 'typeorm';
import { createDataSource } from '../../src/database/create-data-source.js';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { createBench, createRun, organizationId } from '../ingest/ingest-fixtures.js';
import { resetDatabase } from '../support/test-app.js';
import { CuttableLink, DIST, freePort, requireBuild, startNode, startServer, stop, type Child } from './processes.js';

const READINGS = 20_000;

/**
 * The reliability test of live ingest: a real bridge process streams 20,000 readings through a link
 * the test cuts again and again, and the server process is killed and started again once. Afterwards
 * the run must hold every seq from 1 to 20,000 exactly once and the bridge's spool must be empty.
 */
describe('bridge under faults (e2e, real processes, MariaDB)', () => {
  let ds: DataSource;
  let server: Child | null = null;
  let bridge: Child | null = null;
  let link: CuttableLink | null = null;

  beforeAll(async () => {
    requireBuild();
    await resetDatabase();
    ds = createDataSource();
    await ds.initialize();
  });
  afterAll(async () => {
    if (bridge) await stop(bridge, 'SIGKILL');
    if (server) await stop(server);
    await link?.close();
    await ds?.destroy();
  });

  it('should store every reading exactly once through 20+ cut connections and a server restart', async () => {
    const bench = await createBench(ds);
    const run = await createRun(ds, { organizationId: await organizationId(ds, DEMO_CUSTOMERS.northgate), benchId: bench.benchId, kind: 'stability' });
    const serverPort = await freePort();
    const linkPort = await freePort();
    server = await startServer(serverPort);
    link = new CuttableLink(serverPort);
    await link.listen(linkPort);
    const spool = join(mkdtempSync(join(tmpdir(), 'kc-bridge-')), 'run.jsonl');

    const started = Date.now();
    bridge = startNode(DIST.bridge, [
      '--server',
      `http://127.0.0.1:${linkPort}`,
      '--token',
      bench.token,
      '--run',
      String(run.runId),
      '--source',
      'simulate:stable',
      '--interval',
      '0.75',
      '--count',
      String(READINGS),
      '--batch',
      '100',
      '--spool',
      spool,
      '--timeout',
      '3000',
      '--status-every',
      '250',
    ]);

    // Cut the link every 350 ms while the bridge runs; kill the server outright after the 8th cut.
    let restarted = false;
    let maxSpooled = 0;
    while (bridge.process.exitCode === null && Date.now() - started < 55_000) {
      await new Promise((r) => setTimeout(r, 350));
      if (link.cuts < 30) link.cut();
      if (link.cuts === 8 && !restarted) {
        restarted = true;
        await stop(server, 'SIGKILL');
        await new Promise((r) => setTimeout(r, 500));
        server = await startServer(serverPort);
      }
      for (const m of bridge.stderr().matchAll(/spooled ([\d ]+)/g)) maxSpooled = Math.max(maxSpooled, Number(m[1].replace(/ /g, '')));
    }
    const code = await bridge.exited;
    const elapsed = (Date.now() - started) / 1000;

    expect({ code, tail: code === 0 ? '' : bridge.stderr().slice(-2000) }).toEqual({ code: 0, tail: '' });
    expect(restarted).toBe(true);
    expect(link.cuts).toBeGreaterThanOrEqual(20);
    expect(maxSpooled).toBeGreaterThan(0); // the spool really was used
    const [row] = await ds.query('SELECT COUNT(*) AS n, COUNT(DISTINCT seq) AS distinct_seqs, MIN(seq) AS lo, MAX(seq) AS hi FROM readings WHERE run_id = ?', [
      run.runId,
    ]);
    expect({ n: Number(row.n), distinct: Number(row.distinct_seqs), lo: Number(row.lo), hi: Number(row.hi) }).toEqual({
      n: READINGS,
      distinct: READINGS,
      lo: 1,
      hi: READINGS,
    });
    expect(statSync(spool).size).toBe(0);
    expect(bridge.stderr()).toContain('every reading acknowledged');
    process.stderr.write(`fault test: ${READINGS} readings, ${link.cuts} cuts, 1 server restart, spool peak ${maxSpooled}, ${elapsed.toFixed(1)} s\n`);
  }, 90_000);
});
