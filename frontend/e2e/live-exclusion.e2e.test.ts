import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ListResponse, Reading, Run } from '@kilocycle/common/types';
import { DEMO_PASSWORD, keepScreenshot, launchBrowser, onNewPage, signIn } from './support/browser';
import { apiGet, apiLogin, apiRequest, ownJobAtBench, sessionToken } from './support/lab';

// A technician has an as-found run open on the bench page (typed readings, no bench attached); the lead, on
// another screen, excludes one of its readings. The technician's page shows the exclusion and the refit at once,
// without a reload: the server's live `excluded` event reaches it.

const REASON = 'Counter gate still counting when read';

describe('live exclusion (browser)', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('should show a reading excluded on another screen, and the fit without it, at once', async () => {
    await onNewPage(browser, 'live-exclusion', exclusionSeenLive);
  });
});

async function exclusionSeenLive(page: Page) {
  await signIn(page, 'tech@kilocycle.test');
  const token = await sessionToken(page);

  // An instrument and job of our own (other browser tests share the demo ones), a run against an in-date standard.
  const { instrument, job, standardId } = await ownJobAtBench(token, 'VFO-3 variable frequency oscillator', `E2E-X-${Date.now()}`);
  const run = await apiRequest<Run>(token, 'POST', `/jobs/${job.id}/runs`, { rangeId: instrument.ranges[0]!.id, kind: 'as_found', standardId });
  expect(run.benchId).toBeNull();
  // Five settings across 1750–2000 kHz, the dial reading about 0.4 % high.
  const dials = [1750, 1800, 1875, 1950, 2000];
  await apiRequest(token, 'POST', `/runs/${run.id}/readings`, { readings: dials.map((dial, i) => ({ dial, frequency: Math.round(dial * 1000 * 0.996) + i })) });

  await page.goto(`/runs/${run.id}`);
  await page.getByRole('heading', { name: /As found run #\d+/ }).waitFor();
  await page.getByTestId('fit-summary').filter({ hasText: '5 used' }).waitFor();
  expect(await page.getByText(`Excluded: ${REASON}`, { exact: true }).count()).toBe(0);

  // The lead, on another screen, excludes reading 2.
  const lead = await apiLogin('lead@kilocycle.test', DEMO_PASSWORD);
  const readings = await apiGet<ListResponse<Reading>>(lead, `/runs/${run.id}/readings?sort=seq`);
  const second = readings.items.find((r) => r.seq === 2)!;
  await apiRequest<Reading>(lead, 'POST', `/runs/${run.id}/readings/${second.id}/exclusion`, { reason: REASON });

  // No reload: the live event marks the reading and the analysis is fetched again, within a few seconds.
  await page.getByText(`Excluded: ${REASON}`, { exact: true }).waitFor({ timeout: 5000 });
  await page.getByTestId('fit-summary').filter({ hasText: '4 used' }).waitFor({ timeout: 5000 });
  expect(await page.getByTestId('fit-summary').innerText()).toMatch(/5 taken, 1 excluded/);
  await keepScreenshot(page, 'live-exclusion-1440');
  await page.setViewportSize({ width: 390, height: 844 });
  await page.getByText(`Excluded: ${REASON}`, { exact: true }).scrollIntoViewIfNeeded();
  await keepScreenshot(page, 'live-exclusion-390');
  await page.setViewportSize({ width: 1440, height: 900 });
}
