// Stability: NIST SP 1065 (Riley 2008) Table 30 on the NBS14 data; independent direct
// formulas; χ² intervals against scipy 1.17.1; invariants by fast-check.
import fc from 'fast-check';
import { detectGaps } from '../detect-gaps.js';
import { fractionalFrequency } from '../fractional-frequency.js';
import { modifiedAdev } from '../modified-adev.js';
import { overlappingAdev } from '../overlapping-adev.js';
import { greenhallEdf } from '../greenhall-edf.js';
import { adevEdf, chiSquaredInterval } from '../stability-confidence.js';
import { errorCode, expectRelative, readCsv, readFixture, seededGaussian } from './helpers.js';

const nbs14 = Object.freeze(
  readCsv('stability/nbs14.csv')
    .map((row) => row.frequency)
    .filter((value): value is string => value !== undefined && value !== '')
    .map(Number),
);
const published = JSON.parse(readFixture('stability/nbs14_results.json'));

// Frequency-domain form of the overlapping Allan variance, computed directly from averages
// (NIST SP 1065 Eq. 13): σ² = Σ_j (ȳ_{j+m} − ȳ_j)² / (2(M − 2m + 1)), ȳ_j = mean of y_j … y_{j+m−1}.
function directAdev(y: readonly number[], m: number): number {
  const M = y.length;
  const average = (start: number) => y.slice(start, start + m).reduce((a, b) => a + b, 0) / m;
  let sum = 0;
  for (let j = 0; j + 2 * m <= M; j++) sum += (average(j + m) - average(j)) ** 2;
  return Math.sqrt(sum / (2 * (M - 2 * m + 1)));
}

// Modified Allan variance by its triple sum on phase (SP 1065 Eq. 15), without running sums.
function directMdev(y: readonly number[], m: number): number {
  const x = [0];
  for (const value of y) x.push(x[x.length - 1]! + value);
  const N = x.length;
  let sum = 0;
  for (let j = 0; j <= N - 3 * m; j++) {
    let inner = 0;
    for (let i = j; i < j + m; i++) inner += x[i + 2 * m]! - 2 * x[i + m]! + x[i]!;
    sum += inner * inner;
  }
  return Math.sqrt(sum / (2 * m ** 4 * (N - 3 * m + 1)));
}

// Data values for the properties: multiples of 1e-6 in [−1, 1] (no subnormal values, whose
// squares underflow and are of no interest for frequency data).
const sample = fc.integer({ min: -1_000_000, max: 1_000_000 }).map((v) => v / 1_000_000);

