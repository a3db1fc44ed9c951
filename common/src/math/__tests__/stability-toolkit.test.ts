// The stability toolkit of issue 19: Hadamard, time and total deviations, conversions, drift,
// noise identification, degrees of freedom, gaps and the MAD screen. Expected values come from
// NIST SP 1065 (Riley 2008) Tables 30–31 (fixtures/stability), closed forms derived in the test,
// and hand examples; none is computed by the code under test.
import { bisectionDrift } from '../bisection-drift.js';
import { decades } from '../decades.js';
import { detectGaps } from '../detect-gaps.js';
import { fillPhaseGaps } from '../fill-phase-gaps.js';
import { frequencyFromPhase } from '../frequency-from-phase.js';
import { greenhallEdf } from '../greenhall-edf.js';
import { hadamardDev } from '../hadamard-dev.js';
import { identifyNoise } from '../identify-noise.js';
import { linearFrequencyDrift } from '../linear-frequency-drift.js';
import { longestContinuousSegment } from '../longest-continuous-segment.js';
import { madOutliers } from '../mad-outliers.js';
import { modifiedAdev } from '../modified-adev.js';
import { overlappingAdev } from '../overlapping-adev.js';
import { phaseFromFractionalFrequency } from '../phase-from-fractional-frequency.js';
import { adevEdf, type NoiseType } from '../stability-confidence.js';
import { threePointDrift } from '../three-point-drift.js';
import { timeDev } from '../time-dev.js';
import { totalDevEdf } from '../total-dev-edf.js';
import { totalDev } from '../total-dev.js';
import { errorCode, expectPrintedDigits, expectRelative, readCsv, readFixture, seededGaussian, sp1065TestSuite } from './helpers.js';

const nbs14 = readCsv('stability/nbs14.csv')
  .map((row) => row.frequency)
  .filter((value): value is string => value !== undefined && value !== '')
  .map(Number);
const nbs14Phase = phaseFromFractionalFrequency(nbs14, 1);
const table30 = JSON.parse(readFixture('stability/nbs14_results.json'));
const table31 = JSON.parse(readFixture('stability/sp1065_1000point_results.json'));
const suitePhase = phaseFromFractionalFrequency(sp1065TestSuite(), 1);
const printed30 = (values: number[], index: number) => String(values[index]);

describe('NBS14 (SP 1065 Table 30), m = 1, 2', () => {
  test.each([0, 1])('overlapping Hadamard deviation at m = %#+1: 70.80607, 85.61487, with 7 and 4 terms', (index) => {
    const point = hadamardDev(nbs14Phase, 1)[index]!;
    expectPrintedDigits(point.deviation, printed30(table30.results.hdev_overlapping.values, index), 'OHDEV');
    expect(point.terms).toBe(table30.term_counts_recomputed.hdev_overlapping[index]);
    expect(point.m).toBe(index + 1);
  });
  test('normal Hadamard deviation: 70.80607, 116.7980, with 7 and 2 terms', () => {
    const points = hadamardDev(nbs14Phase, 1, { overlapping: false });
    expectPrintedDigits(points[0]!.deviation, '70.80607', 'HDEV m = 1');
    expectPrintedDigits(points[1]!.deviation, '116.7980', 'HDEV m = 2');
    expect(points.map((p) => p.terms)).toEqual(table30.term_counts_recomputed.hdev_normal);
  });
  test.each([0, 1])('time deviation at m = %#+1: 52.67135, 86.35831', (index) => {
    const point = timeDev(nbs14Phase, 1)[index]!;
    expectPrintedDigits(point.deviation, printed30(table30.results.tdev.values, index), 'TDEV');
    expect(point.terms).toBe(table30.term_counts_recomputed.mdev[index]);
  });
  test('total deviation 91.22945, 93.90379 with 8 terms each — RECOMPUTED digits (the fixture says the TOTDEV row was not read from the publication)', () => {
    const points = totalDev(nbs14Phase, 1);
    expectPrintedDigits(points[0]!.deviation, printed30(table30.results.totdev.values, 0), 'TOTDEV m = 1');
    expectPrintedDigits(points[1]!.deviation, printed30(table30.results.totdev.values, 1), 'TOTDEV m = 2');
    expect(points.slice(0, 2).map((p) => p.terms)).toEqual(table30.term_counts_recomputed.totdev);
  });
  test('TDEV = τ/√3 · MDEV against the existing modifiedAdev (SP 1065 definition)', () => {
    const mdev = modifiedAdev(nbs14, 1);
    timeDev(nbs14Phase, 1).forEach((point, i) => expectRelative(point.deviation, (point.tau / Math.sqrt(3)) * mdev[i]!.deviation, 1e-12, `m = ${point.m}`));
  });
});

