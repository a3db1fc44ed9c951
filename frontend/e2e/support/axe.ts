import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { AxeResults, ImpactValue, Result } from 'axe-core';
import type { Page } from 'playwright-core';

// axe-core runs inside the page: its bundled source is evaluated there (no script tag, so no CSP question).
const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
const BLOCKING: readonly ImpactValue[] = ['serious', 'critical'];

/** Runs axe-core (WCAG 2.x A and AA rules and axe's best practices) on the page as it is now. */
export async function axeViolations(page: Page): Promise<Result[]> {
  const loaded = await page.evaluate(() => typeof (window as unknown as { axe?: unknown }).axe === 'object');
  if (!loaded) await page.evaluate(AXE_SOURCE);
  const results = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (context: Document, options: object) => Promise<AxeResults> } }).axe;
    return axe.run(document, { resultTypes: ['violations'] });
  });
  return results.violations;
}

/** One line per violation and one indented line per offending element, for a person to read in a failure. */
export function describeViolations(violations: readonly Result[]): string {
  return violations
    .map((violation) => {
      const nodes = violation.nodes.slice(0, 8).map((node) => `    ${node.target.join(' ')}: ${(node.failureSummary ?? '').replace(/\s+/g, ' ').trim()}`);
      const more = violation.nodes.length > 8 ? [`    … and ${violation.nodes.length - 8} more`] : [];
      return [`  ${violation.id} (${violation.impact}, ${violation.nodes.length}×): ${violation.help}`, ...nodes, ...more].join('\n');
    })
    .join('\n');
}

/** Fails with a readable list when axe finds any serious or critical violation on the page. */
export async function expectNoSeriousViolations(page: Page, where: string): Promise<void> {
  const blocking = (await axeViolations(page)).filter((violation) => violation.impact != null && BLOCKING.includes(violation.impact));
  if (blocking.length > 0) {
    const count = blocking.reduce((sum, violation) => sum + violation.nodes.length, 0);
    throw new Error(`${count} serious or critical accessibility violation(s) on ${where}:\n${describeViolations(blocking)}`);
  }
}