describe('overlappingAdev()', () => {
  const result = overlappingAdev(nbs14, 1);
  test.each([0, 1])('NBS14 at m = %#: SP 1065 Table 30 overlapping ADEV within 1e-6', (index) => {
    // NIST SP 1065 Table 30 (NBS14): 91.22945, 85.95287
    expectRelative(result[index]!.deviation, published.results.adev_overlapping.values[index], 1e-6, `OADEV m = ${index + 1}`);
    expect(result[index]!.n).toBe(published.term_counts_recomputed.adev_overlapping[index]);
    expect(result[index]!.m).toBe(index + 1);
    expect(result[index]!.tau).toBe(index + 1);
  });

  test('NBS14 95 % χ² interval (white FM, SP 1065 Table 5 edf) matches scipy 1.17.1 chi2.ppf', () => {
    // scipy 1.17.1: dev*sqrt(edf/chi2.ppf(0.975, edf)), dev*sqrt(edf/chi2.ppf(0.025, edf)),
    // edf = (3(N−1)/(2m) − 2(N−2)/N)·4m²/(4m² + 5), N = 10, dev from SP 1065 Table 30
    const withCi = overlappingAdev(nbs14, 1, { confidence: 0.95 });
    expectRelative(withCi[0]!.edf, 5.288888888888889, 1e-12, 'edf m = 1');
    expectRelative(withCi[0]!.ciLow, 57.51660767479751, 1e-6, 'ciLow m = 1');
    expectRelative(withCi[0]!.ciHigh, 216.0413164235108, 1e-6, 'ciHigh m = 1');
    expectRelative(withCi[1]!.edf, 3.923809523809524, 1e-12, 'edf m = 2');
    expectRelative(withCi[1]!.ciLow, 51.3102893025805, 1e-6, 'ciLow m = 2');
    expectRelative(withCi[1]!.ciHigh, 250.786070041647, 1e-6, 'ciHigh m = 2');
  });

  test('equals the direct frequency-average formula on random data at every octave', () => {
    const gaussian = seededGaussian(7);
    const y = Array.from({ length: 300 }, () => 1e-9 * gaussian() + 5e-7);
    for (const row of overlappingAdev(y, 0.1)) {
      expectRelative(row.deviation, directAdev(y, row.m), 1e-9, `m = ${row.m}`);
      expectRelative(row.tau, 0.1 * row.m, 1e-15, 'tau');
    }
  });

  test('octaves run while at least one term is left', () => {
    expect(overlappingAdev(nbs14, 1).map((row) => row.m)).toEqual([1, 2, 4]);
    expect(overlappingAdev(nbs14, 1, { maxM: 2 }).map((row) => row.m)).toEqual([1, 2]);
  });

  test('ADEV of a constant is 0 and scales linearly with the input (property)', () => {
    fc.assert(
      fc.property(
        fc.array(sample, { minLength: 4, maxLength: 60 }),
        fc.double({ min: 1e-3, max: 1e3, noNaN: true }),
        fc.double({ min: -1e3, max: 1e3, noNaN: true }),
        (y, scale, offset) => {
          const constant = overlappingAdev(
            y.map(() => offset),
            1,
          ); // exactly 0, not merely small
          if (!constant.every((row) => row.deviation === 0 && row.ciLow === 0 && row.ciHigh === 0)) return false;
          const base = overlappingAdev(y, 1);
          const scaled = overlappingAdev(
            y.map((v) => v * scale + offset),
            1,
          );
          // Tolerance: 1e-9 relative, plus rounding of the inputs themselves (about 1e-12 of their size).
          const inputSize = scale * Math.max(...y.map(Math.abs)) + Math.abs(offset);
          return base.every((row, i) => Math.abs(scaled[i]!.deviation - scale * row.deviation) <= 1e-9 * scale * row.deviation + 1e-12 * inputSize);
        },
      ),
      { numRuns: 200 },
    );
  });

  test('interval brackets the estimate', () => {
    for (const noise of ['white_pm', 'flicker_pm', 'white_fm', 'flicker_fm', 'random_walk_fm'] as const) {
      for (const row of overlappingAdev(nbs14, 1, { noise })) {
        expect(row.ciLow).toBeLessThanOrEqual(row.deviation);
        expect(row.ciHigh).toBeGreaterThanOrEqual(row.deviation);
        expect(row.edf).toBeGreaterThanOrEqual(1);
      }
    }
  });

  test('bad input gives typed errors', () => {
    expect(errorCode(() => overlappingAdev([1], 1))).toBe('too_few_points');
    expect(errorCode(() => overlappingAdev([1, Number.NaN], 1))).toBe('not_finite');
    expect(errorCode(() => overlappingAdev([1, 2, 3], 0))).toBe('bad_argument');
    expect(errorCode(() => overlappingAdev([1, 2, 3], 1, { confidence: 1 }))).toBe('bad_argument');
  });
});

describe('modifiedAdev()', () => {
  const result = modifiedAdev(nbs14, 1);
  test.each([0, 1])('NBS14 at m = %#: SP 1065 Table 30 MDEV within 1e-6', (index) => {
    // NIST SP 1065 Table 30 (NBS14): 91.22945, 74.78849
    expectRelative(result[index]!.deviation, published.results.mdev.values[index], 1e-6, `MDEV m = ${index + 1}`);
    expect(result[index]!.n).toBe(published.term_counts_recomputed.mdev[index]);
  });

  test('running sums equal the direct triple sum on random data at every octave', () => {
    const gaussian = seededGaussian(11);
    const y = Array.from({ length: 400 }, (_, i) => gaussian() + 0.01 * i);
    for (const row of modifiedAdev(y, 1)) {
      expectRelative(row.deviation, directMdev(y, row.m), 1e-9, `m = ${row.m}`);
    }
  });

  test('MDEV of a constant is 0 and scales linearly (property)', () => {
    fc.assert(
      fc.property(fc.array(sample, { minLength: 6, maxLength: 60 }), fc.double({ min: 1e-3, max: 1e3, noNaN: true }), (y, scale) => {
        if (
          !modifiedAdev(
            y.map(() => 3),
            1,
          ).every((row) => row.deviation === 0)
        )
          return false;
        const base = modifiedAdev(y, 1);
        const scaled = modifiedAdev(
          y.map((v) => v * scale),
          1,
        );
        // 1e-9 relative, plus rounding of the sums relative to the size of the data (about 1e-12).
        const inputSize = scale * Math.max(...y.map(Math.abs));
        return base.every((row, i) => Math.abs(scaled[i]!.deviation - scale * row.deviation) <= 1e-9 * scale * row.deviation + 1e-12 * inputSize);
      }),
    );
  });

  test('white FM noise: ADEV at m = 16 brackets σ/√16 (σ²_y(τ) ∝ 1/τ), and MDEV equals ADEV at m = 1 (SP 1065 §5.2.5)', () => {
    const gaussian = seededGaussian(3);
    const y = Array.from({ length: 65_536 }, () => gaussian());
    const adev = overlappingAdev(y, 1);
    // For white FM, ADEV(mτ0) = σ/√m: the true value 1/4 must lie in the 95 % interval at m = 16
    const row = overlappingAdev(y, 1, { confidence: 0.95 })[4]!;
    expect(row.m).toBe(16);
    expect(row.ciLow).toBeLessThan(1 / Math.sqrt(16));
    expect(row.ciHigh).toBeGreaterThan(1 / Math.sqrt(16));
    expect(modifiedAdev(y, 1)[0]!.deviation).toBeCloseTo(adev[0]!.deviation, 12);
  });
});

