import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, it } from 'vitest';
import { keepScreenshot, launchBrowser, newPage, signIn } from './support/browser';

// Issue #13, item 5: the admin sees why the server refused a guessable password, under the field itself.
describe('new account with a guessable password (browser)', () => {
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
    it(`should show the server's refusal under the password field at ${width} px`, async () => {
      const page = await newPage(browser);
      await signIn(page, 'admin@kilocycle.test');
      // Narrow only after signing in: the phone layout folds the main navigation signIn waits for.
      await page.setViewportSize({ width, height });
      await page.goto('/admin/users');
      await page.getByRole('button', { name: 'New user' }).click();
      const dialog = page.getByRole('dialog', { name: 'New user' });
      await dialog.getByLabel('Name').fill('Odile Fairweather');
      await dialog.getByLabel('E-mail').fill(`odile.fairweather.${width}@kilocycle.test`);
      await dialog.getByRole('combobox', { name: /organisation/i }).click();
      await page.getByRole('option').first().click();
      await dialog.getByLabel('Initial password').fill('123456789012');
      await dialog.getByRole('button', { name: 'Create user' }).click();
      await dialog.getByText(/^Password is too easy to guess/).waitFor({ timeout: 5000 });
      await keepScreenshot(page, `user-password-refused-${width}`);
      await page.context().close();
    });
  }
});
