import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { coverageFactor } from '@kilocycle/common/math';
import type { Bench, BenchTokenResponse, ListResponse, Run, RunAnalysis, WarmupRunAnalysis } from '@kilocycle/common/types';
import { BASE_URL, DEMO_PASSWORD, keepScreenshot, launchBrowser, newPage, signIn } from './support/browser';
import { OSCILLATOR_MODEL, assertBridgeBuilt, BRIDGE, COUNTER_SIM, simulatorPort, startNode, stopChild, type Child } from './support/bench-processes';
import { apiGet, apiLogin, apiRequest } from './support/lab';

// Journey 2 (PRODUCT.md §4): the bridge reads a (simulated) counter over SCPI/TCP and streams a warm-up into a run;
// the run's page shows the points and the fitted τ as they arrive, without a reload.

/** Simulated seconds per real second: τ = 420 s simulated becomes 7 s of real time, so two τ take 14 s. */
const SPEED = 60;

/** The count in "1 234 readings" (digit-grouped with spaces). */
function countIn(text: string): number {
  return Number(/(\d[\d\s\u00a0\u2009\u202f]*)readings/.exec(text)?.[1]?.replace(/\D/g, '') ?? 0);
}

async function readingCount(page: Page) {
  return countIn(await page.getByTestId('live-status').innerText());
}

