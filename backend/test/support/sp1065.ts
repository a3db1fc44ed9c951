import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

// NIST SP 1065 (Riley 2008) §12.4's 1000-point test suite and its published results (Table 31, as recorded in
// fixtures/stability), shared by the stability specs.

const here = dirname(fileURLToPath(import.meta.url));

/** Table 31 as recorded: the averaging factors and each deviation's printed digits. */
export const table31 = JSON.parse(readFileSync(resolve(here, '../../../fixtures/stability/sp1065_1000point_results.json'), 'utf8')) as {
  averaging_factors: number[];
  results: Record<string, string[]>;
};

/** SP 1065 §12.4: n(0) = 1234567890, n(i+1) = 16807·n(i) mod 2147483647, y(i) = n(i)/2147483647. */
export function sp1065Suite(): number[] {
  const out: number[] = [];
  let n = 1234567890;
  for (let i = 0; i < 1000; i++) {
    out.push(n / 2147483647);
    n = (16807 * n) % 2147483647;
  }
  return out;
}

/** The printed digits allow half a unit in the last printed place. */
export function expectPrinted(actual: number, printed: string, label: string): void {
  const [mantissa = '', exponent = '0'] = printed.split('e');
  const places = (mantissa.split('.')[1] ?? '').length;
  const halfUnit = 0.5 * 10 ** (Number(exponent) - places);
  if (!(Math.abs(actual - Number(printed)) <= halfUnit)) throw new Error(`${label}: got ${actual}, printed ${printed} (±${halfUnit})`);
}
