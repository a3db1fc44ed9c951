import type { Browser, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Run } from '@kilocycle/common/types';
import { BASE_URL, DEMO_PASSWORD, keepScreenshot, launchBrowser, signIn } from './support/browser';
import { apiLogin, apiRequest, ownJobAtBench } from './support/lab';
import { findDemoRecords, waitForPageSettled, type DemoRecords } from './support/main-pages';
import { patientPage } from './support/patient-page';

// Numbers and charts as people read them: clean log-axis ticks, τ to three digits, labels that are not cut,
// error bars on the comparison, and a readings table that prints six-digit sequence numbers whole.

const SUPERSCRIPTS = '⁻⁰¹²³⁴⁵⁶⁷⁸⁹';

async function upload(token: string, runId: number, csv: string, name: string): Promise<void> {
  const form = new FormData();
  form.append('file', new Blob([csv], { type: 'text/csv' }), name);
  const response = await fetch(`${BASE_URL}/api/runs/${runId}/imports`, { method: 'POST', headers: { Authorization: `Bearer ${token}` }, body: form });
  if (!response.ok) throw new Error(`import into run ${runId} answered ${response.status}: ${await response.text()}`);
}

/** A small deterministic generator (Park–Miller), so the record is the same every run. */
function noise(seed: number) {
  let state = seed;
  return () => {
    state = (state * 48_271) % 2_147_483_647;
    return state / 2_147_483_647 - 0.5;
  };
}

const tickTexts = (chart: Locator, direction: 'X' | 'Y') => chart.locator(`.MuiChartsAxis-direction${direction} .MuiChartsAxis-tickLabel`).allTextContents();

/** Every tick label of a chart lies inside its SVG (none cut at an edge). */
async function labelsInside(chart: Locator): Promise<string[]> {
  return chart.evaluate((root) => {
    // The plot's own surface: the widest SVG inside (legend swatches are SVGs too).
    const svg = [...root.querySelectorAll('svg')].sort((a, b) => b.getBoundingClientRect().width - a.getBoundingClientRect().width)[0];
    if (!svg) return ['no svg'];
    const box = svg.getBoundingClientRect();
    const outside: string[] = [];
    root.querySelectorAll('.MuiChartsAxis-tickLabel').forEach((label) => {
      const r = label.getBoundingClientRect();
      if (r.width === 0) return;
      if (r.left < box.left - 0.5 || r.right > box.right + 0.5)
        outside.push(`${label.textContent} [${Math.round(r.left)}–${Math.round(r.right)} of ${Math.round(box.left)}–${Math.round(box.right)}]`);
    });
    return outside;
  });
}

/** Screenshots at 1440 and 390 px; answers how wide the page is at 390 px (wider means it scrolls sideways). */
async function bothWidths(page: Page, name: string): Promise<number> {
  await keepScreenshot(page, `${name}-1440`);
  await page.setViewportSize({ width: 390, height: 844 });
  await page.waitForTimeout(300);
  await keepScreenshot(page, `${name}-390`);
  const width = await page.evaluate(() => document.documentElement.scrollWidth);
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.waitForTimeout(300);
  return width;
}

