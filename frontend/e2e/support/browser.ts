import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';

export const BASE_URL = process.env.KC_E2E_URL ?? 'http://127.0.0.1:5190';
export const DEMO_PASSWORD = 'kilocycle-demo';
const SCREENSHOTS = process.env.KC_E2E_SCREENSHOTS ?? join(process.cwd(), '..', 'var', 'screenshots');

export async function launchBrowser(): Promise<Browser> {
  // playwright-core adds --no-sandbox and the no-background-network flags itself; only the path is ours.
  return chromium.launch({ executablePath: process.env.KC_CHROMIUM ?? '/usr/bin/chromium', headless: true });
}

export async function newPage(browser: Browser): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1440, height: 900 }, baseURL: BASE_URL });
  return context.newPage();
}

/** Signs in through the sign-in form, as a person would, and waits for the app shell. */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}

/** Keeps a screenshot under var/screenshots for a person to look at; never part of an assertion. */
export async function keepScreenshot(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENSHOTS, { recursive: true });
  await page.screenshot({ path: join(SCREENSHOTS, `${name}.png`), fullPage: true });
}

/**
 * Runs one journey on a fresh page of its own: on failure a screenshot named `<failureShot>-failure`
 * is kept for a person to look at, and the page's context is closed either way.
 */
export async function onNewPage(browser: Browser, failureShot: string, journey: (page: Page) => Promise<void>): Promise<void> {
  const page = await newPage(browser);
  try {
    await journey(page);
  } catch (error) {
    await keepScreenshot(page, `${failureShot}-failure`).catch(() => undefined);
    throw error;
  } finally {
    await page.context().close();
  }
}
