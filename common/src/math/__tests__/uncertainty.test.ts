import jstat from 'jstat';
// Uncertainty: GUM (JCGM 100:2008) Table G.2 t-factors (as NIST TN 1297 Table B.1), the
// Welch–Satterthwaite worked example (GUM G.4.1), closed forms for the budget.
import fc from 'fast-check';
import { COVERAGE_95_45, coverageFactor } from '../coverage-factor.js';
import { combineUncertainty, DISTRIBUTION_DIVISORS, welchSatterthwaite, type UncertaintyComponent } from '../combine-uncertainty.js';
import { frequencyBudget } from '../frequency-budget.js';
import { roundResultToUncertainty, roundUncertainty } from '../round-uncertainty.js';
import { errorCode, expectRelative, readCsv } from './helpers.js';

// Column → two-sided coverage probability. 68.27/95.45/99.73 are 2Φ(k) − 1 for k = 1, 2, 3
// (the table's footnote; erf values from scipy 1.17.1: erf(1/√2), erf(√2), erf(3/√2)).
const PROBABILITIES: Record<string, number> = {
  'p68.27': 0.6826894921370859,
  p90: 0.9,
  p95: 0.95,
  'p95.45': COVERAGE_95_45,
  p99: 0.99,
  'p99.73': 0.9973002039367398,
};
const nuOf = (text: string) => (text === 'inf' ? Number.POSITIVE_INFINITY : Number(text));

describe('coverageFactor()', () => {
  const computed = readCsv('uncertainty/t_factors_computed.csv');
  const printed = readCsv('uncertainty/t_factors_table.csv');

  test.each(computed.flatMap((row) => Object.keys(PROBABILITIES).map((column) => [row.nu!, column, Number(row[column])] as const)))(
    'ν = %s, %s: t-quantile equals t_factors_computed.csv (exact quantiles, 6 dp) within 1e-6',
    (nu, column, expected) => {
      // GUM Table G.2 / NIST TN 1297 Table B.1 entries recomputed exactly (fixtures/uncertainty/README_uncertainty.md)
      // The CSV is rounded to 6 decimals, so the comparison allows that rounding (5e-7 absolute) too.
      const actual = coverageFactor(nuOf(nu), PROBABILITIES[column]);
      expect(Math.abs(actual - expected)).toBeLessThanOrEqual(1e-6 * expected + 5e-7);
    },
  );

  test.each(printed.flatMap((row) => Object.keys(PROBABILITIES).map((column) => [row.nu!, column, Number(row[column])] as const)))(
    'ν = %s, %s: agrees with the printed GUM Table G.2 / TN 1297 Table B.1 to its printed digits',
    (nu, column, expected) => {
      // Known rounding slip in the printed table: ν = 35, 90 % prints 1.70 (exact 1.6896) — see README_uncertainty.md
      const slip = nu === '35' && column === 'p90';
      const tolerance = slip ? 0.011 : nu === '100' || nu === 'inf' ? 0.0005 : 0.005;
      expect(Math.abs(coverageFactor(nuOf(nu), PROBABILITIES[column]) - expected)).toBeLessThanOrEqual(tolerance);
    },
  );

  test('k = 2 exactly at ν = ∞ for 95.45 % (GUM Table G.2 gives 2.00)', () => {
    expect(coverageFactor(Number.POSITIVE_INFINITY)).toBe(2);
  });

  test('large ν: k tends to 2 monotonically and never collapses (normal limit of Student t)', () => {
    // t_p(ν) decreases to the normal quantile as ν grows (a property of Student's t); for 95.45 % the limit is 2.
    const nus = [100, 1000, 1001, 1e4, 1e6, 1e8, 1e12, 1e20, 1e300];
    const ks = nus.map((nu) => coverageFactor(nu));
    for (let i = 1; i < ks.length; i += 1) expect(ks[i]).toBeLessThanOrEqual(ks[i - 1]);
    for (const k of ks) expect(k).toBeGreaterThanOrEqual(2);
    expect(Math.abs(coverageFactor(1e8) - 2)).toBeLessThan(1e-7);
    expect(coverageFactor(1e300)).toBe(2);
    // Where the series takes over it agrees with jstat's inverse t (an independent library, itself
    // good to about 1e-7 there: measured 7.5e-8 at ν = 1000).
    const u = 1 - (1 - COVERAGE_95_45) / 2;
    expect(Math.abs(coverageFactor(1001) - jstat.studentt.inv(u, 1001))).toBeLessThan(2e-7);
  });

  test('closed forms of Student t: ν = 1 (Cauchy) t = tan(π(u − ½)); ν = 2 t = (2u − 1)/√(2u(1 − u))', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 0.999, noNaN: true }), (p) => {
        const u = 1 - (1 - p) / 2;
        const cauchy = Math.tan(Math.PI * (u - 0.5));
        const two = (2 * u - 1) / Math.sqrt(2 * u * (1 - u));
        return Math.abs(coverageFactor(1, p) - cauchy) <= 1e-7 * cauchy && Math.abs(coverageFactor(2, p) - two) <= 1e-7 * two;
      }),
    );
  });

  test('bad arguments are refused', () => {
    expect(errorCode(() => coverageFactor(0))).toBe('bad_argument');
    expect(errorCode(() => coverageFactor(Number.NaN))).toBe('bad_argument');
    expect(errorCode(() => coverageFactor(5, 1))).toBe('bad_argument');
  });
});

