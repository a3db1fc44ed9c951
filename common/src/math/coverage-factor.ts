import jstat from 'jstat';
import { MetrologyError } from './metrology-error.js';

/**
 * The coverage probability GUM Table G.2 calls "95.45 %": exactly that of ±2σ of a
 * normal distribution, 2Φ(2) − 1 = erf(√2) (the table's footnote). Using the exact
 * value makes k = 2.000 at ν = ∞ and reproduces the table's other entries.
 */
export const COVERAGE_95_45 = 0.9544997361036416;

/**
 * Coverage factor k = t_p(ν): the two-sided Student-t quantile t(1 − (1 − p)/2, ν)
 * (JCGM 100:2008 "GUM" G.3 and Table G.2; NIST TN 1297 Table B.1), from jstat's
 * inverse t distribution. ν may be non-integer (GUM G.6.4 allows interpolation; callers
 * who want the table's truncation pass Math.floor(ν)). For ν = ∞ the normal quantile,
 * and exactly 2 at the default p.
 *
 * Above ν = 1000 jstat's inverse t loses accuracy (about 1e-7 off at ν = 10⁴; it drifts
 * away from 2 and reaches 0 by ν ≈ 10²⁰), so there the expansion of the t quantile about
 * the normal quantile z is used (Abramowitz & Stegun 26.7.5):
 * t ≈ z + (z³ + z)/(4ν) + (5z⁵ + 16z³ + 3z)/(96ν²) + (3z⁷ + 19z⁵ + 17z³ − 15z)/(384ν³);
 * the next term is below 1e-12 for ν > 1000.
 *
 * @param nu degrees of freedom, > 0 (Infinity allowed)
 * @param p coverage probability, 0 < p < 1; default 2Φ(2) − 1 ("95.45 %")
 * @returns k
 * @throws {MetrologyError} 'bad_argument' for ν ≤ 0 or NaN, or p outside (0, 1)
 * @example coverageFactor(10); // => 2.283678…
 * @example coverageFactor(Infinity); // => 2
 */
export function coverageFactor(nu: number, p: number = COVERAGE_95_45): number {
  if (!(nu > 0)) throw new MetrologyError('bad_argument', `coverageFactor requires degrees of freedom greater than zero (got ${nu})`);
  if (!(p > 0 && p < 1)) throw new MetrologyError('bad_argument', `coverageFactor requires 0 < p < 1 (got ${p})`);
  const upper = 1 - (1 - p) / 2;
  if (nu === Number.POSITIVE_INFINITY) {
    return p === COVERAGE_95_45 ? 2 : jstat.normal.inv(upper, 0, 1);
  }
  if (nu > LARGE_DOF) {
    const z = p === COVERAGE_95_45 ? 2 : jstat.normal.inv(upper, 0, 1);
    return (
      z + (z ** 3 + z) / (4 * nu) + (5 * z ** 5 + 16 * z ** 3 + 3 * z) / (96 * nu ** 2) + (3 * z ** 7 + 19 * z ** 5 + 17 * z ** 3 - 15 * z) / (384 * nu ** 3)
    );
  }
  return jstat.studentt.inv(upper, nu);
}

/** Degrees of freedom above which {@link coverageFactor} uses the series instead of jstat's inverse t. */
export const LARGE_DOF = 1000;
