import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Instrument, Job, ListResponse } from '@kilocycle/common/types';
import { keepScreenshot, launchBrowser, onNewPage, signIn } from './support/browser';
import { apiGet, createTestInstrument, readyForWork, sessionToken } from './support/lab';

// Journey 1 (PRODUCT.md §4): a technician opens a job, starts an as-found run on range 1, types ten dial/counter
// pairs with the keyboard alone, watches the chart and the fit follow, excludes one reading, reloads and finds
// everything as left; then an as-left run after adjustment, and the job goes to review.

const ACTIVE = 'received,in_progress,in_review,returned';
const EXCLUSION_REASON = 'Counter gate still counting when read';

type Pair = { dial: string; counter: string };

/** Ten readings across range 1 with a dial that reads high at the low end, typed the three ways a counter is copied. */
function pairsFor(range: Instrument['ranges'][number]): Pair[] {
  const per = range.dialUnit === 'MHz' ? 1e6 : range.dialUnit === 'kHz' ? 1e3 : 1;
  const span = range.dialMax - range.dialMin;
  const dials = [0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.8, 1, 1].map((f) => Math.round((range.dialMin + f * span) * 1000) / 1000);
  return dials.map((dial, i) => {
    // About -0.8 % at the bottom of the dial, -0.5 % at the top, and a few hertz of scatter.
    const hz = Math.round(dial * per * (1 - 0.008 + 0.003 * ((dial - range.dialMin) / span)) + ((i * 37) % 11) - 5);
    const forms = [`${(hz / 1e3).toFixed(3)} kHz`, `${(hz / 1e6).toFixed(6)} MHz`, `${hz}`];
    return { dial: String(dial), counter: forms[i % 3]! };
  });
}

async function readingsCount(page: Page) {
  return (await page.getByTestId('readings-count').innerText()).trim();
}

async function typePair(page: Page, pair: Pair) {
  await page.keyboard.type(pair.dial);
  await page.keyboard.press('Tab');
  await page.keyboard.type(pair.counter);
  await page.keyboard.press('Enter');
}

describe('bench capture: journey 1 (browser)', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('should capture ten typed readings, fit them as they come, exclude one and keep it all over a reload', async () => {
    await onNewPage(browser, 'bench-capture', journey);
  });
});

