import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Bench, BenchTokenResponse, ListResponse, Run } from '@kilocycle/common/types';
import { BASE_URL, DEMO_PASSWORD, keepScreenshot, launchBrowser, newPage, signIn } from './support/browser';
import { apiGet, apiLogin, apiRequest } from './support/lab';

// Journey 2 (PRODUCT.md §4): the bridge reads a (simulated) counter over SCPI/TCP and streams a warm-up into a run;
// the run's page shows the points and the fitted τ as they arrive, without a reload.

const ROOT = resolve(process.cwd(), '..');
// bin/kilocycle bridge and counter-sim exec exactly these files after making sure they are built. The test runs them
// directly: `bin/kilocycle test browser` has just built them, and a set-up step that may rebuild under the running
// server has no place in the middle of a test.
const BRIDGE = join(ROOT, 'backend', 'dist', 'bridge', 'bridge-cli.js');
const COUNTER_SIM = join(ROOT, 'backend', 'dist', 'bridge', 'counter-sim-cli.js');
const hasBridge =
  existsSync(BRIDGE) && existsSync(COUNTER_SIM) && /counter-sim\)/.test(readFileSync(join(ROOT, 'bin', 'kilocycle'), 'utf8'));

type Child = { process: ChildProcess; output: () => string };

function start(file: string, args: string[]): Child {
  const child = spawn(process.execPath, [file, ...args], { env: { ...process.env, NODE_OPTIONS: '' }, stdio: ['ignore', 'pipe', 'pipe'] });
  let output = '';
  child.stdout!.setEncoding('utf8').on('data', (d: string) => (output += d));
  child.stderr!.setEncoding('utf8').on('data', (d: string) => (output += d));
  return { process: child, output: () => output };
}

async function stop(child: Child | null, signal: NodeJS.Signals = 'SIGTERM') {
  if (!child || child.process.exitCode !== null || child.process.signalCode !== null) return;
  const exited = new Promise((done) => child.process.once('exit', done));
  child.process.kill(signal);
  await Promise.race([exited, new Promise((done) => setTimeout(done, 12_000))]);
  if (child.process.exitCode === null && child.process.signalCode === null) child.process.kill('SIGKILL');
}

async function until<T>(what: string, check: () => T | null | undefined, timeoutMs = 15_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = check();
    if (value !== null && value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((done) => setTimeout(done, 100));
  }
}

async function readingCount(page: Page) {
  const text = await page.getByTestId('live-status').innerText();
  return Number(/(\d+)\s+readings/.exec(text)?.[1] ?? 0);
}

describe('live warm-up: journey 2 (browser)', () => {
  let browser: Browser;
  let counter: Child | null = null;
  let bridge: Child | null = null;

  beforeAll(async () => {
    if (hasBridge) browser = await launchBrowser();
  });
  afterAll(async () => {
    await stop(bridge, 'SIGINT');
    await stop(counter);
    await browser?.close();
  });

  it.skipIf(!hasBridge)('should show the bridge’s readings and the fitted τ on the warm-up page as they arrive', async () => {
    // An administrator issues Bench 1 a token; the demo has an open warm-up run on Bench 1.
    const admin = await apiLogin('admin@kilocycle.test', DEMO_PASSWORD);
    const benches = await apiGet<ListResponse<Bench>>(admin, `/benches?q=${encodeURIComponent('Bench 1')}`);
    const bench = benches.items.find((b) => b.name === 'Bench 1');
    if (!bench) throw new Error('the demo has no Bench 1: reseed the database');
    const runs = await apiGet<ListResponse<Run>>(admin, `/runs?benchId=${bench.id}&kind=warmup&status=open`);
    const run = runs.items[0];
    if (!run) throw new Error('the demo has no open warm-up run on Bench 1: reseed the database');
    const { token } = await apiRequest<BenchTokenResponse>(admin, 'POST', `/benches/${bench.id}/token`);

    // The simulated counter on a free port, warming up at 60 simulated seconds a second (τ about 7 s of real time).
    counter = start(COUNTER_SIM, ['--port', '0', '--profile', 'warmup', '--speed', '60', '--seed', '7']);
    const port = await until('the counter simulator to listen', () => /answering SCPI on [\d.]+:(\d+)/.exec(counter!.output())?.[1]);

    const page = await newPage(browser);
    try {
      await signIn(page, 'engineer@kilocycle.test');
      await page.goto(`/runs/${run.id}`);
      await page.getByRole('heading', { name: new RegExp(`Warm-up run #${run.id}`) }).waitFor();
      await page.getByTestId('live-status').filter({ hasText: 'Live' }).waitFor({ timeout: 15_000 });
      const before = await readingCount(page);

      const spool = join(mkdtempSync(join(tmpdir(), 'kc-spool-')), 'run.jsonl');
      bridge = start(BRIDGE, [
        '--server', BASE_URL, '--token', token, '--run', String(run.id), '--source', `scpi://127.0.0.1:${port}`,
        '--interval', '150', '--time-zero', 'now', '--spool', spool, '--status-every', '1000',
      ]);

      // Points arrive without a reload, and the count follows them.
      await page.getByTestId('warmup-chart').waitFor({ timeout: 20_000 });
      await page.waitForFunction((n) => {
        const text = document.querySelector('[data-testid="live-status"]')?.textContent ?? '';
        return Number(/(\d+)\s+readings/.exec(text)?.[1] ?? 0) >= n;
      }, before + 30, { timeout: 30_000 });

      // The fit appears once the readings show the curve, and keeps up as more come in.
      const tau = page.getByTestId('fit-tau');
      await tau.waitFor({ timeout: 40_000 });
      const tauText = await tau.innerText();
      const tauSeconds = Number(/([\d\s]+(?:\.\d+)?)\s*s/.exec(tauText)?.[1]?.replace(/\s/g, ''));
      expect(tauSeconds).toBeGreaterThan(0);
      expect(await page.getByTestId('fit-finf').innerText()).toMatch(/kHz|MHz/);
      const chartLabel = (await page.getByTestId('warmup-chart').getAttribute('aria-label')) ?? '';
      expect(Number(/(\d+) points/.exec(chartLabel)?.[1])).toBeGreaterThanOrEqual(30);
      expect(await readingCount(page)).toBeGreaterThan(before);
      await keepScreenshot(page, 'live-warmup');
    } catch (error) {
      await keepScreenshot(page, 'live-warmup-failure').catch(() => undefined);
      throw new Error(`${(error as Error).message}\nbridge: ${bridge?.output().slice(-800) ?? ''}\ncounter: ${counter.output().slice(-400)}`);
    } finally {
      await page.context().close();
    }
  });
});
