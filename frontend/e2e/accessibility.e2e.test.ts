import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, it } from 'vitest';
import { expectNoSeriousViolations } from './support/axe';
import { keepScreenshot, launchBrowser, newPage, signIn } from './support/browser';
import { DEMO_ACCOUNTS, MAIN_PAGES, findDemoRecords, waitForPageSettled, type DemoRecords } from './support/main-pages';

// Issue #14, item 7: axe-core (WCAG 2.x A/AA and its best practices) on the main pages of every role, as each
// role reaches them; any serious or critical violation fails, with the page, the rule and the elements named.
describe('accessibility of the main pages (browser, axe-core)', () => {
  let browser: Browser;
  let records: DemoRecords;

  beforeAll(async () => {
    browser = await launchBrowser();
    records = await findDemoRecords();
  });
  afterAll(async () => {
    await browser?.close();
  });

  for (const role of [...new Set(MAIN_PAGES.map((entry) => entry.role))]) {
    describe(role === 'public' ? 'without signing in' : `signed in as the ${role}`, () => {
      let page: Page;
      beforeAll(async () => {
        page = await newPage(browser);
        page.setDefaultTimeout(30_000);
        if (role !== 'public') await signIn(page, DEMO_ACCOUNTS[role]);
      });
      afterAll(async () => {
        await page?.context().close();
      });

      for (const entry of MAIN_PAGES.filter((candidate) => candidate.role === role)) {
        it(`should find no serious or critical violation on the ${entry.name}`, async () => {
          await page.goto(entry.path(records));
          await waitForPageSettled(page);
          try {
            await expectNoSeriousViolations(page, `the ${entry.name} (${entry.path(records)})`);
          } catch (error) {
            await keepScreenshot(page, `a11y-${role}-${entry.name.replace(/\W+/g, '-')}-failure`);
            throw error;
          }
        });
      }
    });
  }
});
