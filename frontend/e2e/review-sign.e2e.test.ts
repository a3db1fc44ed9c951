import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Job, JobReview, ListResponse, MailMessageSummary } from '@kilocycle/common/types';
import { DEMO_PASSWORD, keepScreenshot, launchBrowser, signIn } from './support/browser';
import { apiGet, apiLogin } from './support/lab';
import { patientPage } from './support/patient-page';

// Journey 3 (PRODUCT.md §4): the lead reviews the job in review, signs with the password typed again, the PDF
// is made and the customer's mail lands in the admin's outbox.
describe('review and sign-off (browser)', () => {
  let browser: Browser;
  let jobNumber = '';
  let jobId = 0;
  let certificateNumber = '';

  beforeAll(async () => {
    browser = await launchBrowser();
    // The demo's job in review (the Northgate signal generator); another test may have submitted one of its own.
    const lead = await apiLogin('lead@kilocycle.test', DEMO_PASSWORD);
    const queue = await apiGet<ListResponse<Job>>(lead, '/jobs?status=in_review&pageSize=50&sort=receivedDate');
    const candidates = [...queue.items].sort((a, b) => Number(b.instrumentLabel.includes('N-1041')) - Number(a.instrumentLabel.includes('N-1041')));
    for (const job of candidates) {
      const review = await apiGet<JobReview>(lead, `/reviews/${job.id}`);
      if (review.canSign) {
        jobId = job.id;
        jobNumber = job.number;
        break;
      }
    }
    expect(jobId, 'the demo data has a job in review that the lead may sign').toBeGreaterThan(0);
  });

  afterAll(async () => {
    await browser?.close();
  });

  it('should show the lead the data, fits, results, budgets and decisions of the job in review', async () => {
    const page = await patientPage(browser);
    await signIn(page, 'lead@kilocycle.test');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Review', exact: true }).click();
    await page.getByRole('link', { name: `Review job ${jobNumber}` }).click();
    await page.getByRole('heading', { name: `Review of job ${jobNumber}` }).waitFor();
    // The header and the results carry both outcomes, as found and as left.
    const outcomes = page.getByLabel('Outcomes');
    expect(await outcomes.first().innerText()).toMatch(/As found[\s\S]*As left/);
    expect(await outcomes.nth(1).innerText()).toMatch(/As found, before adjustment[\s\S]*As left, after adjustment/);

    const results = page.getByRole('table', { name: /^Results, range / }).first();
    await results.waitFor();
    expect(await results.getByText('Pass').count()).toBeGreaterThan(0);
    expect(await page.getByRole('region', { name: 'Flags' }).innerText()).toMatch(/Flags/);
    expect(await page.getByText(/AS FOUND · RUN \d+/i).count()).toBeGreaterThan(0);

    // A setting's row opens the budget behind it.
    await results
      .getByRole('row', { name: /^Setting .*: show its budget$/ })
      .nth(1)
      .click();
    const budget = page.getByRole('region', { name: /^Budget at / });
    await budget.waitFor();
    const budgetText = await budget.innerText();
    expect(budgetText).toMatch(/Counter resolution/);
    expect(budgetText).toMatch(/Coverage factor k/);
    expect(budgetText).toMatch(/Expanded uncertainty U/);
    await keepScreenshot(page, 'review-page');
    await page.setViewportSize({ width: 390, height: 844 });
    await page.getByRole('heading', { name: `Review of job ${jobNumber}` }).scrollIntoViewIfNeeded();
    await keepScreenshot(page, 'review-page-390');
    await page.context().close();
  });

  it('should keep the sign dialog open on a wrong password, then sign and show the certificate number', async () => {
    const page = await patientPage(browser);
    await signIn(page, 'lead@kilocycle.test');
    await page.goto(`/reviews/${jobId}`);
    await page.getByRole('button', { name: 'Sign and issue' }).click();
    const dialog = page.getByRole('dialog', { name: 'Sign and issue the certificate' });
    expect(await dialog.getByTestId('signing-meaning').innerText()).toBe('Reviewed and approved for issue');

    await dialog.getByLabel('Your password').fill('not-the-password');
    await dialog.getByRole('button', { name: 'Sign and issue' }).click();
    await dialog
      .getByRole('alert')
      .getByText(/Password is not right/)
      .waitFor();
    expect(await dialog.isVisible()).toBe(true);
    await keepScreenshot(page, 'review-sign-refused');

    await dialog.getByLabel('Your password').fill(DEMO_PASSWORD);
    await dialog.getByRole('button', { name: 'Sign and issue' }).click();
    const number = page.getByTestId('certificate-number');
    await number.waitFor({ timeout: 30_000 });
    certificateNumber = (await number.innerText()).trim();
    expect(certificateNumber).toMatch(/^[A-Z][A-Z0-9]*-\d{4}-\d{4}$/);
    expect(await page.getByRole('button', { name: /Certificate PDF/ }).count()).toBe(1);
    expect(await page.getByText('Issued', { exact: true }).count()).toBeGreaterThan(0);
    await keepScreenshot(page, 'review-signed');
    await page.context().close();
  });

  it('should put the certificate mail, with its PDF, in the admin’s outbox', async () => {
    expect(certificateNumber).not.toBe('');
    // The mail server captures the message as it arrives; give it a moment.
    const admin = await apiLogin('admin@kilocycle.test', DEMO_PASSWORD);
    let found: MailMessageSummary | undefined;
    for (let attempt = 0; attempt < 40 && !found; attempt++) {
      const mail = await apiGet<ListResponse<MailMessageSummary>>(admin, `/mail?q=${encodeURIComponent(certificateNumber)}`);
      found = mail.items.find((m) => m.subject.includes(certificateNumber));
      if (!found) await new Promise((resolve) => setTimeout(resolve, 250));
    }
    expect(found, `a captured mail about ${certificateNumber}`).toBeDefined();

    const page = await patientPage(browser);
    await signIn(page, 'admin@kilocycle.test');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Outbox', exact: true }).click();
    await page.getByRole('link', { name: found!.subject }).click();
    await page.getByRole('heading', { name: found!.subject }).waitFor();
    expect(await page.getByRole('button', { name: new RegExp(`${certificateNumber}.*application/pdf`) }).count()).toBe(1);
    await page.getByRole('tab', { name: 'Plain text' }).click();
    expect(await page.locator('pre').innerText()).toContain(certificateNumber);
    await keepScreenshot(page, 'outbox-message');
    await page.context().close();
  });
});
