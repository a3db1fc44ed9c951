import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { keepScreenshot, launchBrowser, newPage, signIn } from './support/browser';

// What each role should find in the main navigation (PRODUCT.md §2: who does what in the lab).
const EXPECTED_NAV: Record<string, { email: string; sees: string[]; doesNotSee: string[] }> = {
  admin: {
    email: 'admin@kilocycle.test',
    sees: ['Overview', 'Jobs', 'Instruments', 'Standards', 'Benches', 'Certificates', 'Outbox', 'Users', 'Organisations'],
    doesNotSee: ['Review', 'Comparisons'],
  },
  lead: {
    email: 'lead@kilocycle.test',
    sees: ['Overview', 'Jobs', 'Instruments', 'Standards', 'Benches', 'Review', 'Certificates', 'Comparisons', 'Procedures'],
    doesNotSee: ['Users', 'Organisations', 'Outbox'],
  },
  technician: {
    email: 'tech@kilocycle.test',
    sees: ['Overview', 'Jobs', 'Instruments', 'Standards', 'Benches', 'Certificates'],
    doesNotSee: ['Users', 'Organisations', 'Review', 'Comparisons', 'Outbox'],
  },
  engineer: {
    email: 'engineer@kilocycle.test',
    sees: ['Overview', 'Jobs', 'Instruments', 'Standards', 'Benches', 'Certificates', 'Comparisons'],
    doesNotSee: ['Users', 'Organisations', 'Review', 'Procedures'],
  },
  client: {
    email: 'client@northgate.test',
    sees: ['Overview', 'Jobs', 'Instruments', 'Certificates'],
    doesNotSee: ['Standards', 'Benches', 'Users', 'Organisations', 'Review', 'Comparisons', 'Outbox'],
  },
};

describe('sign-in and navigation per role (browser)', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  for (const [role, expected] of Object.entries(EXPECTED_NAV)) {
    it(`should show the ${role} the ${role}'s navigation after signing in`, async () => {
      const page = await newPage(browser);
      await signIn(page, expected.email);
      const nav = page.getByRole('navigation', { name: 'Main' });
      for (const label of expected.sees) await nav.getByRole('link', { name: label, exact: true }).waitFor({ timeout: 5000 });
      for (const label of expected.doesNotSee) expect(await nav.getByRole('link', { name: label, exact: true }).count()).toBe(0);
      expect(await page.getByRole('banner').innerText()).toMatch(new RegExp(role, 'i'));
      await keepScreenshot(page, `nav-${role}`);
      await page.context().close();
    });
  }

  it('should refuse a wrong password with a message and stay on the sign-in page', async () => {
    const page = await newPage(browser);
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill('tech@kilocycle.test');
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('E-mail or password is not right').waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await page.context().close();
  });

  it('should send a signed-out visitor of a page to sign-in, and a client away from the admin pages', async () => {
    const page = await newPage(browser);
    await page.goto('/admin/users');
    await page.waitForURL(/\/sign-in/);
    await signIn(page, 'client@saltmarsh.test');
    await page.goto('/admin/users');
    await page.getByRole('heading', { name: 'Not allowed' }).waitFor({ timeout: 10000 });
    await page.context().close();
  });
});
