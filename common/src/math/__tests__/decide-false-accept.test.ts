// ILAC-G8:09/2019 4.2.2 (fixtures/conformity/ilac_g8_decision_rules.md): with w = U (k = 2, normal) the specific
// probability of a false accept of a passed result is below 2.5 %. That holds for w = U as computed, k·u_c; the
// U printed on a certificate is rounded to two significant digits and may be up to 5 % smaller. The probabilities
// here come from jstat's normal CDF, independent of the code under test.
import fc from 'fast-check';
import jstat from 'jstat';
import { combineUncertainty, type UncertaintyComponent } from '../combine-uncertainty.js';
import { decide, type DecisionRule } from '../decide.js';
import { roundUncertainty } from '../round-uncertainty.js';

const SEED = 20191209;

/** P(|true error| > TL) for a true error distributed N(e, u_c²): both tails. */
function falseAcceptBothLimits(errorHz: number, toleranceHz: number, uc: number): number {
  return 1 - jstat.normal.cdf(toleranceHz, errorHz, uc) + jstat.normal.cdf(-toleranceHz, errorHz, uc);
}

/** P(true error beyond the limit nearer the result): ILAC-G8's specific false-accept probability. */
function falseAcceptNearerLimit(errorHz: number, toleranceHz: number, uc: number): number {
  return 1 - jstat.normal.cdf(toleranceHz, Math.abs(errorHz), uc);
}

