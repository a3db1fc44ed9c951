import { readFileSync } from 'node:fs';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Run } from '@kilocycle/common/types';
import { BASE_URL, DEMO_PASSWORD, keepScreenshot, launchBrowser, onNewPage, signIn } from './support/browser';
import { apiLogin, apiRequest, ownJobAtBench } from './support/lab';
import { waitForPageSettled } from './support/main-pages';

// A phase (time-interval) stability run as the engineer meets it: typed time intervals with their units, the page
// saying what the deviations were computed from and how, gaps filled on request with the count stated, the time
// deviation on its own chart in seconds, and the chart saved as SVG with every point's terms, edf and interval.

async function upload(token: string, runId: number, csv: string, name: string): Promise<void> {
  const form = new FormData();
  form.append('file', new Blob([csv], { type: 'text/csv' }), name);
  const response = await fetch(`${BASE_URL}/api/runs/${runId}/imports`, { method: 'POST', headers: { Authorization: `Bearer ${token}` }, body: form });
  if (!response.ok) throw new Error(`import into run ${runId} answered ${response.status}: ${await response.text()}`);
}

describe('a phase stability run (browser)', () => {
  let browser: Browser;
  let typedRunId: number;
  let gappedRunId: number;

  beforeAll(async () => {
    browser = await launchBrowser();
    const tech = await apiLogin('tech@kilocycle.test', DEMO_PASSWORD);
    const engineer = await apiLogin('engineer@kilocycle.test', DEMO_PASSWORD);
    const { instrument, job } = await ownJobAtBench(tech, 'TI-2 reference oscillator', `E2E-P-${Date.now()}`);
    const rangeId = instrument.ranges[0]!.id;
    typedRunId = (await apiRequest<Run>(engineer, 'POST', `/jobs/${job.id}/runs`, { rangeId, kind: 'stability', dataKind: 'phase' })).id;
    gappedRunId = (await apiRequest<Run>(engineer, 'POST', `/jobs/${job.id}/runs`, { rangeId, kind: 'stability', dataKind: 'phase' })).id;
    // 600 phase readings at 1 s in ns (a slow quadratic plus a deterministic wobble), seconds 300–309 missing: one gap of 10.
    const lines: string[] = [];
    for (let i = 0; i < 610; i++) {
      if (i >= 300 && i < 310) continue;
      lines.push(`${i},${(0.5 * 2e-3 * i * i + 0.3 * Math.sin(i * 1.7) + 0.2 * Math.cos(i * 0.37)).toFixed(4)}`);
    }
    await upload(engineer, gappedRunId, `Time (s),Time interval (ns)\n${lines.join('\n')}\n`, 'tic-with-gap.csv');
  });

  afterAll(async () => {
    await browser?.close();
  });

  it('should take a typed time interval with its unit, show what it will store, and store it in seconds', async () => {
    await onNewPage(browser, 'phase-typed', async (page) => {
      await signIn(page, 'engineer@kilocycle.test');
      await page.goto(`/runs/${typedRunId}`);
      await waitForPageSettled(page);
      const field = page.getByRole('textbox', { name: 'Time interval (s)' });
      await field.fill('12.5 ns');
      expect(await page.getByTestId('time-interval-understood').textContent()).toBe('= 1.250 00×10⁻⁸ s');
      await field.press('Enter');
      await expect.poll(() => page.getByTestId('last-saved').textContent(), { timeout: 15_000 }).toMatch(/^Saved #1: 1\.250 00×10⁻⁸ s at /);
      await keepScreenshot(page, 'phase-typed-1440');
    });
  });

  it('should say the deviations come from phase data, fill the gap on request with the count stated, and draw TDEV in seconds', async () => {
    await onNewPage(browser, 'phase-analysis', async (page) => {
      await signIn(page, 'engineer@kilocycle.test');
      await page.goto(`/runs/${gappedRunId}`);
      await waitForPageSettled(page);
      await page.getByTestId('adev-chart').locator('.MuiChartsAxis-tickLabel').first().waitFor();
      expect(await page.getByTestId('figure-data').innerText()).toContain('Phase');
      expect(await page.getByTestId('conversion').innerText()).toContain('computed from phase data');
      expect(await page.getByTestId('segment').innerText()).toContain('the longest continuous segment: 300 of 600');
      await page.getByRole('button', { name: 'Fill gaps (phase data only)' }).click();
      await expect.poll(() => page.getByTestId('filled').innerText(), { timeout: 15_000 }).toContain('10 points filled');
      expect(await page.getByTestId('conversion').innerText()).toContain('10 phase points filled by straight lines');
      await page.getByTestId('tdev-chart').locator('.MuiChartsAxis-tickLabel').first().waitFor();
      expect(await page.getByText('Drift, three-point').count()).toBeGreaterThan(0);
      expect(await page.getByText('Drift, bisection').count()).toBeGreaterThan(0);
      await keepScreenshot(page, 'phase-analysis-1440');
      await page.setViewportSize({ width: 390, height: 844 });
      await page.waitForTimeout(400);
      await keepScreenshot(page, 'phase-analysis-390');
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    });
  });

  it('should save the deviation chart as an SVG carrying every point with its terms, edf and interval, and as a PNG at twice its size', async () => {
    await onNewPage(browser, 'phase-svg', async (page) => {
      await signIn(page, 'engineer@kilocycle.test');
      await page.goto(`/runs/${gappedRunId}`);
      await waitForPageSettled(page);
      await page.getByTestId('adev-chart').locator('.MuiChartsAxis-tickLabel').first().waitFor();
      const table = page.getByRole('table', { name: 'Deviations table' });
      const rows = await table.locator('tbody tr').count();
      const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: /^Save SVG: Deviations/ }).click()]);
      expect(download.suggestedFilename()).toMatch(/\.svg$/);
      const svg = readFileSync((await download.path())!, 'utf8');
      expect(svg.startsWith('<?xml') || svg.startsWith('<svg')).toBe(true);
      expect(svg).toContain('<desc');
      expect(svg).toMatch(/terms/i);
      expect(svg).toMatch(/edf/i);
      expect(svg).toMatch(/95 %|95%/);
      // One line of the point table per τ of the page's table, at least (each deviation shown has its own).
      expect((svg.match(/τ = /g) ?? []).length).toBeGreaterThanOrEqual(rows);
      // The PNG: a PNG file (its eight-byte signature, PNG specification §5.2) drawn at twice the chart's size.
      const [png] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: /^Save PNG: Deviations/ }).click()]);
      expect(png.suggestedFilename()).toMatch(/\.png$/);
      const bytes = readFileSync((await png.path())!);
      expect([...bytes.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
      const svgWidth = Number(/<svg[^>]* width="(\d+)"/.exec(svg)![1]);
      expect(bytes.readUInt32BE(16)).toBe(2 * svgWidth);
    });
  });
});