describe('numbers and charts (browser)', () => {
  let browser: Browser;
  let demo: DemoRecords;
  let calibrationRunId: number;
  let stabilityRunId: number;

  beforeAll(async () => {
    browser = await launchBrowser();
    demo = await findDemoRecords();
    const tech = await apiLogin('tech@kilocycle.test', DEMO_PASSWORD);
    const engineer = await apiLogin('engineer@kilocycle.test', DEMO_PASSWORD);
    const { instrument, job, standardId } = await ownJobAtBench(tech, 'SG-4 signal generator', `E2E-N-${Date.now()}`);
    const rangeId = instrument.ranges[0]!.id;

    // A calibration file without a time column, with one reading 9.4 kHz off (an outlier that widens the error axis).
    const calibration = await apiRequest<Run>(tech, 'POST', `/jobs/${job.id}/runs`, { rangeId, kind: 'as_found', standardId });
    calibrationRunId = calibration.id;
    const jitter = noise(11);
    const rows = Array.from({ length: 11 }, (_, i) => 1750 + 25 * i).map((dial) => {
      const error = dial === 1900 ? -9_400 : -40 + 0.2 * (dial - 1750) + 6 * jitter();
      return `${dial},${((dial * 1000 + error) / 1000).toFixed(4)} kHz`;
    });
    await upload(tech, calibrationRunId, `dial,frequency\n${rows.join('\n')}\n`, 'untimed.csv');
    // Two readings as a bridge numbers them after a long day: six-digit sequence numbers.
    await apiRequest(tech, 'POST', `/runs/${calibrationRunId}/readings`, {
      readings: [
        { seq: 400_001, dial: 1760, frequency: 1_760_010 },
        { seq: 400_002, dial: 1990, frequency: 1_990_020 },
      ],
    });

    // A stability record at ten readings a second: τ0 = 0.1 s, read back from time stamps with float noise.
    const stability = await apiRequest<Run>(engineer, 'POST', `/jobs/${job.id}/runs`, { rangeId, kind: 'stability', standardId });
    stabilityRunId = stability.id;
    const white = noise(29);
    const lines = Array.from({ length: 3_000 }, (_, i) => `${(i / 10).toFixed(1)},${(1_800_000 + 0.05 * white()).toFixed(4)}`);
    await upload(engineer, stabilityRunId, `t,frequency\n${lines.join('\n')}\n`, 'ten-per-second.csv');
  });

  afterAll(async () => {
    await browser?.close();
  });

  it('should label the Allan deviation axes at decades, cleanly, and give τ three significant digits', async () => {
    const page = await patientPage(browser);
    try {
      await signIn(page, 'engineer@kilocycle.test');
      await page.goto(`/runs/${stabilityRunId}`);
      await waitForPageSettled(page);
      const chart = page.getByTestId('adev-chart');
      await chart.locator('.MuiChartsAxis-tickLabel').first().waitFor();

      const xTicks = await tickTexts(chart, 'X');
      expect(xTicks.length, `x ticks: ${xTicks.join(' | ')}`).toBeGreaterThanOrEqual(3);
      for (const tick of xTicks) expect(tick, `x tick "${tick}"`).toMatch(/^\d{1,3}(\.\d{1,2})?$/);
      expect(xTicks).toEqual(expect.arrayContaining(['0.1', '1', '10']));
      const yTicks = await tickTexts(chart, 'Y');
      expect(yTicks.length, `y ticks: ${yTicks.join(' | ')}`).toBeGreaterThanOrEqual(2);
      for (const tick of yTicks) expect(tick, `y tick "${tick}"`).toMatch(new RegExp(`^[125]×10[${SUPERSCRIPTS}]+$`));
      expect(await labelsInside(chart)).toEqual([]);
      expect(await chart.getByTestId('adev-confidence-bars').locator('line').count()).toBeGreaterThan(0);

      const table = page.getByRole('table', { name: 'Deviations table' });
      const taus = (await table.locator('tbody tr td:first-child').allInnerTexts()).map((t) => t.trim());
      // Octaves of τ0 = 0.1 s: 0.1, 0.2, 0.4, … 1.6, 3.2 … 102.4 (three significant digits: 102).
      expect(taus.slice(0, 8)).toEqual(['0.1', '0.2', '0.4', '0.8', '1.6', '3.2', '6.4', '12.8']);
      expect(taus).toContain('102');
      expect(await bothWidths(page, 'numbers-stability')).toBeLessThanOrEqual(390);
    } catch (error) {
      await keepScreenshot(page, 'numbers-failure').catch(() => undefined);
      throw error;
    } finally {
      await page.context().close();
    }
  });

  it('should keep the error axis labels whole beside an outlier, and print sequence numbers and untimed rows honestly', async () => {
    const page = await patientPage(browser);
    try {
      await signIn(page, 'tech@kilocycle.test');
      await page.goto(`/runs/${calibrationRunId}`);
      await waitForPageSettled(page);
      const chart = page.getByTestId('error-chart');
      await chart.locator('.MuiChartsAxis-tickLabel').first().waitFor();
      const yTicks = await tickTexts(chart, 'Y');
      expect(
        yTicks.some((t) => /^-\d{1,2} 000$/.test(t)),
        `y ticks: ${yTicks.join(' | ')}`,
      ).toBe(true);
      for (const tick of yTicks) expect(tick).not.toContain('…');
      expect(await labelsInside(chart)).toEqual([]);

      const grid = page.getByRole('grid', { name: 'Readings' });
      const seqCells = grid.locator('[role="gridcell"][data-field="seq"]');
      await seqCells.first().waitFor();
      const cut = await seqCells.evaluateAll((cells) => cells.filter((c) => (c.firstElementChild ?? c).scrollWidth > c.clientWidth).map((c) => c.textContent));
      expect(cut).toEqual([]);
      expect(await seqCells.allTextContents()).toEqual(expect.arrayContaining(['400002', '400001']));
      const untimedRow = grid.locator('[role="row"]').filter({ has: page.locator('[data-field="seq"]', { hasText: /^11$/ }) });
      expect((await untimedRow.locator('[data-field="t"]').innerText()).trim()).toBe('—');
      await bothWidths(page, 'numbers-calibration-run');
    } catch (error) {
      await keepScreenshot(page, 'numbers-failure').catch(() => undefined);
      throw error;
    } finally {
      await page.context().close();
    }
  });

  it('should mark each measured setting on the review chart and keep its last label inside', async () => {
    const page = await patientPage(browser);
    try {
      await signIn(page, 'lead@kilocycle.test');
      await page.goto(`/reviews/${demo.reviewJobId}`);
      await waitForPageSettled(page);
      const chart = page
        .locator('svg')
        .filter({ has: page.locator('.MuiChartsAxis-tickLabel') })
        .filter({ hasText: 'Error (Hz)' })
        .first();
      await chart.waitFor();
      // x-charts draws no marks unless a series asks for them: each as-found and as-left setting is a circle.
      expect(await chart.locator('circle.MuiLineChart-mark').count()).toBeGreaterThan(2);
      const outside = await chart.evaluate((svg) => {
        const box = svg.getBoundingClientRect();
        return [...svg.querySelectorAll('.MuiChartsAxis-tickLabel')]
          .map((l) => ({ text: l.textContent, r: l.getBoundingClientRect() }))
          .filter(({ r }) => r.width > 0 && (r.right > box.right + 0.5 || r.left < box.left - 0.5))
          .map(({ text }) => text);
      });
      expect(outside).toEqual([]);
      await bothWidths(page, 'numbers-review');
    } catch (error) {
      await keepScreenshot(page, 'numbers-failure').catch(() => undefined);
      throw error;
    } finally {
      await page.context().close();
    }
  });

  it('should draw each Allan deviation point of a comparison with its interval, and give the differences the page width', async () => {
    const page = await patientPage(browser);
    try {
      await signIn(page, 'engineer@kilocycle.test');
      await page.goto(`/comparisons/${demo.comparisonId}`);
      await page.getByTestId('comparison-sentence').first().waitFor({ timeout: 30_000 });
      const adev = page.getByRole('region', { name: 'Allan deviation' });
      await adev.locator('svg path[data-series^="adev-"]').first().waitFor();
      expect(await adev.locator('[data-testid^="adev-bars-"] line').count()).toBeGreaterThan(0);
      for (const tick of await adev.locator('.MuiChartsAxis-tickLabel').allTextContents())
        expect(tick).toMatch(new RegExp(`^[\\d .]+$|^[125]×10[${SUPERSCRIPTS}]+$`));

      const table = page.getByRole('region', { name: 'Differences' });
      const [tableWidth, mainWidth] = await Promise.all([
        table.evaluate((e) => e.getBoundingClientRect().width),
        page.locator('main').evaluate((e) => e.getBoundingClientRect().width),
      ]);
      expect(tableWidth / mainWidth).toBeGreaterThan(0.85);
      for (const sentence of await page.getByTestId('comparison-sentence').allInnerTexts()) {
        // Both ends of the interval carry the unit and their own direction: no bare "−3 to 82".
        expect(sentence).toMatch(/\(95 % interval .+ (lower|higher)(, so it includes no change)?\)\.$/);
      }
      // At 390 px the wide tables scroll inside their panels; the page itself does not scroll sideways.
      expect(await bothWidths(page, 'numbers-comparison')).toBeLessThanOrEqual(390);
    } catch (error) {
      await keepScreenshot(page, 'numbers-failure').catch(() => undefined);
      throw error;
    } finally {
      await page.context().close();
    }
  });
});
