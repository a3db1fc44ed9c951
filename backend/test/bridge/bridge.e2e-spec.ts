import { mkdtempSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { connect as tcpConnect } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { createBench, createRun, listen, organizationId, readingCount } from '../ingest/ingest-fixtures.js';
import { createTestApp, type TestApp } from '../support/test-app.js';
import { DIST, requireBuild, startNode, stop, waitFor, type Child } from './processes.js';

describe('the bridge and the counter simulator (e2e, real processes, MariaDB)', () => {
  let t: TestApp;
  let url: string;
  let org: number;
  let dir: string;
  const children: Child[] = [];

  beforeAll(async () => {
    requireBuild();
    t = await createTestApp();
    url = await listen(t);
    org = await organizationId(t.dataSource, DEMO_CUSTOMERS.saltmarsh);
    dir = mkdtempSync(join(tmpdir(), 'kc-bridge-'));
  });
  afterAll(async () => {
    for (const child of children) await stop(child, 'SIGKILL');
    await t.close();
  });

  const bridge = (token: string, runId: number, source: string, extra: string[] = []) => {
    const child = startNode(DIST.bridge, [
      '--server',
      url,
      '--token',
      token,
      '--run',
      String(runId),
      '--source',
      source,
      '--spool',
      join(dir, `run-${runId}-${children.length}.jsonl`),
      ...extra,
    ]);
    children.push(child);
    return child;
  };
  /** The exit code, with the bridge's stderr alongside so a failure shows why. */
  const exitOf = async (child: Child) => ({ code: await child.exited, stderr: child.stderr() });
  const exitsWith = async (child: Child, code: number) => expect(await exitOf(child)).toEqual({ code, stderr: expect.any(String) });
  const seqs = async (runId: number) =>
    (await t.dataSource.query('SELECT seq FROM readings WHERE run_id = ? ORDER BY seq', [runId])).map((r: { seq: number }) => Number(r.seq));

  describe('--source stdin', () => {
    it('should exit 0 once the input ends and every reading is acknowledged', async () => {
      const { token, benchId } = await createBench(t.dataSource);
      const run = await createRun(t.dataSource, { organizationId: org, benchId, kind: 'as_found' });
      const child = bridge(token, run.runId, 'stdin');
      const lines = ['# dial,frequency', '3500,3503870', '5500,5506125.5', '7500 ; 7.508 MHz'];
      for (let i = 0; i < 500; i++) lines.push(`${3500 + i * 8},${(3500 + i * 8) * 1000 + 3000}`);
      child.process.stdin!.end(lines.join('\n') + '\n');
      await exitsWith(child, 0);
      expect(child.stdout()).toBe('');
      expect(child.stderr()).toContain('every reading acknowledged');
      const rows = await t.dataSource.query('SELECT seq, dial, frequency_hz, source FROM readings WHERE run_id = ? ORDER BY seq LIMIT 3', [run.runId]);
      expect(
        rows.map((r: { seq: number; dial: number; frequency_hz: number; source: string }) => [Number(r.seq), Number(r.dial), Number(r.frequency_hz), r.source]),
      ).toEqual([
        [1, 3500, 3_503_870, 'bridge'],
        [2, 5500, 5_506_125.5, 'bridge'],
        [3, 7500, 7_508_000, 'bridge'],
      ]);
      expect(await readingCount(t.dataSource, run.runId)).toBe(503);
    });

    it('should carry on after the last seq when a second bridge starts on the same run', async () => {
      const { token, benchId } = await createBench(t.dataSource);
      const run = await createRun(t.dataSource, { organizationId: org, benchId });
      const first = bridge(token, run.runId, 'stdin');
      first.process.stdin!.end('7050000\n7050001\n7050002\n');
      await exitsWith(first, 0);
      const second = bridge(token, run.runId, 'stdin');
      second.process.stdin!.end('7050003\n7050004\n');
      await exitsWith(second, 0);
      expect(second.stderr()).toContain('numbering from seq 4');
      expect(await seqs(run.runId)).toEqual([1, 2, 3, 4, 5]);
    });

    it('should time readings from the run start, or from its own start with --time-zero now', async () => {
      const { token, benchId } = await createBench(t.dataSource);
      const run = await createRun(t.dataSource, { organizationId: org, benchId, startedAt: new Date(Date.now() - 3600_000) });
      const fromRun = bridge(token, run.runId, 'stdin');
      fromRun.process.stdin!.end('7050000\n');
      await exitsWith(fromRun, 0);
      const fromNow = bridge(token, run.runId, 'stdin', ['--time-zero', 'now']);
      fromNow.process.stdin!.end('7050001\n');
      await exitsWith(fromNow, 0);
      const [first, second] = await t.dataSource.query('SELECT t_s FROM readings WHERE run_id = ? ORDER BY seq', [run.runId]);
      expect(Number(first.t_s)).toBeGreaterThan(3599);
      expect(Number(first.t_s)).toBeLessThan(3700);
      expect(Number(second.t_s)).toBeLessThan(5);
    });

    it('should exit 3 naming the lines it could not read and the readings the server refused', async () => {
      const { token, benchId } = await createBench(t.dataSource);
      const run = await createRun(t.dataSource, { organizationId: org, benchId });
      const child = bridge(token, run.runId, 'stdin');
      child.process.stdin!.end('7050000\nseven megacycles\n20000,7050000\n');
      await exitsWith(child, 3);
      expect(child.stderr()).toContain('line 2 skipped');
      expect(child.stderr()).toMatch(/seq 2 refused \(dial\): dial 20000 is outside/);
      expect(await seqs(run.runId)).toEqual([1]);
    });

    it('should read time intervals into a phase run (seconds, or with a unit) and skip a frequency line there', async () => {
      const { token, benchId } = await createBench(t.dataSource);
      const run = await createRun(t.dataSource, { organizationId: org, benchId, kind: 'stability', dataKind: 'phase' });
      const child = bridge(token, run.runId, 'stdin');
      child.process.stdin!.end('0\n12.5 ns\n7.05 MHz\n-3e-9\n');
      await exitsWith(child, 3);
      expect(child.stderr()).toMatch(/line 3 skipped: "7.05 MHz" is not a time interval/);
      const rows = await t.dataSource.query('SELECT seq, frequency_hz AS value FROM readings WHERE run_id = ? ORDER BY seq', [run.runId]);
      expect(rows.map((r: { seq: number }) => Number(r.seq))).toEqual([1, 2, 3]);
      // 12.5 ns = 1.25e-8 s (SI prefix nano, 10⁻⁹).
      expect(rows.map((r: { value: number }) => Number(r.value))).toEqual([0, 1.25e-8, -3e-9]);
    });

    it('should exit 2 with the reason when the token is wrong or the run is not on its bench', async () => {
      const { token, benchId } = await createBench(t.dataSource);
      const run = await createRun(t.dataSource, { organizationId: org, benchId });
      const wrong = bridge('kcb_wrong', run.runId, 'stdin');
      wrong.process.stdin!.end('7050000\n');
      await exitsWith(wrong, 2);
      expect(wrong.stderr()).toContain('the server refused the bench: the bench token is not valid');
      const elsewhere = await createRun(t.dataSource, { organizationId: org, benchId: null });
      const unassigned = bridge(token, elsewhere.runId, 'stdin');
      unassigned.process.stdin!.end('7050000\n');
      await exitsWith(unassigned, 2);
      expect(unassigned.stderr()).toContain(`run ${elsewhere.runId} is not assigned to bench`);
    });
  });

  it('should flush on Ctrl-C: everything read is acknowledged and stored before it exits 0', async () => {
    const { token, benchId } = await createBench(t.dataSource);
    const run = await createRun(t.dataSource, { organizationId: org, benchId });
    const child = bridge(token, run.runId, 'simulate:warmup', ['--interval', '2', '--speed', '60']);
    await waitFor('readings to flow', async () => (await readingCount(t.dataSource, run.runId)) > 100, 15000);
    child.process.kill('SIGINT');
    await exitsWith(child, 0);
    const read = Number(/every reading acknowledged \((\d+) readings read/.exec(child.stderr())?.[1]);
    expect(read).toBeGreaterThan(100);
    expect(await readingCount(t.dataSource, run.runId)).toBe(read);
  });

  it('should keep what it could not send in the spool when the server is gone, and exit 4 on Ctrl-C', async () => {
    const { token, benchId } = await createBench(t.dataSource);
    const run = await createRun(t.dataSource, { organizationId: org, benchId });
    const spool = join(dir, 'unreachable.jsonl');
    // Send a first reading, then point a second bridge at a port nobody listens on.
    const first = startNode(DIST.bridge, ['--server', url, '--token', token, '--run', String(run.runId), '--source', 'stdin', '--spool', spool]);
    children.push(first);
    first.process.stdin!.end('7050000\n');
    await exitsWith(first, 0);
    const unreachable = startNode(DIST.bridge, [
      '--server',
      'http://127.0.0.1:9',
      '--token',
      token,
      '--run',
      String(run.runId),
      '--source',
      'stdin',
      '--spool',
      spool,
    ]);
    children.push(unreachable);
    await waitFor('the bridge to report the server unreachable', () => unreachable.stderr().includes('unreachable'), 10000);
    unreachable.process.kill('SIGINT');
    await exitsWith(unreachable, 4);
    expect(statSync(spool).size).toBe(0); // nothing was read: a bridge reads only once attached
  });

  it('should send readings left in a spool by an earlier bridge first, then clear it', async () => {
    const { token, benchId } = await createBench(t.dataSource);
    const run = await createRun(t.dataSource, { organizationId: org, benchId });
    const spool = join(dir, 'left-over.jsonl');
    writeFileSync(
      spool,
      JSON.stringify({
        run: run.runId,
        readings: [
          { seq: 1, t: 0.5, frequency: 7e6 },
          { seq: 2, t: 1.5, frequency: 7.000001e6 },
        ],
      }) +
        '\n' +
        '{"run":' +
        run.runId +
        ',"readings":[{"seq":3',
    );
    const child = startNode(DIST.bridge, ['--server', url, '--token', token, '--run', String(run.runId), '--source', 'stdin', '--spool', spool]);
    children.push(child);
    child.process.stdin!.end('7000002\n');
    await exitsWith(child, 0);
    expect(child.stderr()).toContain('2 readings left in');
    expect(await seqs(run.runId)).toEqual([1, 2, 3]);
    expect(statSync(spool).size).toBe(0);
    expect(readFileSync(spool, 'utf8')).toBe('');
  });

  it('should let two bridges stream into one run at once without losing a reading', async () => {
    const { token, benchId } = await createBench(t.dataSource);
    const run = await createRun(t.dataSource, { organizationId: org, benchId });
    const a = bridge(token, run.runId, 'simulate:stable', ['--interval', '1', '--count', '1500', '--seed', '1']);
    const b = bridge(token, run.runId, 'simulate:stable', ['--interval', '1', '--count', '1500', '--seed', '2']);
    await exitsWith(a, 0);
    await exitsWith(b, 0);
    const stored = await seqs(run.runId);
    expect(stored.length).toBe(3000);
    expect(new Set(stored).size).toBe(3000);
  });

  describe('counter-sim', () => {
    let sim: Child;
    let port: number;

    beforeAll(async () => {
      sim = startNode(DIST.counterSim, ['--port', '0', '--profile', 'warmup', '--speed', '60', '--seed', '4']);
      children.push(sim);
      await waitFor('the counter simulator', () => /on 127\.0\.0\.1:(\d+)/.test(sim.stderr()), 15000);
      port = Number(/on 127\.0\.0\.1:(\d+)/.exec(sim.stderr())![1]);
    });

    it('should answer *IDN? and the frequency query over real TCP', async () => {
      const socket = tcpConnect({ host: '127.0.0.1', port });
      let text = '';
      socket.setEncoding('latin1').on('data', (d: string) => (text += d));
      await new Promise((r) => socket.once('connect', r));
      socket.write('*IDN?\nMEAS:FREQ?\n');
      await waitFor('two answer lines', () => text.split('\n').length >= 3, 5000);
      socket.destroy();
      const [idn, reading] = text.split('\n');
      expect(idn).toBe('Kilocycle,Simulated frequency counter,KC-SIM-0001,1.0');
      expect(reading).toMatch(/^\+7\.0\d{10}E\+06$/);
    });

    it('should be read by the bridge through --source scpi://', async () => {
      const { token, benchId } = await createBench(t.dataSource);
      const run = await createRun(t.dataSource, { organizationId: org, benchId });
      const child = bridge(token, run.runId, `scpi://127.0.0.1:${port}`, ['--interval', '20', '--count', '25']);
      await exitsWith(child, 0);
      expect(child.stderr()).toContain('counter: Kilocycle,Simulated frequency counter');
      const rows = await t.dataSource.query('SELECT seq, t_s, frequency_hz FROM readings WHERE run_id = ? ORDER BY seq', [run.runId]);
      expect(rows).toHaveLength(25);
      for (const r of rows) expect(Math.abs(Number(r.frequency_hz) - 7_050_000)).toBeLessThan(20_000);
      expect(Number(rows[24].t_s)).toBeGreaterThanOrEqual(Number(rows[0].t_s));
    });
  });
});
