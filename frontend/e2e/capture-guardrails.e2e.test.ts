import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ListResponse, Reading, Run } from '@kilocycle/common/types';
import { keepScreenshot, launchBrowser, onNewPage, signIn } from './support/browser';
import { apiGet, ownJobAtBench, sessionToken } from './support/lab';

// Issue 12, guardrails at capture: the new-run dialog pre-selects the bench's default standard and offers
// no "None" for a calibration run; on a 1.75–2.0 MHz range, dial 1900 with counter `1900` (1.9 kHz) is
// refused by the server with what it was read as and what was probably meant, and one more Enter stores it
// as typed; the run's details are corrected with a reason and the correction shows on the run page.

const SLIP = '1900 read as 1.900 kHz, outside this range (1 750–2 000 kHz) by more than 10 % of its span; did you mean 1 900 kHz?';

describe('capture guardrails (browser)', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('pre-selects the bench standard, refuses the 1900 slip with its reason, stores it on one keystroke, and shows a correction', async () => {
    await onNewPage(browser, 'capture-guardrails', guardrails);
  });
});

async function guardrails(page: Page) {
  await signIn(page, 'tech@kilocycle.test');
  const token = await sessionToken(page);

  // An instrument of our own with a 1.75–2.0 MHz range (other browser tests share the demo ones), and a job for it.
  const { job, bench } = await ownJobAtBench(token, 'SG-4 signal generator', `E2E-G-${Date.now()}`);
  expect(bench.defaultStandardName).toBeTruthy();

  // 1. The new-run dialog: as-found, the bench's default standard already chosen, no "None" to pick.
  await page.goto(`/jobs/${job.id}`);
  await page.getByRole('button', { name: 'Open run' }).click();
  const dialog = page.getByRole('dialog', { name: 'Open a run' });
  expect(await dialog.getByRole('combobox', { name: 'Kind' }).innerText()).toContain('As found');
  const standard = dialog.getByRole('combobox', { name: /Reference standard/ });
  expect(await standard.innerText()).toContain(bench.defaultStandardName!);
  await dialog.getByText(`${bench.name}’s default standard`).waitFor();
  await standard.click();
  const options = await page.getByRole('listbox').getByRole('option').allInnerTexts();
  expect(options.some((o) => o.includes(bench.defaultStandardName!))).toBe(true);
  expect(options.some((o) => /^None$|bench’s default/.test(o.trim()))).toBe(false);
  await page.keyboard.press('Escape');
  await keepScreenshot(page, 'capture-guardrails-open-run');
  await dialog.getByRole('button', { name: 'Open run' }).click();
  await page.waitForURL(/\/runs\/\d+$/);
  const runId = Number(/\/runs\/(\d+)$/.exec(page.url())![1]);
  const run = await apiGet<Run>(token, `/runs/${runId}`);
  expect(run.standardId).toBe(bench.defaultStandardId);

  // 2. Dial 1900, counter `1900` (no unit, so hertz): the amber hint first, then the server's refusal.
  await page.getByRole('heading', { name: /As found run #\d+/ }).waitFor();
  await page.waitForFunction(() => document.activeElement?.getAttribute('inputmode') === 'decimal');
  await page.keyboard.type('1900');
  await page.keyboard.press('Tab');
  await page.keyboard.type('1900');
  expect(await page.getByTestId('counter-understood').innerText()).toContain('far outside this range');
  await page.keyboard.press('Enter');
  const prompt = page.getByTestId('confirm-reading');
  await prompt.waitFor();
  expect(await prompt.innerText()).toContain(`Not saved — ${SLIP}`);
  expect(await prompt.innerText()).toContain('Press Enter again to store it as typed, or Esc to correct it.');
  // The confirmation has the keyboard focus: nothing stored yet.
  await page.waitForFunction(() => document.activeElement?.textContent === 'Store as typed');
  expect((await apiGet<ListResponse<Reading>>(token, `/runs/${runId}/readings`)).total).toBe(0);
  await keepScreenshot(page, 'capture-guardrails-refused-1440');
  await page.setViewportSize({ width: 390, height: 844 });
  await keepScreenshot(page, 'capture-guardrails-refused-390');
  await page.setViewportSize({ width: 1440, height: 900 });

  // 3. One keystroke stores it as typed.
  await page.keyboard.press('Enter');
  await page.getByTestId('last-saved').filter({ hasText: 'Saved #1: dial 1900 kHz → 1.900 kHz' }).waitFor();
  await page.getByTestId('readings-count').filter({ hasText: '1 in this run' }).waitFor();
  const stored = await apiGet<ListResponse<Reading>>(token, `/runs/${runId}/readings`);
  expect(stored.items.map((r) => [r.dial, r.frequency, r.source])).toEqual([[1900, 1900, 'manual']]);

  // 4. Escape after a refusal goes back to the counter to correct it; the corrected reading is stored.
  await page.waitForFunction(() => document.activeElement?.getAttribute('inputmode') === 'decimal');
  await page.keyboard.type('1950');
  await page.keyboard.press('Tab');
  await page.keyboard.type('1950');
  await page.keyboard.press('Enter');
  await prompt.waitFor();
  await page.keyboard.press('Escape');
  // The counter (the dial is the field with inputmode decimal) has the cursor, its text selected.
  await page.waitForFunction(() => {
    const field = document.activeElement;
    return field instanceof HTMLInputElement && field.getAttribute('inputmode') !== 'decimal' && field.value === '1950' && field.selectionEnd === 4;
  });
  await page.keyboard.type('1950 kHz');
  await page.keyboard.press('Enter');
  await page.getByTestId('last-saved').filter({ hasText: 'Saved #2: dial 1950 kHz → 1 950.000 kHz' }).waitFor();

  // 5. Correct the run's details with a reason; the correction shows on the page.
  await page.getByRole('button', { name: 'Correct run details' }).click();
  const correct = page.getByRole('dialog', { name: 'Correct run details' });
  await correct.getByLabel('Supply voltage').fill('117');
  await correct.getByLabel(/Reason for the correction/).fill('Supply read on the variac after the run was opened');
  await correct.getByRole('button', { name: 'Save correction' }).click();
  const corrections = page.getByRole('region', { name: 'Corrections of this run' });
  await corrections.waitFor();
  expect(await corrections.innerText()).toMatch(/Tomas Reyes: Supply voltage none → 117 V\s+Why: Supply read on the variac after the run was opened/);
  await keepScreenshot(page, 'capture-guardrails-corrected-1440');
  await page.setViewportSize({ width: 390, height: 844 });
  await keepScreenshot(page, 'capture-guardrails-corrected-390');
}
