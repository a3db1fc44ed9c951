import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Bench, Instrument, ListResponse, MailMessageSummary, Organization, Run } from '@kilocycle/common/types';
import { keepScreenshot, launchBrowser, onNewPage, signIn } from './support/browser';
import { apiGet, apiLogin, apiRequest, openJob, sessionToken } from './support/lab';
import { patientPage } from './support/patient-page';

// Issue #14, item 5 ("Elsewhere"): an empty run's pages say "No readings yet" with no failed request behind them;
// the overview names the organisation; the ranges table keeps its actions on screen at 1440 px; the "Job opened"
// notice sits in the app bar and goes with the next page change; a returned job's mail opens on its HTML part
// (sandboxed) and its Reply-To and footer name the lab's address.

const DEMO_PASSWORD = 'kilocycle-demo';
const LAB = 'Quarry Lane Frequency Lab';
const LAB_EMAIL = 'bench@quarrylane.test';

const range = (position: number, label: string, lowKhz: number, highKhz: number) => ({
  label,
  dialUnit: position === 3 ? 'div' : 'kHz',
  dialLaw:
    position === 3
      ? {
          kind: 'table',
          points: [
            { dial: 0, frequency: lowKhz * 1000 },
            { dial: 50, frequency: ((lowKhz + highKhz) / 2) * 1000 },
            { dial: 100, frequency: highKhz * 1000 },
          ],
        }
      : { kind: 'direct', unit: 'kHz' },
  dialMin: position === 3 ? 0 : lowKhz,
  dialMax: position === 3 ? 100 : highKhz,
  freqMinHz: lowKhz * 1000,
  freqMaxHz: highKhz * 1000,
  tolerance: position === 2 ? { kind: 'ppm_hz', ppm: 50, hz: 20 } : { kind: 'percent', percent: 0.5 },
  multipliers: [1, 2, 3, 4],
});