describe('SP 1065 1000-point suite (§12.4, Table 31 as transcribed; see the fixture), τ = 1, 10, 100 s', () => {
  const factors = [1, 10, 100];
  test('overlapping Hadamard deviation', () => {
    hadamardDev(suitePhase, 1, { factors }).forEach((p, i) => expectPrintedDigits(p.deviation, table31.results.hdev_overlapping[i], `OHDEV τ = ${p.tau}`));
  });
  test('time deviation', () => {
    timeDev(suitePhase, 1, { factors }).forEach((p, i) => expectPrintedDigits(p.deviation, table31.results.tdev[i], `TDEV τ = ${p.tau}`));
  });
  test('total deviation', () => {
    totalDev(suitePhase, 1, { factors }).forEach((p, i) => expectPrintedDigits(p.deviation, table31.results.totdev[i], `TOTDEV τ = ${p.tau}`));
  });
  test('overlapping ADEV and MDEV at the same factors (factors option of the existing functions)', () => {
    const y = sp1065TestSuite();
    overlappingAdev(y, 1, { factors }).forEach((p, i) => expectPrintedDigits(p.deviation, table31.results.adev_overlapping[i], `OADEV τ = ${p.tau}`));
    modifiedAdev(y, 1, { factors }).forEach((p, i) => expectPrintedDigits(p.deviation, table31.results.mdev[i], `MDEV τ = ${p.tau}`));
  });
});

describe('closed forms', () => {
  test('pure linear frequency drift: Hadamard deviation 0 (to rounding) while ADEV = D·τ/√2 (SP 1065)', () => {
    const D = 1e-12; // per second
    const tau0 = 10;
    const y = Array.from({ length: 2000 }, (_, i) => 5e-8 + D * i * tau0);
    for (const point of overlappingAdev(y, tau0)) expectRelative(point.deviation, (D * point.tau) / Math.SQRT2, 1e-6, `ADEV m = ${point.m}`);
    for (const point of hadamardDev(phaseFromFractionalFrequency(y, tau0), tau0)) expect(point.deviation).toBeLessThan(1e-6 * D * point.tau);
  });

  test('white PM of variance σ²: TDEV(mτ0) = σ/√m and ADEV = √3·σ/τ (expectations derived from the definitions)', () => {
    const sigma = 1e-9;
    const gaussian = seededGaussian(2024);
    const x = Float64Array.from({ length: 1 << 17 }, () => sigma * gaussian());
    const adev = overlappingAdev(frequencyFromPhase(x, 1), 1);
    for (const point of timeDev(x, 1, { factors: [1, 4, 16] })) expectRelative(point.deviation, sigma / Math.sqrt(point.m), 0.03, `TDEV m = ${point.m}`);
    for (const point of adev.slice(0, 5)) expectRelative(point.deviation, (Math.sqrt(3) * sigma) / point.tau, 0.03, `ADEV m = ${point.m}`);
  });

  test('a frequency offset (linear phase) changes no deviation', () => {
    const gaussian = seededGaussian(5);
    const x = Array.from({ length: 500 }, () => gaussian());
    const shifted = x.map((value, i) => value + 3 + 0.25 * i);
    for (const fn of [hadamardDev, timeDev, totalDev]) {
      const base = fn(x, 1);
      fn(shifted, 1).forEach((point, i) => expectRelative(point.deviation, base[i]!.deviation, 1e-9, `${fn.name} m = ${point.m}`));
    }
  });

  test('total deviation at m = 1 equals the overlapping ADEV at m = 1 (no reflected point is reached)', () => {
    const gaussian = seededGaussian(8);
    const y = Array.from({ length: 300 }, () => gaussian());
    expectRelative(totalDev(phaseFromFractionalFrequency(y, 1), 1)[0]!.deviation, overlappingAdev(y, 1)[0]!.deviation, 1e-12, 'm = 1');
  });
});

