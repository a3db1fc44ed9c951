import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Job, ListResponse, ReferenceStandard, Run } from '@kilocycle/common/types';
import { expectNoSeriousViolations } from './support/axe';
import { keepScreenshot, launchBrowser, onNewPage, signIn } from './support/browser';
import { apiGet, apiRequest, createTestInstrument, onAccountWhile, openJob, sessionToken } from './support/lab';
import { DEMO_ACCOUNTS, findDemoRecords, waitForPageSettled, type DemoRecords } from './support/main-pages';

// Issue #14, item 4: at 390 × 844 (a phone) the capture page, the client's portal and certificate list and the
// jobs list open without sideways scrolling, and the columns that matter (status, decision, PDF) are in view.

const PHONE = { width: 390, height: 844 };
const DESKTOP = { width: 1440, height: 900 };

type Overflow = { page: number; viewport: number; scrollers: string[] };

/** How wide the document is against the window, and every grid or table box that scrolls sideways inside it. */
async function overflow(page: Page): Promise<Overflow> {
  return page.evaluate(() => {
    const scrollers: string[] = [];
    const boxes = document.querySelectorAll<HTMLElement>('main .MuiDataGrid-virtualScroller, main table');
    for (const box of boxes) {
      const scroller = box.tagName === 'TABLE' ? box.parentElement : box;
      if (scroller && scroller.scrollWidth > scroller.clientWidth + 1) {
        const name = box.closest('[aria-label]')?.getAttribute('aria-label') ?? box.tagName.toLowerCase();
        scrollers.push(`${name}: ${scroller.scrollWidth} px in ${scroller.clientWidth} px`);
      }
    }
    return { page: document.documentElement.scrollWidth, viewport: document.documentElement.clientWidth, scrollers };
  });
}

async function expectNoSidewaysScroll(page: Page, where: string, { lists = true } = {}): Promise<void> {
  const measured = await overflow(page);
  expect(measured.page, `${where}: the page is ${measured.page} px wide in a ${measured.viewport} px window`).toBeLessThanOrEqual(measured.viewport);
  if (lists) expect(measured.scrollers, `${where}: lists that scroll sideways`).toEqual([]);
}

/** The element lies wholly inside the window's width (not pushed off to the right). */
async function expectInView(page: Page, locator: ReturnType<Page['locator']>, what: string): Promise<void> {
  const box = await locator.boundingBox();
  expect(box, `${what} is drawn`).not.toBeNull();
  expect(box!.x, `${what} starts inside the window`).toBeGreaterThanOrEqual(0);
  expect(box!.x + box!.width, `${what} ends inside the ${PHONE.width} px window`).toBeLessThanOrEqual(PHONE.width);
}

/** Signs in at desktop width (signIn waits for the side navigation, which folds away on a phone), then narrows. */
async function signInOnPhone(page: Page, email: string): Promise<void> {
  await signIn(page, email);
  await page.setViewportSize(PHONE);
}

