import { assertFiniteArray } from './guards.js';
import { MetrologyError } from './metrology-error.js';
import type { NoiseType } from './stability-confidence.js';

/** Result of {@link identifyNoise}. */
export type NoiseIdentification =
  | {
      status: 'identified';
      /** Power-law type named (nearest whole α, kept within white PM … random-walk FM). */
      noise: NoiseType;
      method: 'lag1_acf';
      /** Estimated α of S_y(f) ∝ f^α before rounding. */
      alphaEstimate: number;
      /** Differences taken (d) and the lag-1 autocorrelation r1 where the loop stopped. */
      differences: number;
      r1: number;
      /** Points the estimate rests on (phase points after decimation by m). */
      points: number;
    }
  | {
      status: 'identified';
      noise: NoiseType;
      method: 'b1_ratio';
      /** B1 = (sample variance)/(Allan variance) of the averaged frequencies. */
      b1: number;
      /** Exponent μ of σ²_y(τ) ∝ τ^μ whose expected B1 is nearest (in ratio). */
      mu: -2 | -1 | 0 | 1;
      /** Types B1 cannot tell from `noise` (white and flicker PM share μ = −2). */
      alternatives: NoiseType[];
      points: number;
    }
  | { status: 'too_short'; points: number; message: string };

/** Fewest decimated phase points for the lag-1 method (common practice, no published source). */
export const LAG1_MIN_POINTS = 30;
/** Fewest decimated phase points for the B1 fallback: 3 averaged frequencies. */
export const B1_MIN_POINTS = 4;

const ALPHA_TO_NOISE: Readonly<Record<number, NoiseType>> = { 2: 'white_pm', 1: 'flicker_pm', 0: 'white_fm', '-1': 'flicker_fm', '-2': 'random_walk_fm' };

function lag1(z: Float64Array): number {
  let mean = 0;
  for (let i = 0; i < z.length; i++) mean += z[i]!;
  mean /= z.length;
  let numerator = 0;
  let denominator = 0;
  for (let i = 0; i < z.length; i++) {
    const d = z[i]! - mean;
    denominator += d * d;
    if (i + 1 < z.length) numerator += d * (z[i + 1]! - mean);
  }
  return denominator > 0 ? numerator / denominator : 0;
}

// z_k = x_{km}, k = 0 … points − 1. Plain functions over typed arrays, not loops inside identifyCheckedNoise: V8
// optimises them sooner, and they run over 10⁶ points at m = 1.
function decimate(x: ArrayLike<number>, m: number, points: number): Float64Array {
  // At m = 1 every point is kept: a block copy of typed input instead of a loop over 10⁶ points.
  if (m === 1 && x instanceof Float64Array) return x.slice(0, points);
  const z = new Float64Array(points);
  for (let k = 0; k < points; k++) z[k] = x[k * m]!;
  return z;
}

// First differences z_{k+1} − z_k written over z from the front (each z_k is read before it is replaced), as a view
// one shorter: no new array of 10⁶ points per difference taken; the same subtractions.
function differenceInPlace(z: Float64Array): Float64Array {
  const n = z.length - 1;
  for (let k = 0; k < n; k++) z[k] = z[k + 1]! - z[k]!;
  return z.subarray(0, n);
}

// Expected B1(N, μ) for σ²_y ∝ τ^μ (Barnes): N(1 − N^μ)/(2(N − 1)(1 − 2^μ)), and N ln N/(2(N − 1) ln 2) at μ = 0.
function expectedB1(n: number, mu: number): number {
  if (mu === 0) return (n * Math.log(n)) / (2 * (n - 1) * Math.log(2));
  return (n * (1 - n ** mu)) / (2 * (n - 1) * (1 - 2 ** mu));
}