describe('elsewhere polish (browser)', () => {
  let browser: Browser;
  let instrument: Instrument;
  // An instrument of our own with four ranges (one a dial table, one with a ppm + Hz tolerance): a full ranges table.
  // One per test, as an instrument has one open job at a time.
  const newInstrument = async (tag: string) => {
    const tech = await apiLogin('tech@kilocycle.test', DEMO_PASSWORD);
    const orgs = await apiGet<ListResponse<Organization>>(tech, '/organizations?pageSize=100');
    const customer = orgs.items.find((o) => o.name === 'Northgate Radio Club')!;
    return apiRequest<Instrument>(tech, 'POST', '/instruments', {
      organizationId: customer.id,
      make: 'Harwick Radio',
      model: 'SG-7 wide-range signal generator',
      serial: `E2E-P${tag}-${Date.now()}`,
      ranges: [
        range(1, 'A  1750–2000 kHz', 1750, 2000),
        range(2, 'B  3500–4000 kHz (band-spread)', 3500, 4000),
        range(3, 'C  7000–7300 kHz, logging scale', 7000, 7300),
        range(4, 'D  14000–14350 kHz', 14000, 14350),
      ],
    });
  };
  beforeAll(async () => {
    browser = await launchBrowser();
    instrument = await newInstrument('N');
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('opens a job with the notice in the app bar, keeps it on the job page, and drops it on the next page change', async () => {
    await onNewPage(browser, 'polish-job-notice', async (page) => {
      await signIn(page, 'tech@kilocycle.test');
      // The overview names the person's organisation.
      expect(await page.getByTestId('organization-name').filter({ hasText: LAB }).innerText()).toBe(LAB);
      await keepScreenshot(page, 'polish-overview-1440');

      await page.goto('/jobs');
      await page.getByRole('button', { name: 'New job' }).click();
      const dialog = page.getByRole('dialog', { name: 'New job' });
      await dialog.getByRole('combobox', { name: 'Instrument' }).fill(instrument.serial);
      await page.getByRole('option', { name: new RegExp(instrument.serial) }).click();
      await dialog.getByRole('button', { name: 'Open job' }).click();
      await page.waitForURL(/\/jobs\/\d+$/);
      const notice = page.getByTestId('notice');
      await notice.getByText(/^Job J\d{4}-\d{4} opened for/).waitFor();
      // It sits in the app bar's empty middle, over no part of the page (it ends above the page's heading, once
      // the job page has drawn it: the notice can come first).
      await page.getByRole('heading', { level: 1 }).waitFor();
      const box = (await notice.boundingBox())!;
      const bar = (await page.locator('header').first().boundingBox())!;
      // The page may draw its heading again as its panels load (the box is null for that instant): ask until it stands.
      let heading = await page.getByRole('heading', { level: 1 }).boundingBox();
      for (let i = 0; i < 20 && !heading; i += 1) heading = await page.getByRole('heading', { level: 1 }).boundingBox();
      if (!heading) throw new Error('the job page never kept its heading on screen');
      expect(box.y).toBeLessThan(bar.y + bar.height);
      expect(box.y + box.height).toBeLessThanOrEqual(heading.y);
      await keepScreenshot(page, 'polish-job-notice-1440');
      // Two seconds on, the person moves to another page: the notice does not follow.
      await page.waitForTimeout(2000);
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Instruments', exact: true }).click();
      await page.waitForURL(/\/instruments$/);
      await notice.waitFor({ state: 'detached', timeout: 3000 });
    });
  });

  it('shows "No readings yet" on an empty calibration run and an empty warm-up run, with no failed analysis request', async () => {
    await onNewPage(browser, 'polish-empty-runs', async (page) => {
      await signIn(page, 'tech@kilocycle.test');
      const token = await sessionToken(page);
      const instrument = await newInstrument('E');
      const job = await openJob(token, instrument.id);
      const benches = await apiGet<ListResponse<Bench>>(token, '/benches?active=true&sort=name&pageSize=200');
      const standardId = benches.items.find((b) => b.defaultStandardId !== null)!.defaultStandardId;
      const calibration = await apiRequest<Run>(token, 'POST', `/jobs/${job.id}/runs`, { rangeId: instrument.ranges[0]!.id, kind: 'as_found', standardId });
      const warmup = await apiRequest<Run>(token, 'POST', `/jobs/${job.id}/runs`, { rangeId: instrument.ranges[0]!.id, kind: 'warmup', standardId });

      const failures: string[] = [];
      page.on('response', (response) => {
        if (response.url().includes('/analysis') && response.status() >= 400) failures.push(`${response.status()} ${response.url()}`);
      });
      page.on('console', (message) => {
        if (message.type() === 'error') failures.push(`console: ${message.text()}`);
      });

      for (const [run, name, notice] of [
        [calibration, 'calibration', 'No readings yet. The fit appears with the first readings.'],
        [warmup, 'warmup', 'No readings yet. The fit appears as readings arrive.'],
      ] as const) {
        for (const [width, height] of [
          [1440, 900],
          [390, 844],
        ] as const) {
          await page.setViewportSize({ width, height });
          await page.goto(`/runs/${run.id}`);
          // The analysis panel's own words (the readings table below says "No readings yet." as well).
          await page.getByRole('alert').filter({ hasText: notice }).waitFor();
          await keepScreenshot(page, `polish-empty-${name}-${width}`);
        }
      }
      expect(failures).toEqual([]);
    });
  });

  it("keeps the ranges table's Edit and Remove on screen at 1440 px", async () => {
    await onNewPage(browser, 'polish-ranges', async (page) => {
      await signIn(page, 'tech@kilocycle.test');
      await page.goto(`/instruments/${instrument.id}`);
      const table = page.getByRole('table', { name: 'Ranges' });
      await table.waitFor();
      const overflow = await table.evaluate((el) => {
        const box = el.parentElement!;
        return box.scrollWidth - box.clientWidth;
      });
      expect(overflow).toBeLessThanOrEqual(0);
      // Nor does anything push the page sideways.
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(1440);
      for (const r of instrument.ranges) {
        for (const verb of ['Edit', 'Remove']) {
          const button = table.getByRole('button', { name: `${verb} range ${r.label.replace(/\s+/g, ' ')}` });
          const box = (await button.boundingBox())!;
          expect(box.x + box.width).toBeLessThanOrEqual(1440);
        }
      }
      // The icon says it to the eye as well: its tooltip.
      await table.getByRole('button', { name: /^Edit range A/ }).hover();
      await page.getByRole('tooltip', { name: 'Edit range' }).waitFor();
      await keepScreenshot(page, 'polish-ranges-1440');
      await page.mouse.move(0, 0);
      await page.setViewportSize({ width: 390, height: 844 });
      await keepScreenshot(page, 'polish-ranges-390');
    });
  });

  it("opens a returned job's mail on its HTML part, sandboxed, with Reply-To and footer naming the lab's address", async () => {
    // The technician records three readings and submits; the lead returns the job with a comment holding markup.
    const tech = await apiLogin('tech@kilocycle.test', DEMO_PASSWORD);
    const lead = await apiLogin('lead@kilocycle.test', DEMO_PASSWORD);
    const instrument = await newInstrument('M');
    const job = await openJob(tech, instrument.id);
    const benches = await apiGet<ListResponse<Bench>>(tech, '/benches?active=true&sort=name&pageSize=200');
    const standardId = benches.items.find((b) => b.defaultStandardId !== null)!.defaultStandardId;
    const run = await apiRequest<Run>(tech, 'POST', `/jobs/${job.id}/runs`, { rangeId: instrument.ranges[0]!.id, kind: 'as_found', standardId });
    await apiRequest(tech, 'POST', `/runs/${run.id}/readings`, { readings: [1750, 1875, 2000].map((dial) => ({ dial, frequency: dial * 1000 - 400 })) });
    await apiRequest(tech, 'POST', `/jobs/${job.id}/submit`, {});
    await apiRequest(lead, 'POST', `/jobs/${job.id}/return`, { comment: 'Repeat dial 1875 <b>twice</b>.' });

    const page = await patientPage(browser);
    try {
      await signIn(page, 'admin@kilocycle.test');
      const token = await sessionToken(page);
      const subject = `Job ${job.number} returned for rework`;
      let mail: MailMessageSummary | undefined;
      for (let i = 0; i < 20 && !mail; i++) {
        mail = (await apiGet<ListResponse<MailMessageSummary>>(token, `/mail?q=${encodeURIComponent(job.number)}`)).items.find((m) => m.subject === subject);
        if (!mail) await page.waitForTimeout(250);
      }
      expect(mail).toBeDefined();
      await page.goto(`/admin/outbox/${mail!.id}`);
      const htmlTab = page.getByRole('tab', { name: 'HTML' });
      await htmlTab.waitFor();
      expect(await htmlTab.getAttribute('aria-selected')).toBe('true');
      const frameElement = page.locator('iframe[title="Message body (HTML)"]');
      expect(await frameElement.getAttribute('sandbox')).toBe('');
      const frame = page.frameLocator('iframe[title="Message body (HTML)"]');
      // The comment's markup arrives as text, not as bold.
      await frame.getByText('Repeat dial 1875 <b>twice</b>.').waitFor();
      expect(await frame.locator('b').count()).toBe(0);
      await frame.getByText(`Replies to this message go to ${LAB} at ${LAB_EMAIL}.`).waitFor();
      await keepScreenshot(page, 'polish-mail-html-1440');
      await page.getByRole('tab', { name: 'Headers' }).click();
      await page.getByRole('cell', { name: 'Reply-To', exact: true }).waitFor();
      await page.getByRole('cell', { name: `${LAB} <${LAB_EMAIL}>` }).waitFor();
      await page.setViewportSize({ width: 390, height: 844 });
      await page.getByRole('tab', { name: 'HTML' }).click();
      await keepScreenshot(page, 'polish-mail-html-390');
    } catch (error) {
      await keepScreenshot(page, 'polish-mail-failure').catch(() => undefined);
      throw error;
    } finally {
      await page.context().close();
    }
  });
});