describe('welchSatterthwaite() and combineUncertainty()', () => {
  // Worked example (GUM G.4.1, Eq. G.2b; as in fixtures/uncertainty/README_uncertainty.md):
  // u1 = 0.25 % (ν 9), u2 = 0.57 % (ν 4), u3 = 0.82 % (ν 14), u_c = 1.03 % → ν_eff = 19.
  const contributions = [
    [0.25, 9],
    [0.57, 4],
    [0.82, 14],
  ] as const;

  test('with u_c rounded to 1.03 first, ν_eff = 19.03 → 19 as published', () => {
    const nuEff = welchSatterthwaite(1.03, contributions);
    expectRelative(nuEff, 19.03820157490929, 1e-12, 'ν_eff (scipy/numpy 2.4.6 recomputation)');
    expect(Math.floor(nuEff)).toBe(19); // published ν_eff = 19
  });

  test('with u_c unrounded (1.0295), ν_eff = 18.99 → 18 when truncated (rounding order matters)', () => {
    const components: UncertaintyComponent[] = contributions.map(([value, dof], i) => ({
      name: `u${i + 1}`,
      kind: 'A',
      distribution: 'normal',
      value,
      divisor: 1,
      sensitivity: 1,
      dof,
    }));
    const result = combineUncertainty(Object.freeze(components));
    expectRelative(result.uc, 1.0294658809304948, 1e-12, 'u_c');
    expect(Number(result.uc.toFixed(2))).toBe(1.03); // published u_c = 1.03 %
    expectRelative(result.nuEff, 18.998742314267954, 1e-12, 'ν_eff unrounded');
    // k = t_95.45(18) (GUM G.6.4 truncation) = 2.148849 (t_factors_computed.csv)
    expect(Math.abs(result.k - 2.148849)).toBeLessThan(1e-6);
    expect(result.U).toBe(roundUncertainty(result.k * result.uc));
    expect(result.U).toBe(2.2);
    expect(result.coverage).toBe(0.9545);
    expect(result.components[2]!.contribution).toBe(0.82);
  });

  test('all components with infinite ν: ν_eff = ∞ and k = 2', () => {
    const result = combineUncertainty([
      { name: 'a', kind: 'B', distribution: 'rectangular', value: Math.sqrt(3), divisor: DISTRIBUTION_DIVISORS.rectangular, sensitivity: 1, dof: null },
      { name: 'b', kind: 'B', distribution: 'normal', value: 2, divisor: 2, sensitivity: -1, dof: null },
    ]);
    expectRelative(result.uc, Math.SQRT2, 1e-15, 'u_c = √(1 + 1)');
    expect(result.nuEff).toBe(Number.POSITIVE_INFINITY);
    expect(result.k).toBe(2);
    expect(result.U).toBe(2.8);
  });

  test('ν_eff never exceeds the sum of the component ν_i (GUM G.2c) (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: 0.01, max: 100, noNaN: true }), fc.integer({ min: 1, max: 100 })), { minLength: 1, maxLength: 8 }),
        (pairs) => {
          const uc = Math.sqrt(pairs.reduce((sum, [u]) => sum + u * u, 0));
          const total = pairs.reduce((sum, [, nu]) => sum + nu, 0);
          return welchSatterthwaite(uc, pairs) <= total * (1 + 1e-12);
        },
      ),
    );
  });

  test('bad budgets are refused', () => {
    const line: UncertaintyComponent = { name: 'x', kind: 'B', distribution: 'normal', value: 1, divisor: 1, sensitivity: 1, dof: null };
    expect(errorCode(() => combineUncertainty([]))).toBe('too_few_points');
    expect(errorCode(() => combineUncertainty([{ ...line, divisor: 0 }]))).toBe('bad_argument');
    expect(errorCode(() => combineUncertainty([{ ...line, value: -1 }]))).toBe('bad_argument');
    expect(errorCode(() => combineUncertainty([{ ...line, dof: 0 }]))).toBe('bad_argument');
    expect(errorCode(() => combineUncertainty([{ ...line, value: 0 }]))).toBe('zero_uncertainty');
    expect(errorCode(() => combineUncertainty([{ ...line, value: Number.NaN }]))).toBe('not_finite');
  });
});

