import { readFileSync } from 'node:fs';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Certificate, Invoice, ListResponse, Quote } from '@kilocycle/common/types';
import { DEMO_PASSWORD, keepScreenshot, launchBrowser, signIn } from './support/browser';
import { apiGet, apiLogin } from './support/lab';
import { patientPage } from './support/patient-page';

/** The page's width against the window's: a phone page must not scroll sideways. */
async function overflowsSideways(page: Page): Promise<boolean> {
  return page.evaluate(() => document.documentElement.scrollWidth > window.innerWidth + 1);
}

// Journey 7 (PRODUCT.md §4): the Northgate client accepts the lab's quote in the portal, pays the invoice that holds
// its certificate with the payment service's success test card on the (local fake's) payment page, comes back to
// the portal and downloads the certificate it released.
describe('a client accepts a quote, pays by card and downloads the released certificate (browser)', () => {
  let browser: Browser;
  let quote: Quote;
  let invoice: Invoice;
  let certificate: Certificate;

  beforeAll(async () => {
    browser = await launchBrowser();
    const client = await apiLogin('client@northgate.test', DEMO_PASSWORD);
    const sent = await apiGet<ListResponse<Quote>>(client, '/quotes?status=sent');
    expect(sent.items.length, 'the demo holds a sent quote for Northgate').toBeGreaterThan(0);
    quote = sent.items[0]!;
    const open = await apiGet<ListResponse<Invoice>>(client, '/invoices?status=issued');
    invoice = open.items.find((i) => i.paymentTerms === 'pay_before_release')!;
    expect(invoice, 'the demo holds an unpaid Northgate invoice that holds a certificate').toBeDefined();
    const certificates = await apiGet<ListResponse<Certificate>>(client, `/certificates?jobId=${invoice.jobId}&status=issued`);
    certificate = certificates.items[0]!;
    expect(certificate.release?.released).toBe(false);
  });

  afterAll(async () => {
    await browser?.close();
  });

  it('should accept the quote in the portal', async () => {
    const page = await patientPage(browser);
    try {
      await signIn(page, 'client@northgate.test');
      await page.goto('/portal/quotes');
      await page.getByRole('button', { name: `Accept quote ${quote.number}` }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByRole('button', { name: 'Accept' }).click();
      await dialog.waitFor({ state: 'hidden' });
      const row = page.getByRole('row').filter({ hasText: quote.number });
      await row.getByText(/Accepted/).waitFor();
      expect(await page.getByRole('button', { name: `Accept quote ${quote.number}` }).count()).toBe(0);
      await keepScreenshot(page, 'portal-quotes');
      await page.setViewportSize({ width: 390, height: 844 });
      await keepScreenshot(page, 'portal-quotes-390');
      expect(await overflowsSideways(page)).toBe(false);
    } finally {
      await page.context().close();
    }
  });

  it('should show why the certificate is held, pay on the payment page with the success card, and release it', async () => {
    const page = await patientPage(browser);
    try {
      await signIn(page, 'client@northgate.test');
      const held = page.getByRole('alert', { name: `Certificate ${certificate.number} is held` }).first();
      await held.waitFor();
      expect(await held.innerText()).toContain(`Held until invoice ${invoice.number} is paid`);
      await keepScreenshot(page, 'portal-held-certificate');

      await held.getByRole('button', { name: /Pay invoice/ }).click();
      // The payment service's page (the local fake in tests), on another origin.
      await page.waitForURL(/\/pay\/cs_/);
      await page.getByLabel('Card number').fill('4242 4242 4242 4242');
      await page.getByLabel('Expiry date (MM/YY)').fill('12/34');
      await page.getByLabel('Security code (CVC)').fill('123');
      await page.getByLabel('Name on card').fill('Nora Quist');
      await keepScreenshot(page, 'payment-page');
      await page.setViewportSize({ width: 390, height: 844 });
      await keepScreenshot(page, 'payment-page-390');
      expect(await overflowsSideways(page)).toBe(false);
      await page.setViewportSize({ width: 1440, height: 900 });
      await page.getByRole('button', { name: /^Pay / }).click();

      // Back in the portal: the webhook has booked the payment, the page says so and the certificate is released.
      await page.waitForURL(new RegExp(`/portal/invoices/${invoice.id}\\?payment=done`));
      await page.getByText('Payment received — thank you.').waitFor({ timeout: 20_000 });
      const [download] = await Promise.all([
        page.waitForEvent('download'),
        page.getByRole('button', { name: `Download ${certificate.number} revision ${certificate.revision} as PDF` }).click(),
      ]);
      const pdf = readFileSync(await download.path());
      expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      await keepScreenshot(page, 'payment-done');
      await page.setViewportSize({ width: 390, height: 844 });
      await keepScreenshot(page, 'payment-done-390');
      expect(await overflowsSideways(page)).toBe(false);

      const client = await apiLogin('client@northgate.test', DEMO_PASSWORD);
      const paid = await apiGet<Invoice>(client, `/invoices/${invoice.id}`);
      expect(paid).toMatchObject({ status: 'paid', balanceMinor: 0, paidMinor: invoice.balanceMinor });
    } finally {
      await page.context().close();
    }
  });
});
