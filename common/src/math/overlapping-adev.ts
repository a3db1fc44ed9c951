import { resolveFactors } from './deviation-input.js';
import { assertFiniteArray, assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';
import { overlappingAdevKernel } from './overlapping-adev-kernel.js';
import type { NoiseType } from './stability-confidence.js';

/** One averaging time of a stability analysis. */
export type StabilityPoint = {
  /** Averaging factor (τ = m·τ0). */
  m: number;
  /** Averaging time, s. */
  tau: number;
  /** Deviation (dimensionless for fractional-frequency input, else the input's unit). */
  deviation: number;
  /** Number of terms in the sum. */
  n: number;
  /** Equivalent degrees of freedom used for the interval. */
  edf: number;
  ciLow: number;
  ciHigh: number;
};

export type StabilityOptions = {
  /** Dominant noise assumed for the interval; default 'white_fm'. */
  noise?: NoiseType;
  /** Two-sided confidence of the interval; default 0.683 (the "1 σ" bars usual in SP 1065 plots). */
  confidence?: number;
  /** Largest averaging factor to report (default: as far as the data allow). */
  maxM?: number;
  /**
   * Averaging factors wanted instead of the octaves (e.g. {@link decades}); a factor the data
   * cannot give is refused ('too_short'). maxM is then ignored.
   */
  factors?: readonly number[];
};

/**
 * Octave averaging factors 1, 2, 4, … up to and including a limit (SP 1065 §5.2 "octave" τ
 * spacing).
 *
 * @param limit largest factor allowed (values below 1 give an empty list)
 * @returns the powers of two up to limit
 * @throws {MetrologyError} 'bad_argument' for NaN
 * @example octaves(10); // => [1, 2, 4, 8]
 */
export function octaves(limit: number): number[] {
  if (Number.isNaN(limit)) throw new MetrologyError('bad_argument', 'octaves requires a limit that is a number');
  const out: number[] = [];
  for (let m = 1; m <= limit; m *= 2) out.push(m);
  return out;
}

/**
 * Builds phase (time deviation, in units of τ0) from frequency data with the mean
 * frequency removed: x[0] = 0, x[i+1] = x[i] + (y[i] − ȳ) (SP 1065 §1.2, x as the running
 * sum of y·τ0). Removing the mean changes no Allan-type deviation (the second difference
 * cancels any frequency offset) and keeps the running sum small, so precision holds on
 * 10⁶ points.
 *
 * @param y frequency data (at least 1 value, finite)
 * @returns N = y.length + 1 phase points, in units of τ0 × y's unit
 * @throws {MetrologyError} 'too_few_points' (empty), 'not_finite'
 * @example phaseFromFrequency([1, 3]); // => Float64Array [0, -1, 0]
 */
export function phaseFromFrequency(y: ArrayLike<number>): Float64Array {
  if (y.length === 0) throw new MetrologyError('too_few_points', 'phaseFromFrequency requires at least 1 data point');
  assertFiniteArray('phaseFromFrequency', 'y', y);
  let sum = 0;
  for (let i = 0; i < y.length; i++) sum += y[i]!;
  let mean = sum / y.length;
  // Second pass corrects the rounding of the first sum (a constant input then gives exactly 0).
  let correction = 0;
  for (let i = 0; i < y.length; i++) correction += y[i]! - mean;
  mean += correction / y.length;
  const x = new Float64Array(y.length + 1);
  for (let i = 0; i < y.length; i++) x[i + 1] = x[i]! + (y[i]! - mean);
  return x;
}

/**
 * Overlapping Allan deviation at octave averaging factors m = 1, 2, 4, … (NIST SP 1065,
 * Riley 2008, Eq. 14, phase form):
 * σ²_y(mτ0) = Σ_{i=1}^{N−2m} (x_{i+2m} − 2x_{i+m} + x_i)² / (2 m² τ0² (N − 2m)),
 * with N = number of phase points = frequency points + 1 and the phase x built by
 * summing the frequency data (see {@link phaseFromFrequency}). Each factor costs O(N),
 * so all octaves cost O(N log N). Factors run while N − 2m ≥ 1.
 *
 * Confidence interval: χ² with the equivalent degrees of freedom of SP 1065 Table 5 for
 * the chosen noise type (default white FM) — see {@link adevEdf} and {@link chiSquaredInterval}.
 * The bias of the ADEV estimator for the noise type is not corrected.
 *
 * Checked against SP 1065 Table 30 (NBS14 data): 91.22945 and 85.95287 at m = 1, 2.
 *
 * @param y frequency data at a fixed interval (fractional frequency, or Hz: the deviation has y's unit)
 * @param tau0 sampling interval, s
 * @param opts noise type and confidence for the interval, largest m
 * @returns one row per octave (or per factor asked for)
 * @throws {MetrologyError} 'too_few_points' (under 2 frequency points), 'not_finite',
 *   'bad_argument' (τ0 ≤ 0, confidence outside (0, 1), a factor not a whole number ≥ 1), 'too_short' (a factor beyond (N − 1)/2)
 * @example overlappingAdev([892, 809, 823, 798, 671, 644, 883, 903, 677], 1)[0].deviation; // => 91.22945…
 */
export function overlappingAdev(y: ArrayLike<number>, tau0: number, opts: StabilityOptions = {}): StabilityPoint[] {
  const fn = 'overlappingAdev';
  if (y.length < 2) throw new MetrologyError('too_few_points', `${fn} requires at least 2 data points`);
  assertFiniteArray(fn, 'y', y);
  assertPositive(fn, 'tau0', tau0);
  const noise = opts.noise ?? 'white_fm';
  const confidence = opts.confidence ?? 0.683;
  const x = phaseFromFrequency(y);
  const N = x.length;
  const limit = Math.min(Math.floor((N - 1) / 2), opts.maxM ?? Number.POSITIVE_INFINITY);
  const factors = opts.factors === undefined ? octaves(limit) : resolveFactors(fn, opts.factors, (N - 1) / 2);
  return factors.map((m) => overlappingAdevKernel(x, m, tau0, noise, confidence));
}