describe('roundUncertainty() and roundResultToUncertainty()', () => {
  test.each([
    [0.01234, 0.012],
    [1.25, 1.3],
    [0.0145, 0.015],
    [123456, 120000],
    [9.96, 10],
    [0.000995, 0.001],
    [2.149, 2.1],
    [35, 35],
  ])('U = %d rounds to %d (two significant digits, half away from zero)', (U, expected) => {
    expect(roundUncertainty(U)).toBe(expected);
  });
  test.each([
    [1_735_012.3456, 0.834, 1_735_012.35, 0.83, 2],
    [7_001_250.5, 1234, 7_001_300, 1200, -2],
    [-15_000.04, 0.26, -15_000.04, 0.26, 2],
    [0.123456, 0.000995, 0.1235, 0.001, 4],
  ])('x = %d, U = %d → %d ± %d (%d decimals)', (x, U, value, uncertainty, decimals) => {
    expect(roundResultToUncertainty(x, U)).toEqual({ value, uncertainty, decimals });
  });
  test('bad input', () => {
    expect(errorCode(() => roundUncertainty(0))).toBe('bad_argument');
    expect(errorCode(() => roundUncertainty(Number.NaN))).toBe('not_finite');
    expect(errorCode(() => roundResultToUncertainty(Number.POSITIVE_INFINITY, 1))).toBe('not_finite');
  });
});

describe('frequencyBudget()', () => {
  const input = {
    nominalHz: 7_000_000,
    measuredSamples: Object.freeze([7_000_012, 7_000_013, 7_000_011, 7_000_012]),
    standardAccuracyPpm: 0.1,
    counterResolutionHz: 1,
    dialHalfDivision: 0.5,
    dialSlopeHzPerDiv: 1000,
    driftHz: 2,
    standardCalUHz: 0.2,
    standardCalK: 2,
  };

  test('components follow PRODUCT §5.6 with the GUM divisors (closed form)', () => {
    const { components, notes } = frequencyBudget(input);
    expect(notes).toEqual([]);
    expect(components.map((c) => c.name)).toEqual([
      'Reference standard time-base accuracy',
      'Counter resolution (±1 count)',
      'Repeatability (s/√n)',
      'Dial reading resolution (half a division)',
      'Drift during the measurement',
      'Reference standard calibration (U/k)',
    ]);
    const combined = combineUncertainty(components);
    // Hand computation: time base 0.7 Hz/√3; ±1 count 1/√3; s = √(2/3) → s/√4; dial 500/√3; drift 2/√3; standard 0.1
    const s = Math.sqrt(2 / 3);
    const expectedUc = Math.sqrt(0.7 ** 2 / 3 + 1 / 3 + (s / 2) ** 2 + 500 ** 2 / 3 + 4 / 3 + 0.01);
    expectRelative(combined.uc, expectedUc, 1e-12, 'u_c');
    expect(components[2]!.dof).toBe(3);
    expect(components[2]!.kind).toBe('A');
  });

  test('a single reading leaves repeatability out and says so', () => {
    const { components, notes } = frequencyBudget({ ...input, measuredSamples: [7_000_012] });
    expect(components.some((c) => c.kind === 'A')).toBe(false);
    expect(notes).toEqual(['Repeatability not evaluated: one reading at this point']);
  });

  test('bad input', () => {
    expect(errorCode(() => frequencyBudget({ ...input, nominalHz: 0 }))).toBe('bad_frequency');
    expect(errorCode(() => frequencyBudget({ ...input, measuredSamples: [] }))).toBe('too_few_points');
    expect(errorCode(() => frequencyBudget({ ...input, standardCalK: 0 }))).toBe('bad_argument');
    expect(errorCode(() => frequencyBudget({ ...input, driftHz: -1 }))).toBe('bad_argument');
  });
});