describe('averaging factors and bad input', () => {
  test('decades are 1-2-5 steps', () => {
    expect(decades(60)).toEqual([1, 2, 5, 10, 20, 50]);
    expect(decades(0.5)).toEqual([]);
  });
  test('octaves by default, as far as each estimator allows', () => {
    expect(hadamardDev(nbs14Phase, 1).map((p) => p.m)).toEqual([1, 2]);
    expect(timeDev(nbs14Phase, 1).map((p) => p.m)).toEqual([1, 2]);
    expect(totalDev(nbs14Phase, 1).map((p) => p.m)).toEqual([1, 2, 4]);
  });
  test('typed errors', () => {
    expect(errorCode(() => hadamardDev(nbs14Phase, 1, { factors: [4] }))).toBe('too_short');
    expect(errorCode(() => totalDev(nbs14Phase, 1, { factors: [1.5] }))).toBe('bad_argument');
    expect(errorCode(() => timeDev([1, 2], 1))).toBe('too_few_points');
    expect(errorCode(() => timeDev([1, 2, Number.NaN], 1))).toBe('not_finite');
    expect(errorCode(() => totalDev(nbs14Phase, 0))).toBe('bad_argument');
    expect(errorCode(() => hadamardDev(nbs14Phase, 1, { confidence: 1 }))).toBe('bad_argument');
    expect(errorCode(() => overlappingAdev(nbs14, 1, { factors: [5] }))).toBe('too_short');
  });
  test('intervals bracket the estimate for every noise type', () => {
    for (const noise of ['white_pm', 'flicker_pm', 'white_fm', 'flicker_fm', 'random_walk_fm'] as const) {
      for (const point of [
        ...hadamardDev(suitePhase, 1, { noise }),
        ...timeDev(suitePhase, 1, { noise }),
        ...totalDev(suitePhase, 1, { noise: () => noise }),
      ]) {
        expect(point.ciLow).toBeLessThanOrEqual(point.deviation);
        expect(point.ciHigh).toBeGreaterThanOrEqual(point.deviation);
        expect(point.edf).toBeGreaterThanOrEqual(1);
        expect(point.noise).toBe(noise);
      }
    }
  });
});

describe('conversions (SP 1065: x by cumulative sum × τ0, y by first differences / τ0)', () => {
  test('hand example and round trip', () => {
    expect(Array.from(phaseFromFractionalFrequency([1, 3, -2], 2))).toEqual([0, 2, 8, 4]);
    expect(Array.from(frequencyFromPhase([0, 2, 8, 4], 2))).toEqual([1, 3, -2]);
    const gaussian = seededGaussian(1);
    const y = Array.from({ length: 1000 }, () => 1e-9 * gaussian());
    frequencyFromPhase(phaseFromFractionalFrequency(y, 0.1), 0.1).forEach((value, i) => expect(Math.abs(value - y[i]!)).toBeLessThan(1e-20));
  });
  test('bad input', () => {
    expect(errorCode(() => phaseFromFractionalFrequency([], 1))).toBe('too_few_points');
    expect(errorCode(() => frequencyFromPhase([1], 1))).toBe('too_few_points');
    expect(errorCode(() => frequencyFromPhase([1, 2], -1))).toBe('bad_argument');
  });
});

describe('frequency drift', () => {
  // x(t) = a + b·t + D·t²/2 has frequency b + D·t: every estimator must return D.
  const D = 3e-11;
  const quadratic = (n: number, tau0: number) => Array.from({ length: n }, (_, i) => 1e-6 + 2e-9 * i * tau0 + (D * (i * tau0) ** 2) / 2);
  test.each([11, 12])('three-point and bisection recover the drift of an exact quadratic phase (%i points)', (n) => {
    expectRelative(threePointDrift(quadratic(n, 5), 5).drift, D, 1e-6, 'three-point');
    expectRelative(bisectionDrift(quadratic(n, 5), 5).drift, D, 1e-6, 'bisection');
    expect(threePointDrift(quadratic(n, 5), 5).standardError).toBeNull();
  });
  test('least-squares line on frequency: exact line has drift D and standard error 0', () => {
    const fit = linearFrequencyDrift(
      Array.from({ length: 50 }, (_, i) => 1e-9 + D * i * 2),
      2,
    );
    expectRelative(fit.drift, D, 1e-9, 'drift');
    expect(fit.standardError!).toBeLessThan(1e-9 * D);
  });
  test('white FM about a drift: the drift lies within 4 standard errors for both estimators with one', () => {
    const gaussian = seededGaussian(31);
    const y = Array.from({ length: 4000 }, (_, i) => D * i + 1e-9 * gaussian());
    const line = linearFrequencyDrift(y, 1);
    const bisection = bisectionDrift(phaseFromFractionalFrequency(y, 1), 1);
    expect(Math.abs(line.drift - D)).toBeLessThan(4 * line.standardError!);
    expect(Math.abs(bisection.drift - D)).toBeLessThan(4 * bisection.standardError!);
  });
  test('bad input', () => {
    expect(errorCode(() => threePointDrift([1, 2], 1))).toBe('too_few_points');
    expect(errorCode(() => bisectionDrift([1, 2, 3], 0))).toBe('bad_argument');
    expect(errorCode(() => linearFrequencyDrift([1, Number.NaN, 3], 1))).toBe('not_finite');
  });
});