async function journey(page: Page) {
  {
    await signIn(page, 'tech@kilocycle.test');
    const token = await sessionToken(page);

    // A demo instrument without a job in hand, whose first range is marked in kHz (the VFO when the demo is fresh).
    const active = await apiGet<ListResponse<Job>>(token, `/jobs?status=${ACTIVE}&pageSize=500`);
    const busy = new Set(active.items.map((j) => j.instrumentId));
    const instruments = await apiGet<ListResponse<Instrument>>(token, '/instruments?pageSize=500');
    const free = instruments.items.filter((i) => !busy.has(i.id) && i.ranges[0]?.dialUnit === 'kHz' && i.ranges[0].dialLaw.kind === 'direct');
    // Other browser tests share the database: when they have taken every demo instrument, record one of our own.
    const instrument =
      free.find((i) => i.serial === 'N-0952') ??
      free[0] ??
      (await createTestInstrument(token, {
        organizationId: instruments.items[0]!.organizationId,
        make: 'Harwick Radio',
        model: 'VFO-3 variable frequency oscillator',
        serial: `E2E-${Date.now()}`,
        label: '1.75–2.0 MHz',
        tolerancePercent: 0.25,
      }));
    const range = instrument.ranges[0]!;

    // 1. A new job through the New job dialog.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Jobs', exact: true }).click();
    await page.getByRole('button', { name: 'New job' }).click();
    const jobDialog = page.getByRole('dialog', { name: 'New job' });
    await jobDialog.getByRole('combobox', { name: 'Instrument' }).fill(instrument.serial);
    await page.getByRole('option', { name: new RegExp(instrument.serial) }).click();
    await jobDialog.getByLabel('Condition as received').fill('Working; dial reads high at the low end. Case and knobs complete.');
    await jobDialog.getByLabel('Temperature').fill('21.5');
    await jobDialog.getByLabel('Relative humidity').fill('45');
    await jobDialog.getByRole('button', { name: 'Open job' }).click();
    await page.waitForURL(/\/jobs\/\d+$/);
    await page.getByRole('heading', { name: /^Job J\d{4}-\d{4}$/ }).waitFor();
    const jobUrl = page.url();
    // Northgate's work waits for an accepted quote: the lead records the customer's yes by phone.
    await readyForWork(Number(/\/jobs\/(\d+)$/.exec(jobUrl)![1]));

    // 2. An as-found run on range 1 against the in-date counter.
    await page.getByRole('button', { name: 'Open run' }).click();
    const runDialog = page.getByRole('dialog', { name: 'Open a run' });
    expect(await runDialog.getByRole('combobox', { name: 'Range' }).innerText()).toContain(range.label.trim().slice(0, 8));
    expect(await runDialog.getByRole('combobox', { name: 'Kind' }).innerText()).toContain('As found');
    await runDialog.getByRole('combobox', { name: 'Reference standard' }).click();
    await page.getByRole('option', { name: /Bench counter A/ }).click();
    await runDialog.getByRole('button', { name: 'Open run' }).click();
    await page.waitForURL(/\/runs\/\d+$/);
    await page.getByRole('heading', { name: /As found run #\d+/ }).waitFor();
    await page.getByRole('note', { name: 'Safety caution' }).waitFor();

    // 3. Ten pairs from the keyboard alone: the dial field has the cursor from the start and gets it back after each save.
    const dialField = page.getByLabel(`Dial (${range.dialUnit})`);
    await page.waitForFunction(() => document.activeElement?.getAttribute('inputmode') === 'decimal');
    const pairs = pairsFor(range);
    let fitAfterFive = '';
    for (const [index, pair] of pairs.entries()) {
      // One refused entry first: a dial far outside the range stays in the fields with the server's reason.
      if (index === 3) {
        await typePair(page, { dial: String(range.dialMax * 1.5), counter: pair.counter });
        await page.getByRole('alert').filter({ hasText: 'Not saved — dial' }).waitFor();
        expect(await dialField.inputValue()).toBe(String(range.dialMax * 1.5));
        expect(await page.getByLabel('Counter').inputValue()).toBe(pair.counter);
        // Put it right with the keyboard: back to the dial, select it, retype it.
        await dialField.focus();
        await page.keyboard.press('ControlOrMeta+a');
        await page.keyboard.type(pair.dial);
        await page.keyboard.press('Tab');
        await page.keyboard.press('Enter');
      } else {
        await typePair(page, pair);
      }
      await page
        .getByTestId('last-saved')
        .filter({ hasText: `Saved #${index + 1}:` })
        .waitFor();
      await page
        .getByTestId('readings-count')
        .filter({ hasText: `${index + 1} in this run` })
        .waitFor();
      await page.waitForFunction(() => document.activeElement?.getAttribute('inputmode') === 'decimal');
      expect(await dialField.inputValue()).toBe('');
      expect(await page.getByLabel('Counter').inputValue()).toBe('');
      if (index === 4) {
        await page.getByTestId('fit-summary').filter({ hasText: '5 used' }).waitFor();
        fitAfterFive = await page.getByTestId('fit-summary').innerText();
        expect(fitAfterFive).toMatch(/Error at mid-span/);
        expect(fitAfterFive).toMatch(/R²/);
      }
    }
    await page.getByTestId('fit-summary').filter({ hasText: '10 used' }).waitFor();
    const fitAfterTen = await page.getByTestId('fit-summary').innerText();
    expect(fitAfterTen).not.toBe(fitAfterFive);
    expect(fitAfterTen).toMatch(/Tracking, end points/);
    expect(await page.getByTestId('error-chart').getAttribute('aria-label')).toMatch(/9 settings/);
    expect(await readingsCount(page)).toBe('10 in this run');
    await keepScreenshot(page, 'bench-page-ten-readings');

    // 4. Exclude reading 3 with a reason.
    await page.getByRole('button', { name: 'Exclude reading 3' }).click();
    const excludeDialog = page.getByRole('dialog', { name: /Exclude reading #3/ });
    await excludeDialog.getByLabel('Reason').fill(EXCLUSION_REASON);
    await excludeDialog.getByRole('button', { name: 'Exclude' }).click();
    await page.getByText(`Excluded: ${EXCLUSION_REASON}`).waitFor();
    await page.getByTestId('fit-summary').filter({ hasText: '9 used' }).waitFor();

    // 5. Everything is on the server: a reload shows the same.
    await page.reload();
    await page.getByRole('heading', { name: /As found run #\d+/ }).waitFor();
    await page.getByTestId('readings-count').filter({ hasText: '10 in this run' }).waitFor();
    await page.getByText(`Excluded: ${EXCLUSION_REASON}`).waitFor();
    const fitAfterReload = await page.getByTestId('fit-summary').innerText();
    expect(fitAfterReload).toMatch(/9 used/);
    expect(fitAfterReload).toMatch(/10 taken, 1 excluded/);
    expect(await page.getByRole('button', { name: /^Exclude reading/ }).count()).toBe(9);
    await keepScreenshot(page, 'bench-page');

    // 6. After adjustment: an as-left run with a few readings, then the job goes to review.
    await page.goto(jobUrl);
    await page.getByRole('button', { name: 'Open run' }).click();
    const asLeftDialog = page.getByRole('dialog', { name: 'Open a run' });
    await asLeftDialog.getByRole('combobox', { name: 'Kind' }).click();
    await page.getByRole('option', { name: 'As left' }).click();
    await asLeftDialog.getByRole('button', { name: 'Open run' }).click();
    await page.getByRole('heading', { name: /As left run #\d+/ }).waitFor();
    await page.waitForFunction(() => document.activeElement?.getAttribute('inputmode') === 'decimal');
    const step = (range.dialMax - range.dialMin) / 4;
    for (let k = 0; k <= 4; k++) {
      const dial = range.dialMin + k * step;
      await typePair(page, { dial: String(dial), counter: `${((dial * 1e3 * 0.9996) / 1e3).toFixed(3)} kHz` });
      await page
        .getByTestId('last-saved')
        .filter({ hasText: `Saved #${k + 1}:` })
        .waitFor();
      await page.waitForFunction(() => document.activeElement?.getAttribute('inputmode') === 'decimal');
    }
    await page.getByTestId('fit-summary').filter({ hasText: '5 used' }).waitFor();
    await page.goto(jobUrl);
    await page.getByRole('button', { name: 'Submit for review' }).click();
    const submitDialog = page.getByRole('dialog', { name: /Submit job .* for review/ });
    await submitDialog.getByLabel('Note for the lead (optional)').fill('Range 1 aligned: coil slug and trimmer.');
    await submitDialog.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByText('In review', { exact: true }).first().waitFor();
    await page.getByText(/Waiting for the lead’s review/).waitFor();
    await keepScreenshot(page, 'job-submitted');
  }
}
