import { assertFinite, assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/** Decision rules: simple acceptance (w = 0), guarded binary (w = U), guarded with four regions (w = U). */
export type DecisionRule = 'simple' | 'guarded' | 'guarded_binary';

/** Outcome of a conformity decision; the conditional ones arise only under the four-region guarded rule. */
export type Decision = 'pass' | 'conditional_pass' | 'conditional_fail' | 'fail';

/** Test uncertainty ratios below this are flagged (the 4:1 rule of thumb: common practice, no published source here). */
export const TUR_FLAG_BELOW = 4;

export type DecisionResult = {
  decision: Decision;
  /** Test uncertainty ratio = tolerance half-width / U. */
  tur: number;
  /** TUR below 4:1. */
  turFlag: boolean;
  /** Guard band w, Hz (0 for simple acceptance). */
  guardBandHz: number;
  /** Acceptance limit AL = TL − w, Hz (may be ≤ 0 when U exceeds the tolerance). */
  acceptanceLimitHz: number;
  /** The rule in words, for the certificate. */
  ruleText: string;
};

// Each text says what decide() computes: w = U as computed (k·u_c, not the two-digit U printed), the strict or
// closed boundaries, and the false-accept figure ILAC-G8 gives (the probability beyond the nearer limit).
const RULE_TEXT: Record<DecisionRule, string> = {
  simple:
    'Simple acceptance (ILAC-G8:09/2019 4.2.1): pass when |error| ≤ TL, otherwise fail; guard band w = 0. ' +
    'At the limit the probability of a false accept can approach 50 %',
  guarded_binary:
    'Guarded acceptance (ILAC-G8:09/2019 4.2.2), w = U (k·u_c before rounding): pass when |error| < TL − U, otherwise fail. ' +
    'For a pass the probability that the true error lies beyond the nearer tolerance limit is below 2.5 %',
  guarded:
    'Guarded acceptance with conditional statements (ILAC-G8:09/2019 4.2.3), w = U (k·u_c before rounding): pass when |error| < TL − U, ' +
    'conditional pass from TL − U to TL, conditional fail above TL up to TL + U, fail beyond TL + U. ' +
    'For a pass the probability that the true error lies beyond the nearer tolerance limit is below 2.5 %',
};

/**
 * Conformity decision for one point against a symmetric tolerance ±TL
 * (ILAC-G8:09/2019 §4.2; ISO/IEC 17025:2017 7.8.6). With e = |error|:
 * - simple: pass if e ≤ TL, else fail;
 * - guarded_binary (w = U): pass if e < TL − U, else fail;
 * - guarded (w = U, four regions): pass if e < TL − U; conditional pass if TL − U ≤ e ≤ TL;
 *   conditional fail if TL < e ≤ TL + U; fail if e > TL + U.
 * Boundaries follow ILAC-G8 4.2.3's closed intervals: e = TL − U is a conditional pass, e = TL
 * a conditional pass, e = TL + U a conditional fail; under simple acceptance e = TL passes.
 * TUR = TL/U, flagged below 4.
 *
 * U is the expanded uncertainty as computed, k·u_c, NOT the value rounded to two significant digits for
 * printing: ILAC-G8 4.2.2 takes w = U so that the specific false-accept probability at the acceptance
 * limit is 1 − Φ(k) ≤ 1 − Φ(2) = 2.3 % (normal, k ≥ 2); U rounded down by up to 5 % moves the limit
 * outward and lets that probability exceed 2.5 %.
 *
 * @param input errorHz (measured − nominal), toleranceHz (half-width TL > 0), U (expanded, unrounded, > 0), rule
 * @returns decision, TUR and flag, guard band, acceptance limit and the rule in words
 * @throws {MetrologyError} 'not_finite', 'bad_argument' (TL or U ≤ 0, unknown rule)
 * @example decide({ errorHz: 90, toleranceHz: 100, U: 20, rule: 'guarded' }).decision; // => 'conditional_pass'
 */
export function decide(input: { errorHz: number; toleranceHz: number; U: number; rule: DecisionRule }): DecisionResult {
  const fn = 'decide';
  assertFinite(fn, 'the error', input.errorHz);
  assertPositive(fn, 'the tolerance', input.toleranceHz);
  assertPositive(fn, 'U', input.U);
  const e = Math.abs(input.errorHz);
  const TL = input.toleranceHz;
  const U = input.U;
  let decision: Decision;
  let guardBandHz: number;
  switch (input.rule) {
    case 'simple':
      guardBandHz = 0;
      decision = e <= TL ? 'pass' : 'fail';
      break;
    case 'guarded_binary':
      guardBandHz = U;
      decision = e < TL - U ? 'pass' : 'fail';
      break;
    case 'guarded':
      guardBandHz = U;
      if (e < TL - U) decision = 'pass';
      else if (e <= TL) decision = 'conditional_pass';
      else if (e <= TL + U) decision = 'conditional_fail';
      else decision = 'fail';
      break;
    default:
      throw new MetrologyError('bad_argument', `${fn} requires rule 'simple', 'guarded' or 'guarded_binary'`);
  }
  const tur = TL / U;
  return { decision, tur, turFlag: tur < TUR_FLAG_BELOW, guardBandHz, acceptanceLimitHz: TL - guardBandHz, ruleText: RULE_TEXT[input.rule] };
}