// Seeded power-law noise. White PM: white phase; white FM: white frequency; random-walk FM: running
// sum of white frequency. Flicker: white noise through the Kasdin–Walter filter for 1/f
// (N. J. Kasdin and T. Walter, "Discrete simulation of power law noise", Proc. 1992 IEEE FCS):
// h_0 = 1, h_k = h_{k−1}(k − 1 + 1/2)/k, convolved directly (O(N²), fine for 4096 points).
function flicker(n: number, seed: number): Float64Array {
  const gaussian = seededGaussian(seed);
  const w = Float64Array.from({ length: n }, () => gaussian());
  const h = new Float64Array(n);
  h[0] = 1;
  for (let k = 1; k < n; k++) h[k] = (h[k - 1]! * (k - 0.5)) / k;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let sum = 0;
    for (let k = 0; k <= i; k++) sum += h[k]! * w[i - k]!;
    out[i] = sum;
  }
  return out;
}
function runningSum(values: ArrayLike<number>): Float64Array {
  const out = new Float64Array(values.length + 1);
  for (let i = 0; i < values.length; i++) out[i + 1] = out[i]! + values[i]!;
  return out;
}
function simulatedPhase(noise: NoiseType, n: number, seed: number): Float64Array {
  const gaussian = seededGaussian(seed);
  const white = () => Float64Array.from({ length: n }, () => gaussian());
  switch (noise) {
    case 'white_pm':
      return white();
    case 'flicker_pm':
      return flicker(n, seed);
    case 'white_fm':
      return runningSum(white());
    case 'flicker_fm':
      return runningSum(flicker(n, seed));
    default:
      return runningSum(runningSum(white()));
  }
}

describe('identifyNoise() (lag-1 autocorrelation, B1 fallback)', () => {
  const types = ['white_pm', 'flicker_pm', 'white_fm', 'flicker_fm', 'random_walk_fm'] as const;
  test.each(types)('%s: named correctly at m = 1 and m = 4 on 4096 simulated points, three seeds', (noise) => {
    for (const seed of [1, 2, 3]) {
      const x = simulatedPhase(noise, 4096, seed);
      for (const m of [1, 4]) {
        const result = identifyNoise(x, m);
        expect(result.status === 'identified' && result.method === 'lag1_acf' && result.noise).toBe(noise);
      }
    }
  });
  test.each(['white_pm', 'white_fm', 'random_walk_fm'] as const)(
    'few points (29 after decimation): the B1 ratio is used, says so, and names %s in at least 14 of 20 seeds (B1 on 28 averages is noisy)',
    (noise) => {
      let right = 0;
      for (let seed = 1; seed <= 20; seed++) {
        const result = identifyNoise(simulatedPhase(noise, 2800, seed), 100);
        expect(result.status === 'identified' && result.method).toBe('b1_ratio');
        if (result.status === 'identified' && result.noise === noise) right++;
        if (result.status === 'identified' && result.method === 'b1_ratio' && result.noise === 'white_pm') expect(result.alternatives).toEqual(['flicker_pm']);
      }
      expect(right).toBeGreaterThanOrEqual(14);
    },
  );
  test('too short to identify', () => {
    expect(identifyNoise([0, 1, 3, 2, 5, 4, 7], 3)).toMatchObject({ status: 'too_short', points: 3 });
    expect(errorCode(() => identifyNoise([0, 1, 2], 0))).toBe('bad_argument');
    expect(errorCode(() => identifyNoise([0], 1))).toBe('too_few_points');
  });
});

