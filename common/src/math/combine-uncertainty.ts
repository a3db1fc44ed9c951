import { COVERAGE_95_45, coverageFactor } from './coverage-factor.js';
import { assertFinite } from './guards.js';
import { MetrologyError } from './metrology-error.js';
import { roundUncertainty } from './round-uncertainty.js';

/** One line of an uncertainty budget. */
export type UncertaintyComponent = {
  name: string;
  /** Type A (statistics of repeated readings) or Type B (other information). */
  kind: 'A' | 'B';
  distribution: 'normal' | 'rectangular' | 'triangular' | 'u_shaped';
  /** Half-width (or, with divisor 1, the standard uncertainty) in the unit of this input quantity. */
  value: number;
  /** value / divisor = standard uncertainty (√3 rectangular, √6 triangular, √2 U-shaped, k for a quoted U). */
  divisor: number;
  /** Sensitivity coefficient c_i: unit of the result per unit of this input. */
  sensitivity: number;
  /** Degrees of freedom; null = infinite. */
  dof: number | null;
};

/** The usual divisors for each distribution (GUM 4.3.7, 4.3.9, and the U-shaped case). */
export const DISTRIBUTION_DIVISORS = Object.freeze({
  rectangular: Math.sqrt(3),
  triangular: Math.sqrt(6),
  u_shaped: Math.SQRT2,
});

export type CombinedUncertainty = {
  components: Array<UncertaintyComponent & { standardUncertainty: number; contribution: number }>;
  /** Combined standard uncertainty u_c. */
  uc: number;
  /** Effective degrees of freedom (Welch–Satterthwaite), Infinity when every component has infinite dof. */
  nuEff: number;
  /** Coverage factor t_p(floor(ν_eff)) at p = 95.45 %, 2 for infinite ν_eff. */
  k: number;
  /** Expanded uncertainty k·u_c rounded to two significant digits (ordinary rounding, see roundUncertainty). */
  U: number;
  /** k·u_c before rounding. */
  Uunrounded: number;
  coverage: 0.9545;
};

/**
 * Welch–Satterthwaite effective degrees of freedom (GUM G.4.1, Eq. G.2b):
 * ν_eff = u_c⁴ / Σ (u_i⁴ / ν_i), with u_i = |c_i|·u(x_i); infinite ν_i add nothing.
 *
 * @param uc combined standard uncertainty (pass it rounded to reproduce a worked example that rounds first)
 * @param contributions [u_i, ν_i] pairs, ν_i null for infinite
 * @returns ν_eff, Infinity when no contribution has finite ν_i (or all such u_i are 0)
 * @throws {MetrologyError} 'bad_argument' for ν_i ≤ 0, 'not_finite'
 * @example welchSatterthwaite(1.03, [[0.25, 9], [0.57, 4], [0.82, 14]]); // => 19.03…
 */
export function welchSatterthwaite(uc: number, contributions: ReadonlyArray<readonly [number, number | null]>): number {
  const fn = 'welchSatterthwaite';
  assertFinite(fn, 'u_c', uc);
  let denominator = 0;
  for (const [ui, nu] of contributions) {
    assertFinite(fn, 'u_i', ui);
    if (nu === null || nu === Number.POSITIVE_INFINITY) continue;
    if (!(nu > 0)) throw new MetrologyError('bad_argument', `${fn} requires degrees of freedom greater than zero (got ${nu})`);
    denominator += ui ** 4 / nu;
  }
  return denominator > 0 ? uc ** 4 / denominator : Number.POSITIVE_INFINITY;
}

/**
 * Combines an uncertainty budget (JCGM 100:2008 "GUM", uncorrelated inputs):
 * u(x_i) = value/divisor; u_i = |c_i|·u(x_i); u_c = √Σu_i² (GUM 5.1.2);
 * ν_eff by Welch–Satterthwaite ({@link welchSatterthwaite});
 * k = t_95.45(ν) with ν = ν_eff truncated to the next lower integer (GUM G.6.4), 2 for ν = ∞;
 * U = k·u_c rounded to two significant digits by ordinary rounding (not rounded up).
 *
 * @param components the budget lines
 * @returns each line with its standard uncertainty and contribution, u_c, ν_eff, k, U
 * @throws {MetrologyError} 'too_few_points' (empty budget), 'not_finite', 'bad_argument'
 *   (divisor ≤ 0, value < 0, dof ≤ 0), 'zero_uncertainty' (u_c = 0)
 * @example combineUncertainty([{ name: 'resolution', kind: 'B', distribution: 'rectangular', value: 1, divisor: Math.sqrt(3), sensitivity: 1, dof: null }]).uc; // => 0.577…
 */
export function combineUncertainty(components: ReadonlyArray<UncertaintyComponent>): CombinedUncertainty {
  const fn = 'combineUncertainty';
  if (components.length === 0) throw new MetrologyError('too_few_points', `${fn} requires at least 1 component`);
  const lines = components.map((component) => {
    assertFinite(fn, `the value of '${component.name}'`, component.value);
    assertFinite(fn, `the divisor of '${component.name}'`, component.divisor);
    assertFinite(fn, `the sensitivity of '${component.name}'`, component.sensitivity);
    if (component.value < 0) throw new MetrologyError('bad_argument', `${fn} requires a value of zero or more for '${component.name}'`);
    if (!(component.divisor > 0)) throw new MetrologyError('bad_argument', `${fn} requires a divisor greater than zero for '${component.name}'`);
    if (component.dof !== null && !(component.dof > 0)) {
      throw new MetrologyError('bad_argument', `${fn} requires degrees of freedom greater than zero (or null for infinite) for '${component.name}'`);
    }
    const standardUncertainty = component.value / component.divisor;
    return { ...component, standardUncertainty, contribution: Math.abs(component.sensitivity) * standardUncertainty };
  });
  let sumSquares = 0;
  for (const line of lines) sumSquares += line.contribution ** 2;
  const uc = Math.sqrt(sumSquares);
  if (!(uc > 0)) throw new MetrologyError('zero_uncertainty', `${fn}: the combined uncertainty is zero; a budget needs at least one non-zero component`);
  const nuEff = welchSatterthwaite(
    uc,
    lines.map((line) => [line.contribution, line.dof] as const),
  );
  const k = nuEff === Number.POSITIVE_INFINITY ? 2 : coverageFactor(Math.max(1, Math.floor(nuEff)), COVERAGE_95_45);
  const Uunrounded = k * uc;
  return { components: lines, uc, nuEff, k, U: roundUncertainty(Uunrounded), Uunrounded, coverage: 0.9545 };
}
