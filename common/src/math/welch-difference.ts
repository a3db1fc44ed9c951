import jstat from 'jstat';
import { assertFinite, assertFiniteArray } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/** Summary statistics of one run: mean, sample SD, number of values. */
export type SampleSummary = { mean: number; sd: number; n: number };

export type WelchDifference = {
  /** b.mean − a.mean. */
  difference: number;
  low: number;
  high: number;
  /** Welch–Satterthwaite degrees of freedom (not rounded). */
  df: number;
  /** Student-t quantile used, t(1 − α/2, df). */
  t: number;
  /** Standard error of the difference √(s_a²/n_a + s_b²/n_b). */
  se: number;
  confidence: number;
};

/**
 * Welch's interval for the difference of two means with unequal variances
 * (Welch 1947; NIST/SEMATECH e-Handbook §7.3.1):
 * d = m_b − m_a, se = √(s_a²/n_a + s_b²/n_b),
 * ν = se⁴ / ((s_a²/n_a)²/(n_a − 1) + (s_b²/n_b)²/(n_b − 1)),
 * d ± t(1 − α/2, ν)·se with the Student-t quantile from jstat (non-integer ν allowed).
 *
 * @param a first run (mean, sample SD, n ≥ 2)
 * @param b second run
 * @param confidence two-sided confidence, default 0.95
 * @returns difference b − a with its interval, ν and t
 * @throws {MetrologyError} 'too_few_points' (n < 2), 'not_finite', 'bad_argument' (negative SD,
 *   confidence outside (0, 1)), 'no_spread' (both SDs zero: no interval can be formed)
 * @example welchDifference({ mean: 10, sd: 1, n: 10 }, { mean: 12, sd: 2, n: 12 }).difference; // => 2
 */
export function welchDifference(a: SampleSummary, b: SampleSummary, confidence = 0.95): WelchDifference {
  const fn = 'welchDifference';
  for (const [label, sample] of [
    ['a', a],
    ['b', b],
  ] as const) {
    assertFinite(fn, `${label}.mean`, sample.mean);
    assertFinite(fn, `${label}.sd`, sample.sd);
    if (!Number.isInteger(sample.n) || sample.n < 2) {
      throw new MetrologyError('too_few_points', `${fn} requires at least 2 data points in each sample (${label} has ${sample.n})`);
    }
    if (sample.sd < 0) throw new MetrologyError('bad_argument', `${fn} requires ${label}.sd of zero or more`);
  }
  if (!(confidence > 0 && confidence < 1)) {
    throw new MetrologyError('bad_argument', `${fn} requires 0 < confidence < 1 (got ${confidence})`);
  }
  const varianceOfMeanA = (a.sd * a.sd) / a.n;
  const varianceOfMeanB = (b.sd * b.sd) / b.n;
  const varianceOfDifference = varianceOfMeanA + varianceOfMeanB;
  if (!(varianceOfDifference > 0)) {
    throw new MetrologyError('no_spread', `${fn} requires some spread in at least one sample (both SDs are zero)`);
  }
  const se = Math.sqrt(varianceOfDifference);
  const df = varianceOfDifference ** 2 / (varianceOfMeanA ** 2 / (a.n - 1) + varianceOfMeanB ** 2 / (b.n - 1));
  const t = jstat.studentt.inv(1 - (1 - confidence) / 2, df);
  const difference = b.mean - a.mean;
  return { difference, low: difference - t * se, high: difference + t * se, df, t, se, confidence };
}

/**
 * Mean, sample standard deviation (n − 1) and count of a sample.
 *
 * @param values at least 2 finite values
 * @returns { mean, sd, n }
 * @throws {MetrologyError} 'too_few_points', 'not_finite'
 * @example summariseSample([1, 2, 3, 4]); // => { mean: 2.5, sd: 1.29…, n: 4 }
 */
export function summariseSample(values: ArrayLike<number>): SampleSummary {
  const fn = 'summariseSample';
  if (values.length < 2) throw new MetrologyError('too_few_points', `${fn} requires at least 2 data points`);
  assertFiniteArray(fn, 'values', values);
  const n = values.length;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += values[i]!;
  let mean = sum / n;
  let correction = 0;
  for (let i = 0; i < n; i++) correction += values[i]! - mean;
  mean += correction / n;
  let squares = 0;
  for (let i = 0; i < n; i++) squares += (values[i]! - mean) ** 2;
  return { mean, sd: Math.sqrt(squares / (n - 1)), n };
}

/**
 * {@link welchDifference} from the raw values of the two runs.
 *
 * @param a values of the first run (at least 2)
 * @param b values of the second run (at least 2)
 * @param confidence default 0.95
 * @returns difference b − a with its Welch interval
 * @throws {MetrologyError} as summariseSample and welchDifference
 * @example welchFromSamples([1, 2, 3], [4, 5, 7]).difference; // => 3.33…
 */
export function welchFromSamples(a: ArrayLike<number>, b: ArrayLike<number>, confidence = 0.95): WelchDifference {
  return welchDifference(summariseSample(a), summariseSample(b), confidence);
}