// Exact edf of Σ z_i² for Gaussian z_i = Σ_k c_k w_{i+k}, w white of unit variance, M summands at
// stride 1 (Isserlis: Var(Σ z²) = 2 Σ_i Σ_j cov(z_i, z_j)²): edf = (M γ0)² / (M γ0² + 2 Σ_ℓ (M − ℓ) γ_ℓ²).
function exactEdf(coefficients: number[], M: number): number {
  const L = coefficients.length;
  const gamma = (lag: number) => {
    let sum = 0;
    for (let k = 0; k + lag < L; k++) sum += coefficients[k]! * coefficients[k + lag]!;
    return sum;
  };
  const g0 = gamma(0);
  let denominator = M * g0 * g0;
  for (let lag = 1; lag < Math.min(L, M); lag++) denominator += 2 * (M - lag) * gamma(lag) ** 2;
  return (M * g0) ** 2 / denominator;
}
// Filters as coefficients on white phase (white PM) or on white frequency (white FM).
const blocks = (m: number, weights: number[]) => weights.flatMap((w) => Array<number>(m).fill(w));
const spikes = (m: number, weights: number[]) => weights.flatMap((w, i) => (i === weights.length - 1 ? [w] : [w, ...Array<number>(m - 1).fill(0)]));
function movingSum(c: number[], m: number): number[] {
  return Array.from({ length: c.length + m - 1 }, (_, i) => c.slice(Math.max(0, i - m + 1), i + 1).reduce((a, b) => a + b, 0));
}

describe('greenhallEdf() against exact Gaussian edf (Isserlis) where the phase model is exact', () => {
  const N = 1001;
  test.each([1, 3, 10, 50])('white PM, overlapping ADEV (d = 2) and Hadamard (d = 3), m = %i', (m) => {
    expectRelative(
      greenhallEdf({ d: 2, m, phasePoints: N, overlapping: true, modified: false, noise: 'white_pm' }),
      exactEdf(spikes(m, [1, -2, 1]), N - 2 * m),
      1e-9,
      'ADEV',
    );
    expectRelative(
      greenhallEdf({ d: 3, m, phasePoints: N, overlapping: true, modified: false, noise: 'white_pm' }),
      exactEdf(spikes(m, [-1, 3, -3, 1]), N - 3 * m),
      1e-9,
      'HDEV',
    );
  });
  test.each([1, 3, 10, 50])('white PM, modified Allan / time variance (d = 2, modified), m = %i', (m) => {
    expectRelative(
      greenhallEdf({ d: 2, m, phasePoints: N, overlapping: true, modified: true, noise: 'white_pm' }),
      exactEdf(movingSum(spikes(m, [1, -2, 1]), m), N - 3 * m + 1),
      1e-9,
      'MDEV',
    );
  });
  test.each([40, 128, 2048])('white FM, overlapping Hadamard at m = %i (point-sampled phase model; 2048 takes the 4096-lag trapezoid)', (m) => {
    const points = 3 * m + 2000;
    expectRelative(
      greenhallEdf({ d: 3, m, phasePoints: points, overlapping: true, modified: false, noise: 'white_fm' }),
      exactEdf(blocks(m, [1, -2, 1]), points - 3 * m),
      5e-3,
      'HDEV',
    );
  });
  test('white PM Hadamard at N = 10, m = 1 by hand: 7²/(7 + 2(6·15² + 5·6² + 4·1²)/20²)', () => {
    expectRelative(
      greenhallEdf({ d: 3, m: 1, phasePoints: 10, overlapping: true, modified: false, noise: 'white_pm' }),
      49 / (7 + (2 * (6 * 225 + 5 * 36 + 4)) / 400),
      1e-12,
      'edf',
    );
  });
  test('bad arguments', () => {
    expect(errorCode(() => greenhallEdf({ d: 2, m: 0, phasePoints: 10, overlapping: true, modified: false, noise: 'white_fm' }))).toBe('bad_argument');
    expect(errorCode(() => greenhallEdf({ d: 3, m: 4, phasePoints: 10, overlapping: true, modified: false, noise: 'white_fm' }))).toBe('too_short');
  });
});

