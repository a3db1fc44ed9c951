// fitLine against NIST StRD "Norris" (certified values, 15 digits) and simple-statistics 7.12.
import { linearRegression } from 'simple-statistics';
import fc from 'fast-check';
import { fitLine } from '../fit-line.js';
import { errorCode, expectRelative, readCsv, readFixture } from './helpers.js';

const norris = readCsv('regression/Norris.csv').map((row) => ({ x: Number(row.x), y: Number(row.y) }));
const norrisFile = JSON.parse(readFixture('regression/Norris_certified.json'));
const certified = norrisFile.certified;

describe('fitLine()', () => {
  const x = Object.freeze(norris.map((p) => p.x));
  const y = Object.freeze(norris.map((p) => p.y));
  const fit = fitLine(x, y);

  test.each([
    ['intercept', () => fit.intercept, certified.B0.estimate], // NIST StRD Norris, certified B0
    ['slope', () => fit.slope, certified.B1.estimate], // NIST StRD Norris, certified B1
    ['seIntercept', () => fit.seIntercept, certified.B0.std_dev], // NIST StRD Norris, certified sd(B0)
    ['seSlope', () => fit.seSlope, certified.B1.std_dev], // NIST StRD Norris, certified sd(B1)
    ['residualSd', () => fit.residualSd, certified.residual_std_dev], // NIST StRD Norris, residual SD
    ['r2', () => fit.r2, certified.r_squared], // NIST StRD Norris, R²
    ['ssr', () => fit.ssr, certified.anova.residual.sum_of_squares], // NIST StRD Norris, residual SS
  ])('Norris %s within 1e-9 of the certified value', (label, actual, expected) => {
    expectRelative(actual(), expected, 1e-9, `Norris ${label}`);
  });

  test('Norris: number of observations as in the StRD file', () => {
    expect(fit.n).toBe(norrisFile.n_observations);
  });

  test('agrees with simple-statistics linearRegression on Norris (independent implementation)', () => {
    const reference = linearRegression(norris.map((p) => [p.x, p.y]));
    expectRelative(fit.slope, reference.m, 1e-9, 'slope vs simple-statistics');
    expectRelative(fit.intercept, reference.b, 1e-7, 'intercept vs simple-statistics');
  });

  test('Norris shifted by 1e6 in x keeps the slope to 1e-9 (centred sums)', () => {
    const shifted = fitLine(
      x.map((v) => v + 1e6),
      y,
    );
    expectRelative(shifted.slope, certified.B1.estimate, 1e-9, 'slope on shifted Norris');
  });

  test('an exact line is recovered with zero residual (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e3, max: 1e3, noNaN: true }),
        fc.double({ min: -1e3, max: 1e3, noNaN: true }),
        fc.integer({ min: 3, max: 50 }),
        (intercept, slope, n) => {
          const xs = Array.from({ length: n }, (_, i) => i * 0.5 - 3);
          const result = fitLine(
            xs,
            xs.map((v) => intercept + slope * v),
          );
          return Math.abs(result.slope - slope) <= 1e-9 * (1 + Math.abs(slope)) && result.residualSd <= 1e-9 * (1 + Math.abs(intercept) + Math.abs(slope));
        },
      ),
    );
  });

  test('bad input gives typed errors', () => {
    expect(errorCode(() => fitLine([1, 2], [1, 2]))).toBe('too_few_points');
    expect(errorCode(() => fitLine([1, 2, 3], [1, 2]))).toBe('length_mismatch');
    expect(errorCode(() => fitLine([1, 2, Number.NaN], [1, 2, 3]))).toBe('not_finite');
    expect(errorCode(() => fitLine([2, 2, 2], [1, 2, 3]))).toBe('no_spread');
    expect(() => fitLine([1, 2], [1, 2])).toThrow('fitLine requires at least 3 data points');
  });

  test('a flat response has R² = 1 and zero standard errors', () => {
    const flat = fitLine([1, 2, 3, 4], [5, 5, 5, 5]);
    expect(flat.slope).toBe(0);
    expect(flat.r2).toBe(1);
    expect(flat.seSlope).toBe(0);
  });
});
