import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Instrument, ListResponse, Run } from '@kilocycle/common/types';
import { DEMO_PASSWORD, keepScreenshot, launchBrowser, signIn } from './support/browser';
import { apiGet, apiLogin } from './support/lab';
import { patientPage } from './support/patient-page';

// Journey 5 (PRODUCT.md §4): the engineer compares the Saltmarsh receiver's warm-up before and after its regulator
// was fitted, sees them overlaid and reads the differences with their 95 % intervals.
describe('comparison of warm-up studies (browser)', () => {
  let browser: Browser;
  let receiver: Instrument;
  let runs: Run[];

  beforeAll(async () => {
    browser = await launchBrowser();
    const engineer = await apiLogin('engineer@kilocycle.test', DEMO_PASSWORD);
    const instruments = await apiGet<ListResponse<Instrument>>(engineer, '/instruments?q=CR7-5520');
    receiver = instruments.items.find((i) => i.serial === 'CR7-5520')!;
    expect(receiver, 'the demo has the Saltmarsh CR-7 receiver').toBeDefined();
    runs = (await apiGet<ListResponse<Run>>(engineer, `/runs?instrumentId=${receiver.id}&kind=warmup&sort=startedAt`)).items;
    expect(runs.length, 'the demo has its two warm-up runs').toBeGreaterThanOrEqual(2);
  });

  afterAll(async () => {
    await browser?.close();
  });

  it('should overlay the before and after warm-ups and state each difference with its 95 % interval', async () => {
    const page = await patientPage(browser);
    await signIn(page, 'engineer@kilocycle.test');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Comparisons', exact: true }).click();
    await page.getByRole('link', { name: 'New comparison' }).click();

    await page.getByLabel('Instrument').fill('CR-7');
    await page.getByRole('option', { name: /CR7-5520/ }).click();
    const [before, after] = runs;
    await page.getByLabel(`Compare run ${before!.id}`).check();
    await page.getByLabel(`Compare run ${after!.id}`).check();
    await page.getByLabel(`Label of run ${before!.id}`).fill('before: original unregulated HT');
    await page.getByLabel(`Label of run ${after!.id}`).fill('after: gas regulator valve fitted');
    await page.getByRole('button', { name: 'Compare', exact: true }).click();

    const sentences = page.getByTestId('comparison-sentence');
    await sentences.first().waitFor({ timeout: 30_000 });
    const said = await sentences.allInnerTexts();
    expect(said.length).toBeGreaterThanOrEqual(4);
    expect(said.some((s) => /^after: gas regulator valve fitted: time constant τ (lower|higher) by .* \(95 % interval /.test(s))).toBe(true);
    expect(said.some((s) => /settled drift rate .*95 % interval/.test(s))).toBe(true);
    await page.getByRole('region', { name: 'Drift from power-on' }).locator('svg path[data-series^="fit-"]').first().waitFor();
    await page.getByRole('region', { name: 'Allan deviation' }).locator('svg path[data-series^="adev-"]').first().waitFor();
    await keepScreenshot(page, 'compare');
    await page.context().close();
  });

  it('should reopen the demo’s saved comparison and export its plot as SVG', async () => {
    const page = await patientPage(browser);
    await signIn(page, 'engineer@kilocycle.test');
    await page.goto('/comparisons');
    await page.getByRole('link', { name: /CR-7 local oscillator warm-up/ }).click();
    await page.getByTestId('comparison-sentence').first().waitFor({ timeout: 30_000 });
    expect((await page.getByTestId('comparison-sentence').allInnerTexts()).join('\n')).toMatch(/95 % interval/);
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Drift from power-on as SVG' }).click()]);
    expect(download.suggestedFilename()).toMatch(/drift-from-power-on\.svg$/);
    await page.context().close();
  });
});
