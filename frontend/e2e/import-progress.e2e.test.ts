import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Run } from '@kilocycle/common/types';
import { keepScreenshot, launchBrowser, onNewPage, signIn } from './support/browser';
import { apiRequest, ownJobAtBench, sessionToken } from './support/lab';

// A technician imports a long warm-up recording (200,000 rows of t and frequency) into a run: the dialog shows the
// bytes sent, then the server's own progress as it reads, checks and writes, pushed over the live socket (no
// polling), and ends with the count imported.

const ROWS = 200_000;

describe('import progress (browser)', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('should show the server’s progress while a long file is imported, then the count imported, at 1440 and 390 px', async () => {
    await onNewPage(browser, 'import-progress', importWithProgress);
  }, 120_000);
});

async function importWithProgress(page: Page) {
  await signIn(page, 'tech@kilocycle.test');
  const token = await sessionToken(page);
  const { instrument, job, standardId } = await ownJobAtBench(token, 'VFO-3 variable frequency oscillator', `E2E-I-${Date.now()}`);
  const run = await apiRequest<Run>(token, 'POST', `/jobs/${job.id}/runs`, { rangeId: instrument.ranges[0]!.id, kind: 'warmup', standardId });
  // A warm-up inside the range's 1750–2000 kHz: one reading a second, settling towards 1 875 kHz.
  const lines = ['t,frequency'];
  for (let i = 0; i < ROWS; i++) lines.push(`${i},${(1_875_000 - 900 * Math.exp(-i / 1800) + (i % 7) / 10).toFixed(1)}`);
  const csv = Buffer.from(lines.join('\n') + '\n');

  await page.goto(`/runs/${run.id}`);
  await page.getByRole('heading', { name: /Warm-up run #\d+/i }).waitFor();
  await page.getByRole('button', { name: 'Import CSV' }).click();
  await page.getByLabel('File to import').setInputFiles({ name: 'warmup-long.csv', mimeType: 'text/csv', buffer: csv });
  await page.getByRole('button', { name: 'Import', exact: true }).click();

  // The server's bar moves between 0 and 100 % while it works: progress events reached the page.
  const rows = page.getByRole('progressbar', { name: 'Rows processed' });
  const seen: number[] = [];
  for (let i = 0; i < 400; i++) {
    const finished = await page.getByRole('status').filter({ hasText: 'readings imported' }).count();
    if (finished > 0) break;
    const now = Number((await rows.getAttribute('aria-valuenow').catch(() => null)) ?? NaN);
    if (Number.isFinite(now) && now > 0 && now < 100 && !seen.includes(now)) {
      seen.push(now);
      if (seen.length === 1) await keepScreenshot(page, 'import-progress-working-1440');
    }
    await page.waitForTimeout(25);
  }
  expect(seen.length).toBeGreaterThan(0);
  // Never backwards.
  expect([...seen].sort((a, b) => a - b)).toEqual(seen);

  const done = page.getByRole('status').filter({ hasText: 'readings imported' });
  await done.waitFor({ timeout: 60_000 });
  expect(await done.innerText()).toContain(`${ROWS.toLocaleString('en-GB')} readings imported`);
  await keepScreenshot(page, 'import-progress-done-1440');
  await page.setViewportSize({ width: 390, height: 844 });
  await keepScreenshot(page, 'import-progress-done-390');
  // Closed, the run page shows the 200,000 readings and their fit, and nothing is wider than the phone.
  await page.getByRole('button', { name: 'Close', exact: true }).click();
  await page.getByText('200 000 readings', { exact: true }).first().waitFor();
  await page.waitForTimeout(500);
  // A chart drawn at 1440 px must shrink with the page (a grid track of 1fr would keep it at its drawn width).
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  await keepScreenshot(page, 'import-progress-run-390');
  await page.setViewportSize({ width: 1440, height: 900 });
}