/**
 * Names the dominant power-law noise at averaging factor m by the lag-1 autocorrelation method of
 * W. J. Riley and C. A. Greenhall ("Power law noise identification using the lag 1 autocorrelation",
 * 2004; NIST SP 1065, Riley 2008, §5.6): the phase is decimated by m (z_k = x_{km}, which is the
 * frequency averaged over τ = mτ0), then, with d = 0: r1 = Σ(z_k − z̄)(z_{k+1} − z̄)/Σ(z_k − z̄)²,
 * δ = r1/(1 + r1); while δ ≥ 0.25 and d < dmax (2), z is replaced by its first differences and d
 * raised. Then p = −2(δ + d) estimates the phase spectral exponent β, α = p + 2 (phase data), and
 * α is rounded to the nearest whole number in 2 … −2 (white PM … random-walk FM).
 * No drift is removed here: remove a drift first (it reads as random-walk FM).
 *
 * Where fewer than 30 decimated points remain (our threshold, common practice, no published source),
 * the B1 ratio of J. A. Barnes (NBS Tech. Note 375, 1969; SP 1065 §5.6) is used as the cross-check:
 * B1 = s²/σ²_A of the n = ⌊(N − 1)/m⌋ frequencies averaged over τ, compared with its expected value
 * N(1 − N^μ)/(2(N − 1)(1 − 2^μ)) for μ = −2 (PM), −1 (white FM), 0 (flicker FM, N ln N/(2(N − 1) ln 2)),
 * 1 (random-walk FM); the nearest in ratio wins. B1 cannot tell white from flicker PM (both μ = −2):
 * that case is named white PM with flicker PM as the alternative. Under 3 averaged frequencies the
 * result is 'too_short'.
 *
 * @param x phase at a fixed interval (any unit), at least 2 points
 * @param m averaging factor (whole number ≥ 1)
 * @returns the noise type and the method used, or status 'too_short'
 * @throws {MetrologyError} 'too_few_points' (under 2), 'not_finite', 'bad_argument' (m)
 * @example identifyNoise(whiteFmPhase, 1); // => { status: 'identified', noise: 'white_fm', method: 'lag1_acf', … }
 */
export function identifyNoise(x: ArrayLike<number>, m: number): NoiseIdentification {
  checkNoiseInput(x);
  return identifyCheckedNoise(x, m);
}

/** identifyNoise's checks of the phase (at least 2 points, all finite), for a caller that names the noise at many factors. */
export function checkNoiseInput(x: ArrayLike<number>): void {
  if (x.length < 2) throw new MetrologyError('too_few_points', 'identifyNoise requires at least 2 phase points');
  assertFiniteArray('identifyNoise', 'x', x);
}

/**
 * {@link identifyNoise} on phase already through {@link checkNoiseInput}: the stability table names the noise at
 * every factor of one phase series, and checking its 10⁶ points again for each factor was a fifth of the table's time.
 */
export function identifyCheckedNoise(x: ArrayLike<number>, m: number): NoiseIdentification {
  const fn = 'identifyNoise';
  if (!(Number.isInteger(m) && m >= 1)) throw new MetrologyError('bad_argument', `${fn} requires a whole averaging factor of 1 or more (got ${m})`);
  const points = Math.floor((x.length - 1) / m) + 1;
  let z = decimate(x, m, points);

  if (points >= LAG1_MIN_POINTS) {
    const dmax = 2;
    let d = 0;
    let r1 = lag1(z);
    let delta = r1 / (1 + r1);
    while (delta >= 0.25 && d < dmax) {
      z = differenceInPlace(z);
      d++;
      r1 = lag1(z);
      delta = r1 / (1 + r1);
    }
    const alphaEstimate = -2 * (delta + d) + 2;
    const rounded = Math.min(2, Math.max(-2, Math.round(alphaEstimate)));
    return { status: 'identified', noise: ALPHA_TO_NOISE[rounded]!, method: 'lag1_acf', alphaEstimate, differences: d, r1, points };
  }

  if (points < B1_MIN_POINTS) {
    return {
      status: 'too_short',
      points,
      message: `too short to identify the noise at m = ${m}: ${points - 1} averaged frequencies, at least ${B1_MIN_POINTS - 1} needed`,
    };
  }
  const n = points - 1;
  const y = new Float64Array(n);
  let mean = 0;
  for (let k = 0; k < n; k++) {
    y[k] = z[k + 1]! - z[k]!;
    mean += y[k]!;
  }
  mean /= n;
  let sampleVariance = 0;
  let allanSum = 0;
  for (let k = 0; k < n; k++) {
    sampleVariance += (y[k]! - mean) ** 2;
    if (k + 1 < n) allanSum += (y[k + 1]! - y[k]!) ** 2;
  }
  sampleVariance /= n - 1;
  const allanVariance = allanSum / (2 * (n - 1));
  if (!(allanVariance > 0)) {
    return { status: 'too_short', points, message: `cannot identify the noise at m = ${m}: the averaged frequencies do not vary` };
  }
  const b1 = sampleVariance / allanVariance;
  let best: -2 | -1 | 0 | 1 = -1;
  let bestDistance = Number.POSITIVE_INFINITY;
  for (const mu of [-2, -1, 0, 1] as const) {
    const distance = Math.abs(Math.log(Math.max(b1, Number.MIN_VALUE) / expectedB1(n, mu)));
    if (distance < bestDistance) {
      bestDistance = distance;
      best = mu;
    }
  }
  const byMu: Record<-2 | -1 | 0 | 1, NoiseType> = { '-2': 'white_pm', '-1': 'white_fm', 0: 'flicker_fm', 1: 'random_walk_fm' };
  return { status: 'identified', noise: byMu[best], method: 'b1_ratio', b1, mu: best, alternatives: best === -2 ? ['flicker_pm'] : [], points };
}
