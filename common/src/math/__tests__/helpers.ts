// Shared test helpers: relative-error comparison, fixture loading, a seeded PRNG.
import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

/** Relative error |actual − expected| / |expected| (absolute when expected is 0). */
export function relativeError(actual: number, expected: number): number {
  return expected === 0 ? Math.abs(actual) : Math.abs(actual - expected) / Math.abs(expected);
}

/** Asserts a relative error within tolerance, naming the case in the failure. */
export function expectRelative(actual: number, expected: number, tolerance: number, label: string): void {
  const error = relativeError(actual, expected);
  if (!(error <= tolerance)) {
    throw new Error(`${label}: got ${actual}, expected ${expected} (relative error ${error.toExponential(2)} > ${tolerance})`);
  }
}

const fixturesDirectory = resolve(dirname(fileURLToPath(import.meta.url)), '../../../../fixtures');

/** Text of a file under the repository's fixtures/ folder. */
export function readFixture(relativePath: string): string {
  return readFileSync(resolve(fixturesDirectory, relativePath), 'utf8');
}

/** Rows of a simple CSV (no quoted commas in the numeric files used here). */
export function readCsv(relativePath: string): Array<Record<string, string>> {
  const [header, ...lines] = readFixture(relativePath).trim().split(/\r?\n/);
  const names = header!.split(',');
  return lines.map((line) => {
    const cells = line.split(',');
    return Object.fromEntries(names.map((name, i) => [name, cells[i] ?? '']));
  });
}

/** Mulberry32: a small seeded 32-bit PRNG, uniform on [0, 1). */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviates by the Box–Muller transform on a seeded PRNG. */
export function seededGaussian(seed: number): () => number {
  const uniform = seededRandom(seed);
  return () => {
    const u1 = Math.max(uniform(), 1e-300);
    const u2 = uniform();
    return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
  };
}

/** Runs fn and returns the `code` of the error it throws. */
export function errorCode(fn: () => unknown): string {
  try {
    fn();
  } catch (error) {
    const code = (error as { code?: unknown }).code;
    if (typeof code === 'string') return code;
    throw error;
  }
  throw new Error('expected an error with a code');
}

/**
 * The SP 1065 §12.4 1000-point test data (NIST SP 1065, Riley 2008): n(0) = 1234567890,
 * n(i+1) = 16807·n(i) mod 2147483647, y(i) = n(i)/2147483647, fractional frequency at τ0 = 1 s.
 */
export function sp1065TestSuite(): number[] {
  const out: number[] = [];
  let n = 1234567890;
  for (let i = 0; i < 1000; i++) {
    out.push(n / 2147483647);
    n = (16807 * n) % 2147483647; // exact: 16807·n < 2^53
  }
  return out;
}

/** Asserts that a value rounds to a printed figure at the figure's own digits ("70.80607", "2.943883e-01"). */
export function expectPrintedDigits(actual: number, printed: string, label: string): void {
  const exponential = /e/i.test(printed);
  const digits = exponential ? printed.split(/e/i)[0]!.replace(/^-?\d\./, '').length : (printed.split('.')[1] ?? '').length;
  const shown = exponential ? actual.toExponential(digits) : actual.toFixed(digits);
  if (Number(shown) !== Number(printed)) throw new Error(`${label}: got ${actual} (${shown}), printed ${printed}`);
}
