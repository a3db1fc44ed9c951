import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Bench, BenchTokenResponse } from '@kilocycle/common/types';
import { DEMO_PASSWORD, keepScreenshot, launchBrowser, onNewPage, signIn } from './support/browser';
import { apiGet, apiLogin, apiRequest } from './support/lab';

// Reissuing a bench's bridge token (issue #14): the administrator is asked first and told that a running bridge is cut
// off; the dialog that hands out the new token and the bridge command carries the high-voltage caution.

/** Waits until the open dialogs have faded in, so a kept screenshot shows them as a person sees them. */
async function settled(page: Page) {
  await page.waitForFunction(() => [...document.querySelectorAll('.MuiDialog-container')].every((el) => getComputedStyle(el).opacity === '1'));
}

async function reissue(page: Page, bench: Bench, shot: string) {
  await page.goto(`/benches?q=${encodeURIComponent(bench.name)}`);
  await page.getByRole('gridcell', { name: bench.name }).first().waitFor();
  // On a phone the grid renders only the columns in view: scroll it sideways to its actions, as a person would.
  await page.locator('.MuiDataGrid-virtualScroller').evaluate((el) => el.scrollTo({ left: el.scrollWidth }));
  await page.getByRole('button', { name: `Issue bridge token for ${bench.name}` }).click();
  const confirm = page.getByRole('dialog', { name: 'Issue a new bridge token?' });
  await expect.poll(() => confirm.innerText()).toContain('a bridge running with the old token is cut off at once');
  await settled(page);
  await keepScreenshot(page, `${shot}-confirm`);
  await confirm.getByRole('button', { name: 'Issue new token' }).click();
  const shown = page.getByRole('dialog', { name: `Bridge token for ${bench.name}` });
  await shown.waitFor();
  const caution = shown.getByRole('note', { name: 'Safety caution' });
  expect(await caution.innerText()).toContain('hundreds of volts');
  expect(await caution.innerText()).toContain('does not judge whether a procedure is safe');
  const command = await shown.getByTestId('Command').innerText();
  await settled(page);
  await keepScreenshot(page, shot);
  await shown.getByRole('button', { name: 'I have copied it' }).click();
  return /--token (\S+)/.exec(command)?.[1] ?? '';
}

describe('bench token reissue (browser)', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('should ask before replacing a token, then show the new one with the bridge command and the caution, at 1440 and 390 px', async () => {
    // A bench of the test's own that already holds a token, so no other test's bridge is touched.
    const admin = await apiLogin('admin@kilocycle.test', DEMO_PASSWORD);
    const bench = await apiRequest<Bench>(admin, 'POST', '/benches', { name: `Token test bench ${Date.now().toString(36)}`, location: 'Browser test' });
    const first = await apiRequest<BenchTokenResponse>(admin, 'POST', `/benches/${bench.id}/token`);

    await onNewPage(browser, 'bench-token', async (page) => {
      await signIn(page, 'admin@kilocycle.test');
      const wide = await reissue(page, bench, 'bench-token-reissue');
      await page.setViewportSize({ width: 390, height: 844 });
      const narrow = await reissue(page, bench, 'bench-token-reissue-390');
      // Each confirmation issued a new token; the page showed it in the command, and none is the one before.
      expect(new Set([first.token, wide, narrow]).size).toBe(3);
      expect(wide).toMatch(/^kcb_/);
    });
    const after = await apiGet<Bench>(admin, `/benches/${bench.id}`);
    expect(after.hasToken).toBe(true);
  });
});
