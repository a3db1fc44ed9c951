import { readFileSync } from 'node:fs';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Certificate, CustomerTerms, ListResponse } from '@kilocycle/common/types';
import { DEMO_PASSWORD, keepScreenshot, launchBrowser, signIn } from './support/browser';
import { apiGet, apiLogin, apiRequest } from './support/lab';
import { patientPage } from './support/patient-page';

// Journey 4 (PRODUCT.md §4): the client signs in, sees the organisation's instruments and certificates, downloads
// the PDF and verifies it on the public page; a copy with one byte changed is refused.
describe('client portal and public verification (browser)', () => {
  let browser: Browser;
  let certificate: Certificate;
  let pdf: Buffer;
  let lead: string;
  let terms: CustomerTerms;

  beforeAll(async () => {
    browser = await launchBrowser();
    // Northgate pays before its certificates are released (pay-certificate.e2e.test.ts walks that): this journey
    // is about the portal and verification, so the lab puts Northgate on account for its length.
    lead = await apiLogin('lead@kilocycle.test', DEMO_PASSWORD);
    const client = await apiLogin('client@northgate.test', DEMO_PASSWORD);
    const me = await apiGet<{ organizationId: number }>(client, '/auth/me');
    terms = await apiGet<CustomerTerms>(lead, `/prices/customer-terms/${me.organizationId}`);
    await apiRequest(lead, 'PUT', `/prices/customer-terms/${me.organizationId}`, { ...termsBody(terms), paymentTerms: 'on_account', netDays: 30 });
    const issued = await apiGet<ListResponse<Certificate>>(client, '/certificates?status=issued&sort=issuedAt');
    expect(issued.items.length, 'the demo holds an issued certificate for Northgate Radio Club').toBeGreaterThan(0);
    certificate = issued.items[0]!;
  });

  afterAll(async () => {
    if (terms) await apiRequest(lead, 'PUT', `/prices/customer-terms/${terms.organizationId}`, termsBody(terms));
    await browser?.close();
  });

  it('should show the client the organisation’s instruments, jobs and certificates, and download the PDF', async () => {
    const page = await patientPage(browser);
    await signIn(page, 'client@northgate.test');
    await page.getByRole('heading', { name: 'Northgate Radio Club' }).waitFor();

    const instruments = page.getByRole('table', { name: 'Instruments' });
    await instruments.getByRole('row').nth(1).waitFor();
    const instrumentText = await instruments.innerText();
    expect(instrumentText).toMatch(/N-0952/);
    expect(instrumentText).not.toMatch(/CR7-5520/); // the Saltmarsh receiver belongs to another customer
    expect(await page.getByRole('table', { name: 'Jobs' }).innerText()).toMatch(/Certificate issued/);
    const certificates = page.getByRole('region', { name: 'Certificates' });
    await certificates.getByText(certificate.number).first().waitFor();
    // Both outcomes in the list: the demo instrument was found out of tolerance and left within it.
    const grid = certificates.getByRole('grid', { name: 'Certificates' });
    expect(await grid.getByRole('columnheader', { name: 'As found' }).count()).toBe(1);
    expect(await grid.getByRole('columnheader', { name: 'Final' }).count()).toBe(1);
    const row = grid.getByRole('row').filter({ hasText: certificate.number }).first();
    expect(await row.innerText()).toMatch(/Fail[\s\S]*Pass/);
    await keepScreenshot(page, 'client-overview');

    const [download] = await Promise.all([
      page.waitForEvent('download'),
      certificates.getByRole('button', { name: `Download ${certificate.number} revision ${certificate.revision} as PDF` }).click(),
    ]);
    expect(download.suggestedFilename()).toBe(`${certificate.number}-rev${certificate.revision}.pdf`);
    pdf = readFileSync(await download.path());
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    await page.setViewportSize({ width: 390, height: 844 });
    await keepScreenshot(page, 'client-overview-390');
    await page.context().close();
  });

  it('should show the lab its certificate list with the as-found outcome beside the final one', async () => {
    const page = await patientPage(browser);
    await signIn(page, 'lead@kilocycle.test');
    await page.goto('/certificates');
    const grid = page.getByRole('grid', { name: 'Certificates' });
    const row = grid.getByRole('row').filter({ hasText: certificate.number }).first();
    await row.waitFor();
    expect(await row.innerText()).toMatch(/Fail[\s\S]*Pass/);
    await keepScreenshot(page, 'certificate-list');
    await page.setViewportSize({ width: 390, height: 844 });
    await keepScreenshot(page, 'certificate-list-390');
    await page.context().close();
  });

  it('should confirm on the public page, without signing in, that the downloaded PDF is the issued one', async () => {
    expect(pdf).toBeDefined();
    const page = await patientPage(browser);
    await page.goto('/verify');
    await page.getByLabel('Certificate number').fill(certificate.number.toLowerCase());
    await page.getByRole('button', { name: 'Look it up' }).click();
    await page.waitForURL(new RegExp(`/verify/${certificate.number}$`));
    const status = page.getByTestId('certificate-status');
    await status.waitFor();
    expect(await status.innerText()).toMatch(new RegExp(`Valid: certificate ${certificate.number}, revision ${certificate.revision}`));
    expect(await page.getByText('Northgate Radio Club').count()).toBe(1);

    await page.getByLabel('Certificate PDF to check').setInputFiles({ name: `${certificate.number}.pdf`, mimeType: 'application/pdf', buffer: pdf });
    const result = page.getByTestId('check-result');
    await result.waitFor({ timeout: 15_000 });
    expect(await result.innerText()).toMatch(new RegExp(`The file matches revision ${certificate.revision} of certificate ${certificate.number}`));
    await keepScreenshot(page, 'verify-match');
    await page.context().close();
  });

  it('should refuse a copy with one byte changed', async () => {
    const altered = Buffer.from(pdf);
    const middle = Math.floor(altered.length / 2);
    altered[middle] = altered[middle]! ^ 0x01;
    const page = await patientPage(browser);
    await page.goto(`/verify/${certificate.number}`);
    await page.getByTestId('certificate-status').waitFor();
    await page.getByLabel('Certificate PDF to check').setInputFiles({ name: 'altered.pdf', mimeType: 'application/pdf', buffer: altered });
    const result = page.getByTestId('check-result');
    await result.getByText('Not the issued certificate').waitFor({ timeout: 15_000 });
    expect(await result.innerText()).toMatch(new RegExp(`does not match any issued revision of certificate ${certificate.number}`));
    // The banner at the top changes too: a valid certificate says nothing good about a copy that differs from it.
    const status = await page.getByTestId('certificate-status').innerText();
    expect(status).toMatch(new RegExp(`^Your file is not the issued certificate ${certificate.number}`));
    expect(status).not.toMatch(/Valid/);
    await keepScreenshot(page, 'verify-refused');
    await page.setViewportSize({ width: 390, height: 844 });
    await keepScreenshot(page, 'verify-refused-390');
    await page.context().close();
  });
});

/** The request that sets these terms again. */
function termsBody(t: CustomerTerms) {
  return { taxRateId: t.taxRateId, taxRegistration: t.taxRegistration, paymentTerms: t.paymentTerms, netDays: t.netDays, requiresQuote: t.requiresQuote };
}
