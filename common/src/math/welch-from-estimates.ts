import jstat from 'jstat';
import { assertFinite } from './guards.js';
import { MetrologyError } from './metrology-error.js';
import type { WelchDifference } from './welch-difference.js';

/** An estimate with its standard error and degrees of freedom (Infinity when the standard error is known exactly). */
export type Estimate = { value: number; se: number; df: number };

/** Above this many degrees of freedom the Student-t quantile is taken as the normal one (they agree to 1e-7). */
const NORMAL_DF = 1e7;

/**
 * Welch's interval for the difference of two estimates that each come with a standard error and
 * degrees of freedom rather than raw values — fitted parameters (ν = n − p), means of windows
 * (ν = k − 1), Allan deviations (ν = edf):
 * d = b − a, se = √(se_a² + se_b²),
 * ν = se⁴ / (se_a⁴/ν_a + se_b⁴/ν_b)  (Welch–Satterthwaite; JCGM 100:2008 G.4.1, Eq. G.2b; Welch 1947),
 * d ± t(1 − α/2, ν)·se with the Student-t quantile from jstat (non-integer ν allowed; the normal
 * quantile when ν is above 10⁷ or infinite).
 * With se = s/√n and ν = n − 1 this is exactly {@link welchDifference}.
 *
 * @param a the first (reference) estimate
 * @param b the second estimate
 * @param confidence two-sided confidence, default 0.95
 * @returns difference b − a with its interval, ν, the quantile and se
 * @throws {MetrologyError} 'not_finite' (value or se not finite), 'bad_argument' (se < 0, ν ≤ 0 or NaN,
 *   confidence outside (0, 1)), 'no_spread' (both standard errors zero)
 * @example welchFromEstimates({ value: 10, se: 0.3, df: 9 }, { value: 12, se: 0.4, df: 11 }).difference; // => 2
 */
export function welchFromEstimates(a: Estimate, b: Estimate, confidence = 0.95): WelchDifference {
  const fn = 'welchFromEstimates';
  for (const [label, estimate] of [
    ['a', a],
    ['b', b],
  ] as const) {
    assertFinite(fn, `${label}.value`, estimate.value);
    assertFinite(fn, `${label}.se`, estimate.se);
    if (estimate.se < 0) throw new MetrologyError('bad_argument', `${fn} requires ${label}.se of zero or more (got ${estimate.se})`);
    if (!(estimate.df > 0)) throw new MetrologyError('bad_argument', `${fn} requires ${label}.df greater than zero (got ${estimate.df})`);
  }
  if (!(confidence > 0 && confidence < 1)) {
    throw new MetrologyError('bad_argument', `${fn} requires 0 < confidence < 1 (got ${confidence})`);
  }
  const varianceA = a.se * a.se;
  const varianceB = b.se * b.se;
  const varianceOfDifference = varianceA + varianceB;
  if (!(varianceOfDifference > 0)) {
    throw new MetrologyError('no_spread', `${fn} requires a standard error greater than zero in at least one estimate`);
  }
  const se = Math.sqrt(varianceOfDifference);
  const denominator = (varianceA * varianceA) / a.df + (varianceB * varianceB) / b.df;
  const df = denominator > 0 ? (varianceOfDifference * varianceOfDifference) / denominator : Number.POSITIVE_INFINITY;
  const p = 1 - (1 - confidence) / 2;
  const t = df > NORMAL_DF ? jstat.normal.inv(p, 0, 1) : jstat.studentt.inv(p, df);
  const difference = b.value - a.value;
  return { difference, low: difference - t * se, high: difference + t * se, df, t, se, confidence };
}
