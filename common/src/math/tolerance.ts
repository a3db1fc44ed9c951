import { assertNonNegative, assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/** A range's tolerance: ±percent of setting, or ±(ppm of setting + fixed Hz). */
export type Tolerance = { kind: 'percent'; percent: number } | { kind: 'ppm_hz'; ppm: number; hz: number };

/**
 * Half-width of the tolerance band at a nominal frequency, in Hz:
 * percent → nominal × percent / 100; ppm_hz → nominal × ppm × 10⁻⁶ + hz
 * (the usual "±(x % of setting)" and "±(x ppm + y Hz)" specification forms).
 *
 * @param tol the tolerance
 * @param nominalHz nominal frequency in Hz, greater than zero
 * @returns tolerance half-width in Hz (the limits are nominal ± this)
 * @throws {MetrologyError} 'bad_frequency' for a nominal ≤ 0, 'bad_argument' for negative or
 *   non-finite tolerance figures or an unknown kind
 * @example toleranceHz({ kind: 'percent', percent: 0.5 }, 1_750_000); // => 8750
 * @example toleranceHz({ kind: 'ppm_hz', ppm: 10, hz: 1 }, 7_000_000); // => 71
 */
export function toleranceHz(tol: Tolerance, nominalHz: number): number {
  const fn = 'toleranceHz';
  assertPositive(fn, 'the nominal frequency', nominalHz, 'bad_frequency');
  if (tol.kind === 'percent') {
    assertNonNegative(fn, 'the percent tolerance', tol.percent);
    return (nominalHz * tol.percent) / 100;
  }
  if (tol.kind === 'ppm_hz') {
    assertNonNegative(fn, 'the ppm tolerance', tol.ppm);
    assertNonNegative(fn, 'the fixed Hz tolerance', tol.hz);
    return nominalHz * tol.ppm * 1e-6 + tol.hz;
  }
  throw new MetrologyError('bad_argument', `${fn} requires a tolerance of kind 'percent' or 'ppm_hz'`);
}
