import type { Browser, Page } from 'playwright-core';
import { newPage } from './browser';

/**
 * A page for the longer journeys: charts drawn without animation (the screenshots show them finished), and
 * a minute for each step, because these pages compute fits and budgets on a machine that is often busy.
 */
export async function patientPage(browser: Browser): Promise<Page> {
  const page = await newPage(browser);
  page.setDefaultTimeout(60_000);
  await page.emulateMedia({ reducedMotion: 'reduce' });
  return page;
}