describe('totalDevEdf() and adevEdf()', () => {
  test('SP 1065 Table 7 b·(T/τ) − c with T/τ = (N − 1)/m', () => {
    expect(totalDevEdf(1001, 10, 'white_fm')).toBeCloseTo(1.5 * 100, 12);
    expect(totalDevEdf(1001, 10, 'flicker_fm')).toBeCloseTo(1.17 * 100 - 0.22, 12);
    expect(totalDevEdf(1001, 10, 'random_walk_fm')).toBeCloseTo(0.93 * 100 - 0.36, 12);
    expect(totalDevEdf(1001, 10, 'white_pm')).toBe(adevEdf(1001, 10, 'white_pm'));
    expect(errorCode(() => totalDevEdf(10, 5, 'white_fm'))).toBe('bad_argument');
  });
  test('adevEdf(10, 1, white FM) is 5.289, not 5.64', () => {
    const N = 10;
    const m = 1;
    const byHand = ((3 * (N - 1)) / (2 * m) - (2 * (N - 2)) / N) * ((4 * m * m) / (4 * m * m + 5));
    expect(byHand.toFixed(3)).toBe('5.289');
    expect(adevEdf(N, m, 'white_fm')).toBeCloseTo(byHand, 12);
  });
});

describe('gaps', () => {
  test('longest continuous segment between NaN and reported gaps', () => {
    expect(longestContinuousSegment([1, 2, Number.NaN, 4, 5, 6, Number.NaN, 8])).toMatchObject({ start: 3, end: 6, leftOut: 3 });
    expect(Array.from(longestContinuousSegment([1, 2, Number.NaN, 4, 5, 6]).values)).toEqual([4, 5, 6]);
    const t = [0, 1, 2, 3, 4, 8, 9];
    const report = detectGaps(t, 1); // gap before index 5
    expect(longestContinuousSegment([10, 11, 12, 13, 14, 15, 16], report.gaps)).toMatchObject({ start: 0, end: 5, leftOut: 2 });
    expect(errorCode(() => longestContinuousSegment([Number.NaN, Number.NaN]))).toBe('too_few_points');
  });
  test('phase gaps filled by straight lines, with the count', () => {
    const filled = fillPhaseGaps({ kind: 'phase', values: [0, 1, Number.NaN, Number.NaN, 7, 8] });
    expect(Array.from(filled.values)).toEqual([0, 1, 3, 5, 7, 8]);
    expect(filled.filled).toBe(2);
    const fromReport = fillPhaseGaps({ kind: 'phase', values: [0, 1, 2, 6], gaps: detectGaps([0, 1, 2, 6], 1).gaps });
    expect(Array.from(fromReport.values)).toEqual([0, 1, 2, 3, 4, 5, 6]);
    expect(fromReport.filled).toBe(3);
  });
  test('frequency data and gaps at the ends are refused', () => {
    expect(errorCode(() => fillPhaseGaps({ kind: 'frequency', values: [1, Number.NaN, 3] }))).toBe('phase_only');
    expect(errorCode(() => fillPhaseGaps({ kind: 'phase', values: [Number.NaN, 1, 2] }))).toBe('gap_at_end');
    expect(errorCode(() => fillPhaseGaps({ kind: 'phase', values: [0, 1, Number.POSITIVE_INFINITY] }))).toBe('not_finite');
  });
});

describe('madOutliers()', () => {
  test('hand example: median 10, MAD 0.5, threshold 5 × 1.4826 × 0.5 = 3.7065; 50 and 13.8 flagged, 6.3 not; data untouched', () => {
    const values = Object.freeze([10, 10.5, 9.5, 10, 50, 10.2, 9.8, 13.8, 6.3]);
    const screen = madOutliers(values);
    expect(screen.median).toBe(10);
    expect(screen.mad).toBe(0.5);
    expect(screen.threshold).toBeCloseTo(3.7065, 12);
    expect(screen.indices).toEqual([4, 7]);
    expect(values).toEqual([10, 10.5, 9.5, 10, 50, 10.2, 9.8, 13.8, 6.3]);
  });
  test('k is the caller’s; a zero MAD flags nothing', () => {
    expect(madOutliers([10, 10.5, 9.5, 10, 50, 10.2, 9.8, 13.8, 6.3], 10).indices).toEqual([4]);
    expect(madOutliers([1, 1, 1, 1, 9]).indices).toEqual([]);
    expect(errorCode(() => madOutliers([1, 2]))).toBe('too_few_points');
    expect(errorCode(() => madOutliers([1, 2, 3], 0))).toBe('bad_argument');
  });
});