describe('adevEdf() and chiSquaredInterval()', () => {
  test('white FM edf at N = 10, m = 1 by SP 1065 Table 5: (13.5 − 1.6)·4/9', () => {
    expectRelative(adevEdf(10, 1, 'white_fm'), (13.5 - 1.6) * (4 / 9), 1e-14, 'edf');
  });
  test('flicker FM edf at m = 1 by SP 1065 Table 5, 2(N − 2)²/(2.3N − 4.9), within 5 % of the Greenhall–Riley algorithm', () => {
    // Closed form at N = 10: 2·64/(23 − 4.9) = 128/18.1. The Greenhall–Riley (2004) edf is an independent algorithm
    // (greenhall-edf.ts, checked against exact Gaussian edf elsewhere); Table 5's approximation lies within a few per cent of it.
    expectRelative(adevEdf(10, 1, 'flicker_fm'), 128 / 18.1, 1e-14, 'edf');
    for (const N of [10, 100, 1001]) {
      const exact = greenhallEdf({ d: 2, m: 1, phasePoints: N, overlapping: true, modified: false, noise: 'flicker_fm' });
      expectRelative(adevEdf(N, 1, 'flicker_fm'), exact, 0.05, `edf at N = ${N}`);
    }
  });
  test('χ² quantiles from jstat match scipy 1.17.1 chi2.ppf(0.975/0.025, 5.288888…)', () => {
    // scipy 1.17.1: chi2.ppf(0.975, 5.288888888888889) = 13.306015639461146, chi2.ppf(0.025, …) = 0.9431069094707405
    const [low, high] = chiSquaredInterval(1, 5.288888888888889, 0.95);
    expectRelative(low, Math.sqrt(5.288888888888889 / 13.306015639461146), 1e-7, 'low');
    expectRelative(high, Math.sqrt(5.288888888888889 / 0.9431069094707405), 1e-7, 'high');
  });
  test('bad arguments are refused', () => {
    expect(errorCode(() => adevEdf(10, 5, 'white_fm'))).toBe('bad_argument');
    expect(errorCode(() => adevEdf(10, 1, 'pink' as never))).toBe('bad_argument');
    expect(errorCode(() => chiSquaredInterval(1, 0, 0.95))).toBe('bad_argument');
  });
});

describe('fractionalFrequency()', () => {
  test('y = (f − f_ref)/f_ref', () => {
    const y = fractionalFrequency(Object.freeze([7_000_007, 6_999_993]), 7e6);
    expectRelative(y[0]!, 1e-6, 1e-9, 'y0');
    expectRelative(y[1]!, -1e-6, 1e-9, 'y1');
  });
  test('bad input', () => {
    expect(errorCode(() => fractionalFrequency([], 7e6))).toBe('too_few_points');
    expect(errorCode(() => fractionalFrequency([1], 0))).toBe('bad_frequency');
    expect(errorCode(() => fractionalFrequency([Number.POSITIVE_INFINITY], 1))).toBe('not_finite');
  });
});

describe('detectGaps()', () => {
  test('a clean series has no gaps', () => {
    expect(detectGaps([0, 1, 2, 3, 4], 1)).toEqual({ gaps: [], irregular: false, medianInterval: 1 });
  });
  test('a missing run of readings is reported with its count', () => {
    const report = detectGaps(Object.freeze([0, 1, 2, 5, 6, 7]), 1);
    expect(report.gaps).toEqual([{ index: 3, tStart: 2, tEnd: 5, missing: 2 }]);
    expect(report.irregular).toBe(false);
  });
  test('jittered or repeated time stamps are irregular', () => {
    expect(detectGaps([0, 1, 2.4, 3.4, 4.4], 1).irregular).toBe(true);
    expect(detectGaps([0, 1, 1, 2, 3], 1).irregular).toBe(true);
    expect(detectGaps([0, 2, 4, 6], 1).irregular).toBe(true);
  });
  test('bad input', () => {
    expect(errorCode(() => detectGaps([0], 1))).toBe('too_few_points');
    expect(errorCode(() => detectGaps([0, 1], -1))).toBe('bad_argument');
  });
});