describe('phone layout at 390 × 844 (browser)', () => {
  let browser: Browser;
  let records: DemoRecords;

  beforeAll(async () => {
    browser = await launchBrowser();
    records = await findDemoRecords();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('should let the technician capture readings on the run page without sideways scrolling', async () => {
    await onNewPage(browser, 'phone-capture', async (page) => {
      page.setDefaultTimeout(30_000);
      await signIn(page, DEMO_ACCOUNTS.technician);
      const run = await openCaptureRun(await sessionToken(page));
      await page.setViewportSize(PHONE);
      await page.goto(`/runs/${run.id}`);
      await page.getByRole('heading', { name: /As found run #\d+/ }).waitFor();
      await page.getByRole('note', { name: 'Safety caution' }).waitFor();
      // Readings typed on the phone as on the bench: dial, Tab, counter, Enter.
      await page.waitForFunction(() => document.activeElement?.getAttribute('inputmode') === 'decimal');
      for (const [index, [dial, counter]] of [
        ['1760', '1 758.912 kHz'],
        ['1880', '1.878604 MHz'],
        ['1990', '1988377'],
      ].entries()) {
        await page.keyboard.type(dial!);
        await page.keyboard.press('Tab');
        await page.keyboard.type(counter!);
        await page.keyboard.press('Enter');
        await page
          .getByTestId('last-saved')
          .filter({ hasText: `Saved #${index + 1}:` })
          .waitFor();
        await page.waitForFunction(() => document.activeElement?.getAttribute('inputmode') === 'decimal');
      }
      await page.getByTestId('fit-summary').filter({ hasText: '3 used' }).waitFor();
      await waitForPageSettled(page);
      expect(await page.evaluate(() => window.scrollX), 'the page opens without being scrolled sideways').toBe(0);
      await expectNoSidewaysScroll(page, 'capture page');
      await expectInView(page, page.getByLabel('Dial (kHz)'), 'the dial field');
      await expectInView(page, page.getByLabel('Counter'), 'the counter field');
      await expectNoSeriousViolations(page, 'the capture page at 390 px');
      await keepScreenshot(page, 'phone-capture-390');
      await page.setViewportSize(DESKTOP);
      await keepScreenshot(page, 'phone-capture-1440');
    });
  });

  it('should show the engineer a study run without sideways scrolling', async () => {
    await onNewPage(browser, 'phone-study', async (page) => {
      await signInOnPhone(page, DEMO_ACCOUNTS.engineer);
      await page.goto(`/runs/${records.studyRunId}`);
      await waitForPageSettled(page);
      // The page itself stays within the window; its long data tables (readings, Allan deviation) scroll inside their own box.
      await expectNoSidewaysScroll(page, 'study run page', { lists: false });
      await keepScreenshot(page, 'phone-study-390');
    });
  });

  it('should show the client the portal and the certificate list with status, decisions and PDF in view', async () => {
    // The certificate's download button is the point here, so Northgate is on account for this journey.
    await onAccountWhile('Northgate Radio Club', () =>
      onNewPage(browser, 'phone-client', async (page) => {
        await signInOnPhone(page, DEMO_ACCOUNTS.client);
        await page.goto('/');
        await waitForPageSettled(page);
        const portalCertificates = page.getByRole('region', { name: 'Certificates' }).getByRole('grid', { name: 'Certificates' });
        await portalCertificates.getByRole('row').nth(1).waitFor();
        await expectNoSidewaysScroll(page, 'client portal');
        await expectCertificateRowInView(page, portalCertificates, records.certificateNumber);
        // Embedded, the grid is as tall as its two-line rows: nothing of them is cut off at the bottom.
        const clipped = await portalCertificates.locator('.MuiDataGrid-virtualScroller').evaluate((box) => box.scrollHeight - box.clientHeight);
        expect(clipped, 'pixels of the portal’s certificate rows hidden below the grid').toBeLessThanOrEqual(1);
        // The instruments and jobs tables keep what matters and fold the rest under the first cell.
        const instruments = page.getByRole('table', { name: 'Instruments' });
        await expectInView(page, instruments.getByRole('columnheader', { name: 'Next calibration due' }), 'the instruments’ due column');
        await expectInView(page, page.getByRole('table', { name: 'Jobs' }).getByRole('columnheader', { name: 'Where it stands' }), 'the jobs’ status column');
        await keepScreenshot(page, 'phone-client-portal-390');
        await page.setViewportSize(DESKTOP);
        await keepScreenshot(page, 'phone-client-portal-1440');
        await page.setViewportSize(PHONE);

        await page.goto('/certificates');
        await waitForPageSettled(page);
        const list = page.getByRole('grid', { name: 'Certificates' });
        await list.getByRole('row').nth(1).waitFor();
        await expectNoSidewaysScroll(page, 'client certificate list');
        await expectCertificateRowInView(page, list, records.certificateNumber);
        await keepScreenshot(page, 'phone-client-certificates-390');

        await page.goto('/jobs');
        await waitForPageSettled(page);
        await page.getByRole('grid', { name: 'Jobs' }).getByRole('row').nth(1).waitFor();
        await expectNoSidewaysScroll(page, 'client jobs list');
        await keepScreenshot(page, 'phone-client-jobs-390');
      }),
    );
  });

  it('should show the lead the jobs list with each job’s status in view', async () => {
    await onNewPage(browser, 'phone-jobs', async (page) => {
      await signInOnPhone(page, DEMO_ACCOUNTS.lead);
      await page.goto('/jobs');
      await waitForPageSettled(page);
      const grid = page.getByRole('grid', { name: 'Jobs' });
      const row = grid.getByRole('row').nth(1);
      await row.waitFor();
      await expectNoSidewaysScroll(page, 'jobs list');
      await expectInView(page, grid.getByRole('columnheader', { name: 'Status' }), 'the Status column');
      await expectInView(page, row.getByRole('link').first(), 'the first job’s number');
      // What the hidden columns hold reads under the number: the instrument and the customer.
      const text = await row.innerText();
      const job = (await apiGet<ListResponse<Job>>(await sessionToken(page), '/jobs?pageSize=1&sort=-receivedDate')).items[0]!;
      expect(text).toContain(job.instrumentLabel);
      expect(text).toContain(job.organizationName);
      await keepScreenshot(page, 'phone-jobs-390');
      await page.setViewportSize(DESKTOP);
      await keepScreenshot(page, 'phone-jobs-1440');
    });
  });

  it('should show the lead a job’s review page (charts, fits and results) without sideways scrolling', async () => {
    await onNewPage(browser, 'phone-review', async (page) => {
      await signInOnPhone(page, DEMO_ACCOUNTS.lead);
      await page.goto(`/reviews/${records.reviewJobId}`);
      await waitForPageSettled(page);
      await page
        .getByRole('table', { name: /^Results, range / })
        .first()
        .waitFor();
      // Wide result tables may scroll inside their own box; the page itself (charts and fit summaries) may not.
      await expectNoSidewaysScroll(page, 'review page', { lists: false });
      await keepScreenshot(page, 'phone-review-390');
    });
  });
});

async function expectCertificateRowInView(page: Page, grid: ReturnType<Page['locator']>, number: string): Promise<void> {
  const row = grid.getByRole('row').filter({ hasText: number }).first();
  await row.waitFor();
  await expectInView(page, grid.getByRole('columnheader', { name: 'Status' }), 'the Status column');
  await expectInView(page, grid.getByRole('columnheader', { name: 'Final' }), 'the Final decision column');
  await expectInView(page, row.getByRole('button', { name: new RegExp(`^Download ${number} revision \\d+ as PDF$`) }), 'the PDF button');
  // The as-found outcome folds into the row's second line, where the client still reads it.
  expect(await row.innerText()).toMatch(/as found: (pass|fail|conditional pass|conditional fail)/);
}

/** An as-found run of the technician's own (an invented instrument of the lab's, so no other test's data is touched). */
async function openCaptureRun(token: string): Promise<Run> {
  const organisations = await apiGet<ListResponse<{ id: number; kind: string }>>(token, '/organizations?pageSize=50');
  // The lab's own instrument: no customer sees it in their portal, whatever other browser tests look for there.
  const lab = organisations.items.find((o) => o.kind === 'lab') ?? organisations.items[0]!;
  const instrument = await createTestInstrument(token, {
    organizationId: lab.id,
    make: 'Wrenfield',
    model: 'LO-7 test oscillator',
    serial: `PHONE-${Date.now()}`,
    label: 'B 1750–2000 kHz',
  });
  const job = await openJob(token, instrument.id);
  const standards = await apiGet<ListResponse<ReferenceStandard>>(token, '/standards');
  const standard = standards.items.find((s) => s.active && !s.overdue);
  expect(standard, 'the demo holds an in-date reference standard').toBeDefined();
  return apiRequest<Run>(token, 'POST', `/jobs/${job.id}/runs`, { rangeId: instrument.ranges[0]!.id, kind: 'as_found', standardId: standard!.id });
}
