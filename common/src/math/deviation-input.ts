import { assertFiniteArray, assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';
import type { NoiseType } from './stability-confidence.js';

// Internal pieces shared by the phase-domain deviations (Hadamard, time, total): the point and
// option types, the check of the input, the list of averaging factors and the noise per factor.

/** One averaging time of a phase-domain deviation. */
export type DeviationPoint = {
  /** Averaging factor (τ = m·τ0). */
  m: number;
  /** Averaging time, s. */
  tau: number;
  /** The deviation (dimensionless for phase in seconds; TDEV is in seconds). */
  deviation: number;
  /** Number of terms summed. */
  terms: number;
  /** Noise type the degrees of freedom were taken for. */
  noise: NoiseType;
  /** Equivalent degrees of freedom of the estimate for that noise type. */
  edf: number;
  /** χ² confidence interval of the deviation. */
  ciLow: number;
  ciHigh: number;
};

export type DeviationOptions = {
  /**
   * Averaging factors m wanted, in order (whole numbers ≥ 1). Default: octaves 1, 2, 4, … as far
   * as the data allow; {@link decades} gives 1, 2, 5, 10, 20, 50, … A factor the data cannot give
   * is refused ('too_short'), never dropped silently.
   */
  factors?: readonly number[];
  /**
   * Dominant noise for the degrees of freedom: one type for every factor, or a function of m
   * (for instance from {@link identifyNoise}). Default 'white_fm'.
   */
  noise?: NoiseType | ((m: number) => NoiseType);
  /** Two-sided confidence of the interval; default 0.683. */
  confidence?: number;
};

/** Checks phase data and τ0; returns the number of phase points. */
export function checkPhaseInput(fn: string, x: ArrayLike<number>, tau0: number, minPoints: number): number {
  if (x.length < minPoints) throw new MetrologyError('too_few_points', `${fn} requires at least ${minPoints} phase points (got ${x.length})`);
  assertFiniteArray(fn, 'x', x);
  assertPositive(fn, 'tau0', tau0);
  return x.length;
}

/** The averaging factors to compute: the caller's list (each checked against maxM) or octaves up to maxM. */
export function resolveFactors(fn: string, factors: readonly number[] | undefined, maxM: number): number[] {
  if (factors === undefined) {
    const octaves: number[] = [];
    for (let m = 1; m <= maxM; m *= 2) octaves.push(m);
    return octaves;
  }
  return factors.map((m) => {
    if (!(Number.isInteger(m) && m >= 1)) throw new MetrologyError('bad_argument', `${fn} requires whole averaging factors of 1 or more (got ${m})`);
    if (m > maxM) {
      throw new MetrologyError(
        'too_short',
        `${fn}: the run is too short for averaging factor ${m}; the longest these data allow is ${Math.max(Math.floor(maxM), 0)}`,
      );
    }
    return m;
  });
}

/** Noise type for one factor. */
export function noiseAt(option: DeviationOptions['noise'], m: number): NoiseType {
  if (option === undefined) return 'white_fm';
  return typeof option === 'function' ? option(m) : option;
}

/** Checks the confidence option and returns it (default 0.683). */
export function confidenceOf(fn: string, confidence: number | undefined): number {
  const value = confidence ?? 0.683;
  if (!(value > 0 && value < 1)) throw new MetrologyError('bad_argument', `${fn} requires a confidence between 0 and 1 (got ${value})`);
  return value;
}

/**
 * Phase with the straight line through its end points removed. A linear phase (a frequency offset)
 * changes none of the Hadamard, modified Allan, time or total deviations (their differences cancel
 * it, and the reflection of the total deviation keeps a line a line), and removing it keeps the
 * numbers small, so rounding stays at the level of the differences on 10⁶ points.
 */
export function detrendPhase(x: ArrayLike<number>): Float64Array {
  return detrendPhaseInPlace(Float64Array.from(x));
}

/** {@link detrendPhase} over the caller's own array (its end points read first): the same numbers, no copy. */
export function detrendPhaseInPlace(x: Float64Array): Float64Array {
  const N = x.length;
  const first = x[0]!;
  const slope = N > 1 ? (x[N - 1]! - first) / (N - 1) : 0;
  for (let i = 0; i < N; i++) x[i] = x[i]! - first - slope * i;
  return x;
}
