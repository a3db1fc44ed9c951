import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { keepScreenshot, launchBrowser, onNewPage, signIn } from './support/browser';
import { apiGet, sessionToken } from './support/lab';

// Issue #14, items 3 and 6: the band planner works in ITU Region 1 (the demo lab's region) and says what its
// band edges are; the pages beside live equipment carry the high-voltage caution, also for people who only read.
describe('band planner in Region 1, and the cautions (browser)', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  for (const [width, height] of [
    [1440, 900],
    [390, 844],
  ] as const) {
    it(`should plan against Region 1's bands and give a dial setting, with the licence note, at ${width} px`, async () => {
      await onNewPage(browser, `band-plan-region1-${width}`, async (page) => {
        await signIn(page, 'tech@kilocycle.test');
        const token = await sessionToken(page);
        const found = await apiGet<{ items: Array<{ id: number; serial: string }> }>(token, '/instruments?q=N-1041');
        const generator = found.items.find((i) => i.serial === 'N-1041')!;
        await page.setViewportSize({ width, height });
        const answers: number[] = [];
        page.on('response', (r) => {
          if (r.url().includes('/band-plan')) answers.push(r.status());
        });
        await page.goto(`/instruments/${generator.id}/band-plan`);
        await page.getByRole('combobox', { name: 'ITU region' }).click();
        const offered = await page.getByRole('option').allTextContents();
        expect(offered).toEqual(['Region 1 (Europe, Africa, the Middle East, northern Asia)', 'Region 2 (the Americas)', 'Region 3 (Asia and the Pacific)']);
        await page.getByRole('option', { name: /^Region 1/ }).click();
        await page.getByLabel('Wanted output frequency').fill('3.7 MHz');
        const bands = page.getByRole('table', { name: 'Amateur bands of ITU Region 1' });
        await bands.waitFor();
        expect(await bands.getByRole('row', { name: /^80 m/ }).textContent()).toContain('3 500 – 3 800 kHz');
        expect(await bands.getByRole('row', { name: /^40 m/ }).textContent()).toContain('7 000 – 7 200 kHz');
        await page.getByRole('table', { name: 'Dial settings for the wanted frequency' }).waitFor();
        expect(page.url()).toContain('region=1');
        await expect(page.getByRole('note', { name: 'About the band edges' }).textContent()).resolves.toMatch(/depends on your licence and your local rules/);
        // Every answer on the way was a 200: no 422 on a keystroke any more.
        expect(answers.length).toBeGreaterThan(0);
        expect(answers.every((s) => s === 200)).toBe(true);
        // Wide tables scroll inside their own box; the page itself never scrolls sideways.
        expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(width);
        await keepScreenshot(page, `band-plan-region1-${width}`);
      });
    });
  }

  it('should show the caution on the Benches page and, to an engineer who only reads, beside the alignment and padding panels', async () => {
    await onNewPage(browser, 'cautions-reader', async (page) => {
      await signIn(page, 'engineer@kilocycle.test');
      await page.goto('/benches');
      await page.getByRole('note', { name: 'Safety caution' }).waitFor();
      await keepScreenshot(page, 'benches-caution-1440');
      const token = await sessionToken(page);
      const runs = await apiGet<{ items: Array<{ id: number; readingCount: number }> }>(token, '/runs?kind=as_found&pageSize=50');
      const measured = runs.items.find((r) => r.readingCount > 0);
      expect(measured).toBeDefined();
      await page.goto(`/runs/${measured!.id}`);
      await page.getByRole('heading', { name: 'Padding calculator' }).waitFor();
      // The capture caution is for those who may write; the two panels carry their own for everyone.
      expect(await page.getByRole('note', { name: 'Safety caution' }).count()).toBe(2);
      await keepScreenshot(page, 'alignment-padding-caution-1440');
    });
  });
});