describe('live warm-up: journey 2 (browser)', () => {
  let browser: Browser;
  let counter: Child | null = null;
  let bridge: Child | null = null;

  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await stopChild(bridge, 'SIGINT');
    await stopChild(counter);
    await browser?.close();
  });

  it('should show the bridge’s readings and a fitted τ that matches the simulator’s own τ within the fit’s interval', async () => {
    assertBridgeBuilt([OSCILLATOR_MODEL]);
    const { WARMUP_TAU_S } = (await import(pathToFileURL(OSCILLATOR_MODEL).href)) as { WARMUP_TAU_S: number };
    expect(WARMUP_TAU_S).toBeGreaterThan(0);
    const expectedTau = WARMUP_TAU_S / SPEED; // the bridge stamps readings in real seconds

    // The administrator sets up a bench of its own for this test and issues its token; the engineer opens a warm-up run
    // on it in the demo's live job, so the fit sees the simulator's readings only (a bench takes one open run at a time).
    const admin = await apiLogin('admin@kilocycle.test', DEMO_PASSWORD);
    const engineer = await apiLogin('engineer@kilocycle.test', DEMO_PASSWORD);
    const benches = await apiGet<ListResponse<Bench>>(admin, `/benches?q=${encodeURIComponent('Bench 1')}`);
    const demoBench = benches.items.find((b) => b.name === 'Bench 1');
    if (!demoBench) throw new Error('the demo has no Bench 1: reseed the database');
    const runs = await apiGet<ListResponse<Run>>(admin, `/runs?benchId=${demoBench.id}&kind=warmup&status=open`);
    const demoRun = runs.items[0];
    if (!demoRun) throw new Error('the demo has no open warm-up run on Bench 1: reseed the database');
    const bench = await apiRequest<Bench>(admin, 'POST', '/benches', {
      name: `Live warm-up test bench ${Date.now().toString(36)}`,
      location: 'Browser test',
      defaultStandardId: demoBench.defaultStandardId,
    });
    const { token } = await apiRequest<BenchTokenResponse>(admin, 'POST', `/benches/${bench.id}/token`);
    const run = await apiRequest<Run>(engineer, 'POST', `/jobs/${demoRun.jobId}/runs`, {
      rangeId: demoRun.rangeId,
      kind: 'warmup',
      benchId: bench.id,
      configuration: 'Browser test: simulated counter over SCPI',
      notes: 'Cold start; counter on a 1 s gate. Started by the live warm-up browser test.',
    });

    const page = await newPage(browser);
    try {
      await signIn(page, 'engineer@kilocycle.test');
      await page.goto(`/runs/${run.id}`);
      await page.getByRole('heading', { name: new RegExp(`Warm-up run #${run.id}`) }).waitFor();
      expect(await readingCount(page)).toBe(0);
      // No bridge has fed this run yet: no Live chip (and no "offline" either).
      expect(await page.getByTestId('bridge-chip').count()).toBe(0);

      // The simulated counter on a free port, started just before the bridge so the record begins early in the warm-up.
      counter = startNode(COUNTER_SIM, ['--port', '0', '--profile', 'warmup', '--speed', String(SPEED), '--seed', '7']);
      const port = await simulatorPort(counter);
      const spool = join(mkdtempSync(join(tmpdir(), 'kc-spool-')), 'run.jsonl');
      const bridgeStarted = Date.now();
      bridge = startNode(BRIDGE, [
        '--server',
        BASE_URL,
        '--token',
        token,
        '--run',
        String(run.id),
        '--source',
        `scpi://127.0.0.1:${port}`,
        '--interval',
        '150',
        '--time-zero',
        'now',
        '--spool',
        spool,
        '--status-every',
        '1000',
      ]);

      // The page says Live while the bridge feeds it; points arrive without a reload, and the count follows them.
      await page.getByTestId('bridge-chip').filter({ hasText: 'Live' }).waitFor({ timeout: 20_000 });
      await page.getByTestId('warmup-chart').waitFor({ timeout: 20_000 });
      await page.waitForFunction(
        (n) => {
          const text = document.querySelector('[data-testid="live-status"]')?.textContent ?? '';
          return Number(/(\d[\d\s\u00a0\u2009\u202f]*)readings/.exec(text)?.[1]?.replace(/\D/g, '') ?? 0) >= n;
        },
        30,
        { timeout: 30_000 },
      );

      // The fit appears once the readings show the curve, and keeps up as more come in.
      const tau = page.getByTestId('fit-tau');
      await tau.waitFor({ timeout: 40_000 });
      const tauText = await tau.innerText();
      expect(Number(/([\d\s]+(?:\.\d+)?)\s*s/.exec(tauText)?.[1]?.replace(/\s/g, ''))).toBeGreaterThan(0);
      expect(await page.getByTestId('fit-finf').innerText()).toMatch(/kHz|MHz/);
      const chartLabel = (await page.getByTestId('warmup-chart').getAttribute('aria-label')) ?? '';
      expect(Number(/(\d+) points/.exec(chartLabel)?.[1])).toBeGreaterThanOrEqual(30);

      // About two simulated time constants of record (14 s of the bridge's clock: on a loaded machine the readings come
      // slower than one per 150 ms, but the fit depends on the span they cover, not on their number), then the fit the
      // page shows, from the analysis API (which gives τ's standard error): the simulator's τ lies within τ ± k·u(τ).
      const recordMs = 2 * expectedTau * 1000 + 1500;
      await new Promise((r) => setTimeout(r, Math.max(0, bridgeStarted + recordMs - Date.now())));
      const analysis = await apiGet<RunAnalysis>(engineer, `/runs/${run.id}/analysis`);
      if (analysis.analysis !== 'warmup') throw new Error(`the run's analysis is not a warm-up fit: ${JSON.stringify(analysis).slice(0, 300)}`);
      const fit = (analysis as WarmupRunAnalysis).fit;
      // 99.73 % (the "3σ" probability, k from Student's t): a 95 % interval would fail one honest run in twenty, and the
      // readings' time stamps carry the machine's scheduling jitter on top of the counter's noise.
      const k = coverageFactor(fit.n - 3, 0.9973);
      console.log(
        `live warm-up: fitted τ = ${fit.tau.toFixed(3)} s ± ${(k * fit.seTau).toFixed(3)} s (k = ${k.toFixed(2)}, n = ${fit.n}); simulator τ = ${WARMUP_TAU_S} s / ${SPEED} = ${expectedTau.toFixed(3)} s`,
      );
      expect(fit.seTau).toBeGreaterThan(0);
      expect(Math.abs(fit.tau - expectedTau)).toBeLessThanOrEqual(k * fit.seTau);
      // The page's live count catches up with every reading the fit used.
      await page.waitForFunction(
        (n) => {
          const text = document.querySelector('[data-testid="live-status"]')?.textContent ?? '';
          return Number(/(\d[\d\s\u00a0\u2009\u202f]*)readings/.exec(text)?.[1]?.replace(/\D/g, '') ?? 0) >= n;
        },
        fit.n,
        { timeout: 20_000 },
      );
      // 14 s into a warm-up that settles within 5 Hz only after τ·ln(|A|/5 Hz) ≈ 38 s: the page says that lies beyond the record.
      expect(await page.getByTestId('settled-within').innerText()).toMatch(/extrapolated beyond the \d+\s+s recorded/);
      // The run's notes show in its Notes panel.
      expect(await page.getByTestId('run-notes-text').innerText()).toContain('Started by the live warm-up browser test.');
      await keepScreenshot(page, 'live-warmup');
      await page.setViewportSize({ width: 390, height: 844 });
      await keepScreenshot(page, 'live-warmup-390');

      // Once the bridge stops, the chip says so instead of staying Live.
      await stopChild(bridge, 'SIGINT');
      await page
        .getByTestId('bridge-chip')
        .filter({ hasText: /Bridge offline since \d\d:\d\d:\d\d/ })
        .waitFor({ timeout: 20_000 });
      expect(await page.getByTestId('bridge-chip').innerText()).not.toContain('Live');
    } catch (error) {
      await keepScreenshot(page, 'live-warmup-failure').catch(() => undefined);
      throw new Error(`${(error as Error).message}\nbridge: ${bridge?.output().slice(-800) ?? ''}\ncounter: ${counter?.output().slice(-400) ?? ''}`, {
        cause: error,
      });
    } finally {
      await page.context().close();
    }
  }, 150_000);
});