describe('decide() with the unrounded expanded uncertainty', () => {
  test('guarded binary: 7 498.995 Hz against ±7 500 Hz with u_c = 0.52451 Hz, k = 2 fails (AL = 7 498.951 Hz)', () => {
    // One normal Type B line of 0.52451 Hz: infinite degrees of freedom, so k = 2 (GUM Table G.2, ν = ∞).
    const budget = combineUncertainty([{ name: 'u_c', kind: 'B', distribution: 'normal', value: 0.52451, divisor: 1, sensitivity: 1, dof: null }]);
    expect(budget.k).toBe(2);
    expect(budget.Uunrounded).toBeCloseTo(1.04902, 10);
    expect(budget.U).toBe(1.0); // what the certificate prints
    const result = decide({ errorHz: 7498.995, toleranceHz: 7500, U: budget.Uunrounded, rule: 'guarded_binary' });
    expect(result.decision).toBe('fail');
    expect(result.guardBandHz).toBeCloseTo(1.04902, 10);
    expect(result.acceptanceLimitHz).toBeCloseTo(7498.95098, 8);
    expect(result.tur).toBeCloseTo(7500 / 1.04902, 8);
    // The rounded U would have passed it, with a false-accept probability of 2.77 % (> 2.5 %).
    expect(decide({ errorHz: 7498.995, toleranceHz: 7500, U: budget.U, rule: 'guarded_binary' }).decision).toBe('pass');
    expect(falseAcceptBothLimits(7498.995, 7500, 0.52451)).toBeCloseTo(0.0277, 4);
    // Same result, negative error: the rule is symmetric.
    expect(decide({ errorHz: -7498.995, toleranceHz: 7500, U: budget.Uunrounded, rule: 'guarded_binary' }).decision).toBe('fail');
  });

  // A random budget (Type B lines, sometimes a Type A line with few degrees of freedom, so k ranges from 2 up),
  // a tolerance from 1 to 30 times U, and an error mostly near the acceptance limit, where the risk lies.
  const component = fc.record({
    value: fc.double({ min: 1e-4, max: 50, noNaN: true }),
    distribution: fc.constantFrom('rectangular', 'normal') as fc.Arbitrary<'rectangular' | 'normal'>,
  });
  const scenario = fc.record({
    typeB: fc.array(component, { minLength: 1, maxLength: 5 }),
    typeA: fc.option(fc.record({ value: fc.double({ min: 1e-4, max: 50, noNaN: true }), dof: fc.integer({ min: 1, max: 40 }) }), { nil: null }),
    tur: fc.double({ min: 1.0001, max: 30, noNaN: true }),
    // Offset of |e| from the acceptance limit, in units of U, uniform (fast-check's doubles crowd near 0): mostly
    // within ±10 % of the limit.
    offset: fc.oneof(
      fc.integer({ min: -1000, max: 1000 }).map((i) => i / 10_000),
      fc.integer({ min: -300, max: 100 }).map((i) => i / 100),
    ),
    negative: fc.boolean(),
    rule: fc.constantFrom('guarded_binary', 'guarded') as fc.Arbitrary<DecisionRule>,
  });
  type Scenario = typeof scenario extends fc.Arbitrary<infer T> ? T : never;

  function budgetOf(s: Scenario) {
    const lines: UncertaintyComponent[] = s.typeB.map((c, i) => ({
      name: `B${i}`,
      kind: 'B',
      distribution: c.distribution,
      value: c.value,
      divisor: c.distribution === 'rectangular' ? Math.sqrt(3) : 2,
      sensitivity: 1,
      dof: null,
    }));
    if (s.typeA) lines.push({ name: 'A', kind: 'A', distribution: 'normal', value: s.typeA.value, divisor: 1, sensitivity: 1, dof: s.typeA.dof });
    return combineUncertainty(lines);
  }

  function passedPoint(s: Scenario, which: 'unrounded' | 'rounded') {
    const budget = budgetOf(s);
    const U = which === 'unrounded' ? budget.Uunrounded : roundUncertainty(budget.Uunrounded);
    const toleranceHz = s.tur * budget.Uunrounded;
    const magnitude = Math.max(0, toleranceHz - budget.Uunrounded + s.offset * budget.Uunrounded);
    const errorHz = s.negative ? -magnitude : magnitude;
    const result = decide({ errorHz, toleranceHz, U, rule: s.rule });
    return { budget, toleranceHz, errorHz, passed: result.decision === 'pass' };
  }

  test('no passed point has a specific false-accept probability above 2.5 % (property, fast-check, seeded)', () => {
    fc.assert(
      fc.property(scenario, (s) => {
        const { budget, toleranceHz, errorHz, passed } = passedPoint(s, 'unrounded');
        if (!passed) return true;
        expect(budget.k).toBeGreaterThanOrEqual(2);
        // ILAC-G8's figure: beyond the nearer limit.
        expect(falseAcceptNearerLimit(errorHz, toleranceHz, budget.uc)).toBeLessThanOrEqual(0.025);
        // Beyond either limit: the same bound while the far limit is out of reach (TL ≥ 1.25 U: far tail ≤ Φ(−3)).
        if (toleranceHz >= 1.25 * budget.Uunrounded) expect(falseAcceptBothLimits(errorHz, toleranceHz, budget.uc)).toBeLessThanOrEqual(0.025);
        return true;
      }),
      { seed: SEED, numRuns: 5000 },
    );
  });

  test('the same property fails when the rounded U is used (the test can fail)', () => {
    const outcome = fc.check(
      fc.property(scenario, (s) => {
        const { budget, toleranceHz, errorHz, passed } = passedPoint(s, 'rounded');
        return !passed || falseAcceptNearerLimit(errorHz, toleranceHz, budget.uc) <= 0.025;
      }),
      { seed: SEED, numRuns: 5000 },
    );
    expect(outcome.failed).toBe(true);
  });

  test('below a TUR of about 1.2:1 both limits are within reach: a pass at e = 0 can carry more than 2.5 % in total', () => {
    // TL = 1.1 U, k = 2, e = 0: 2Φ(−2.2) = 2.78 % (normal table). The rule text therefore speaks of the nearer
    // limit, and every such point is already flagged for a TUR below 4:1.
    const uc = 1;
    const result = decide({ errorHz: 0, toleranceHz: 2.2, U: 2 * uc, rule: 'guarded_binary' });
    expect(result.decision).toBe('pass');
    expect(result.turFlag).toBe(true);
    expect(falseAcceptBothLimits(0, 2.2, uc)).toBeCloseTo(0.0278, 4);
    expect(falseAcceptNearerLimit(0, 2.2, uc)).toBeLessThan(0.025);
  });
});
