import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Bench, BenchTokenResponse, Instrument, ListResponse, Run } from '@kilocycle/common/types';
import { BASE_URL, DEMO_PASSWORD, keepScreenshot, launchBrowser, newPage, signIn } from './support/browser';
import { assertBridgeBuilt, BRIDGE, COUNTER_SIM, simulatorPort, startNode, stopChild, type Child } from './support/bench-processes';
import { apiGet, apiLogin, apiRequest } from './support/lab';

// Journey 6 (PRODUCT.md §4): with the bridge live on the bench's counter (the SCPI simulator here), the technician
// types only the dial and presses Enter; the settled counter reading fills in, with its n and SD.

/** The target: the page shows the stored setting within 300 ms of the settle condition being met. */
const SETTLE_TO_SHOWN_LIMIT_MS = 300;

describe('counter-assisted capture: journey 6 (browser)', () => {
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

  it('should take a typed dial from the settled counter, abandon one on Esc, and refuse once the bridge stops', async () => {
    // A missing build fails the test: the journey cannot be shown without the bridge and the simulator.
    assertBridgeBuilt();

    // Set-up through the API: a bench of its own (so no other test's bridge is cut by a new token), and a fresh as-found
    // run on it, on the range of an open demo job.
    const admin = await apiLogin('admin@kilocycle.test', DEMO_PASSWORD);
    const tech = await apiLogin('tech@kilocycle.test', DEMO_PASSWORD);
    const bench = await apiRequest<Bench>(admin, 'POST', '/benches', { name: `Counter capture bench ${Date.now().toString(36)}`, location: 'Browser test' });
    const open = await apiGet<ListResponse<Run>>(tech, '/runs?kind=as_found&status=open&pageSize=50');
    const base = open.items.find((r) => r.refusal === null && r.standardId !== null);
    if (!base) throw new Error('the demo has no open as-found run with a standard: reseed the database');
    const instrument = await apiGet<Instrument>(tech, `/instruments/${base.instrumentId}`);
    const range = instrument.ranges.find((r) => r.id === base.rangeId)!;
    const run = await apiRequest<Run>(tech, 'POST', `/jobs/${base.jobId}/runs`, {
      rangeId: range.id,
      kind: 'as_found',
      benchId: bench.id,
      standardId: base.standardId,
    });
    const { token } = await apiRequest<BenchTokenResponse>(admin, 'POST', `/benches/${bench.id}/token`);
    const dials = [0.25, 0.5, 0.75].map((f) => Math.round(range.dialMin + f * (range.dialMax - range.dialMin)));

    const page = await newPage(browser);
    try {
      await signIn(page, 'tech@kilocycle.test');
      await page.goto(`/runs/${run.id}`);
      const dial = page.getByLabel(/^Dial \(/);
      await dial.waitFor();
      // No bridge has fed this run yet: nothing bridge-like on the page.
      expect(await page.getByTestId('bridge-chip').count()).toBe(0);

      // The simulated counter, already settled, tuned near the first setting (a direct-reading dial in kHz or MHz, else
      // mid-range; the simulator's own dial error stays); the bridge polls it four times a second.
      const perDial = range.dialUnit === 'kHz' ? 1e3 : range.dialUnit === 'MHz' ? 1e6 : null;
      const mid = Math.min(range.freqMaxHz, Math.max(range.freqMinHz, perDial ? dials[0]! * perDial : (range.freqMinHz + range.freqMaxHz) / 2));
      counter = startNode(COUNTER_SIM, [
        '--port',
        '0',
        '--profile',
        'stable',
        '--span',
        `${range.freqMinHz}-${range.freqMaxHz}`,
        '--frequency',
        String(mid),
        '--seed',
        '11',
      ]);
      const port = await simulatorPort(counter);
      const spool = join(mkdtempSync(join(tmpdir(), 'kc-spool-')), 'run.jsonl');
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
        '250',
        '--spool',
        spool,
        '--status-every',
        '1000',
      ]);

      // Live only once the bridge is attached; the counter-assisted switch turns on with it.
      await page.getByTestId('bridge-chip').filter({ hasText: 'Live' }).waitFor({ timeout: 20_000 });
      expect(await page.getByLabel('Counter fills the reading').isChecked()).toBe(true);
      expect(await page.getByLabel('Counter', { exact: true }).count()).toBe(0);

      // Type the dial, Enter: the waiting line, then the stored setting with its mean, n and SD. The page notes the
      // moment the stored line appears; the server stamps the moment the settle condition was met.
      await page.evaluate(() => {
        const w = window as unknown as { __shownAt?: number };
        w.__shownAt = undefined;
        new MutationObserver((_, observer) => {
          if (document.querySelector('[data-testid="last-saved"][data-settled-at]')) {
            w.__shownAt = Date.now();
            observer.disconnect();
          }
        }).observe(document.body, { subtree: true, childList: true, attributes: true });
      });
      await dial.fill(String(dials[0]));
      await dial.press('Enter');
      await page.getByTestId('capture-waiting').filter({ hasText: 'Waiting for the counter to settle' }).waitFor({ timeout: 5_000 });
      await keepScreenshot(page, 'counter-capture-waiting');
      const saved = page.getByTestId('last-saved');
      await saved.filter({ hasText: 'mean of 5' }).waitFor({ timeout: 20_000 });
      const text = await saved.innerText();
      expect(text.replace(/[\s\u00a0\u2009\u202f]/g, '')).toContain(`dial${dials[0]}`);
      expect(text).toMatch(/mean of 5, s = [\d.]+ Hz/);
      const settledAt = Date.parse((await saved.getAttribute('data-settled-at'))!);
      const shownAt = await page.evaluate(() => (window as unknown as { __shownAt?: number }).__shownAt);
      expect(shownAt).toBeDefined();
      const settleToShown = shownAt! - settledAt;
      const sentAt = Date.parse((await saved.getAttribute('data-sent-at'))!);
      console.log(
        `counter capture: settle→shown ${settleToShown} ms (settle→event sent ${sentAt - settledAt} ms on the server, sent→shown ${shownAt! - sentAt} ms)`,
      );
      expect(settleToShown).toBeGreaterThanOrEqual(0);
      expect(settleToShown).toBeLessThan(SETTLE_TO_SHOWN_LIMIT_MS);

      // The stored reading: one at the dial, the mean of the counter readings behind it.
      const readings = await apiGet<ListResponse<{ dial: number | null; frequency: number; source: string }>>(
        tech,
        `/runs/${run.id}/readings?pageSize=500&sort=seq`,
      );
      const setting = readings.items.filter((r) => r.dial === dials[0]);
      expect(setting).toHaveLength(1);
      expect(setting[0]!.source).toBe('bridge');
      expect(Math.abs(setting[0]!.frequency - mid) / mid).toBeLessThan(0.01);
      await keepScreenshot(page, 'counter-capture-stored');

      // Esc abandons a setting: nothing is stored for it.
      await dial.fill(String(dials[1]));
      await dial.press('Enter');
      await page.getByTestId('capture-waiting').waitFor({ timeout: 5_000 });
      await dial.press('Escape');
      await page.getByText(`nothing was stored for it`).waitFor({ timeout: 5_000 });
      const after = await apiGet<ListResponse<{ dial: number | null }>>(tech, `/runs/${run.id}/readings?pageSize=500&sort=seq`);
      expect(after.items.filter((r) => r.dial === dials[1])).toHaveLength(0);

      // The bridge stops: the chip says since when it is offline, and the form refuses with the server's reason.
      await stopChild(bridge, 'SIGINT');
      bridge = null;
      await page
        .getByTestId('bridge-chip')
        .filter({ hasText: /Bridge offline since \d\d:\d\d:\d\d/ })
        .waitFor({ timeout: 10_000 });
      await dial.fill(String(dials[2]));
      await dial.press('Enter');
      const refusal = page.getByRole('alert').filter({ hasText: 'Not taken — no bridge is connected' });
      await refusal.waitFor({ timeout: 5_000 });
      await keepScreenshot(page, 'counter-capture-refused');
      await page.setViewportSize({ width: 390, height: 844 });
      await keepScreenshot(page, 'counter-capture-refused-390');
    } catch (error) {
      await keepScreenshot(page, 'counter-capture-failure').catch(() => undefined);
      throw new Error(`${(error as Error).message}\nbridge: ${bridge?.output().slice(-800) ?? ''}\ncounter: ${counter?.output().slice(-400) ?? ''}`, {
        cause: error,
      });
    } finally {
      await page.context().close();
    }
  });
});
