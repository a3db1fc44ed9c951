import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Bench, ListResponse, Organization } from '@kilocycle/common/types';
import { DEMO_PASSWORD, keepScreenshot, launchBrowser, onNewPage, signIn } from './support/browser';
import { apiGet, apiLogin } from './support/lab';

// The one form dialog every form uses (issue #15): the first field has the focus, Enter submits, the schema's
// message stands under its field before anything is sent, Esc cancels; at 1440 and 390 px.

async function settled(page: Page) {
  await page.waitForFunction(() => [...document.querySelectorAll('.MuiDialog-container')].every((el) => getComputedStyle(el).opacity === '1'));
}

const focusedLabel = (page: Page) =>
  page.evaluate(() => {
    const active = document.activeElement as HTMLInputElement | null;
    return active?.labels?.[0]?.textContent ?? '';
  });

describe('form dialogs (browser)', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('should focus the first field, refuse an empty name on Enter without sending, and cancel on Esc, at 1440 and 390 px', async () => {
    const admin = await apiLogin('admin@kilocycle.test', DEMO_PASSWORD);
    const organisationsBefore = (await apiGet<ListResponse<Organization>>(admin, '/organizations?pageSize=200')).total;
    const benchesBefore = (await apiGet<ListResponse<Bench>>(admin, '/benches?pageSize=200')).total;

    await onNewPage(browser, 'form-dialogs', async (page) => {
      await signIn(page, 'admin@kilocycle.test');
      for (const width of [1440, 390]) {
        await page.setViewportSize({ width, height: width === 390 ? 844 : 900 });

        await page.goto('/admin/organisations');
        await page.getByRole('button', { name: 'New organisation' }).click();
        const organisation = page.getByRole('dialog', { name: 'New organisation' });
        await settled(page);
        expect(await focusedLabel(page)).toMatch(/^Name/);
        await page.keyboard.press('Enter');
        await organisation.getByText('Enter the organisation’s name').waitFor();
        await page.keyboard.type('Example');
        await organisation.getByLabel('Contact e-mail').fill('not-an-address');
        await page.keyboard.press('Enter');
        await organisation.getByText('Enter a valid e-mail address, or leave it empty').waitFor();
        await keepScreenshot(page, `form-dialog-organisation-${width}`);
        await page.keyboard.press('Escape');
        await organisation.waitFor({ state: 'detached' });

        await page.goto('/benches');
        await page.getByRole('button', { name: 'New bench' }).click();
        const bench = page.getByRole('dialog', { name: 'New bench' });
        await settled(page);
        expect(await focusedLabel(page)).toMatch(/^Name/);
        await bench.getByRole('button', { name: 'Create bench' }).click();
        await bench.getByText('Give the bench a name').waitFor();
        await keepScreenshot(page, `form-dialog-bench-${width}`);
        await bench.getByRole('button', { name: 'Cancel' }).click();
        await bench.waitFor({ state: 'detached' });
      }
    });

    // Nothing was sent: the refusals were the form's own.
    expect((await apiGet<ListResponse<Organization>>(admin, '/organizations?pageSize=200')).total).toBe(organisationsBefore);
    expect((await apiGet<ListResponse<Bench>>(admin, '/benches?pageSize=200')).total).toBe(benchesBefore);
  });
});
