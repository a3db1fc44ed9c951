import { MetrologyError } from './metrology-error.js';
import type { NoiseType } from './stability-confidence.js';

/** What {@link greenhallEdf} needs to know about the variance estimator. */
export type EdfEstimator = {
  /** Order of the phase difference: 2 for Allan-type (ADEV, MDEV, TDEV), 3 for Hadamard. */
  d: 2 | 3;
  /** Averaging factor. */
  m: number;
  /** Number of phase points N. */
  phasePoints: number;
  /** Overlapping estimator (stride τ0) rather than stride τ. */
  overlapping: boolean;
  /** Modified estimator (phase averaged over τ first: MDEV, TDEV). */
  modified: boolean;
  noise: NoiseType;
};

/** Exponent α of the frequency power law S_y(f) ∝ f^α for each noise type (SP 1065 §4, Table 1). */
export const NOISE_ALPHA: Readonly<Record<NoiseType, number>> = Object.freeze({
  white_pm: 2,
  flicker_pm: 1,
  white_fm: 0,
  flicker_fm: -1,
  random_walk_fm: -2,
});

/** Lags summed exactly; above this the sum is taken on this many evenly spaced lags (see below). */
const EXACT_LAGS = 4096;
/** The algorithm's J_max: unmodified variances with α ≤ 0 use the F = ∞ phase model above m(d + 1) = J_max. */
const J_MAX = 100;

// Generalised autocovariance of the continuous power-law process w(t) (Greenhall & Riley 2003, Eq. 7).
// The logarithm is taken only for the two flicker cases that use it: this runs some 10⁵ times per
// averaging factor, and an unused Math.log on every call was most of the edf's cost.
function sw(t: number, alpha: number): number {
  const a = Math.abs(t);
  switch (alpha) {
    case 2:
      return -a;
    case 1:
      return a * a * logOf(a);
    case 0:
      return a * a * a;
    case -1:
      return -(a ** 4) * logOf(a);
    default: // −2
      return -(a ** 5);
  }
}

// ln a, with the t ln t limit 0 at a = 0.
function logOf(a: number): number {
  return a === 0 ? 0 : Math.log(a);
}

// Autocovariance of the phase seen through a filter of width 1/F (Eq. 8); F = ∞ for a point sample.
function sx(t: number, F: number, alpha: number): number {
  if (F === Number.POSITIVE_INFINITY) return sw(t, alpha + 2);
  return F * F * (2 * sw(t, alpha) - sw(t - 1 / F, alpha) - sw(t + 1 / F, alpha));
}

const BINOMIAL_WEIGHTS: Readonly<Record<2 | 3, readonly number[]>> = { 2: [6, -4, 1], 3: [20, -15, 6, -1] };

// Autocovariance of the d-th difference of the phase at lag t (Eq. 9): Σ_k (−1)^k C(2d, d + k) sx(t + k).
function sz(t: number, F: number, alpha: number, d: 2 | 3): number {
  const w = BINOMIAL_WEIGHTS[d];
  let sum = w[0]! * sx(t, F, alpha);
  for (let k = 1; k <= d; k++) sum += w[k]! * (sx(t - k, F, alpha) + sx(t + k, F, alpha));
  return sum;
}

/**
 * Equivalent degrees of freedom of an Allan-type, modified or Hadamard variance estimate for a
 * power-law noise, by the combined algorithm of C. A. Greenhall and W. J. Riley, "Uncertainty of
 * stability variances based on finite differences" (Proc. 35th PTTI, 2003), through which NIST SP 1065
 * (Riley 2008) §5.3 gives the edf of the modified variance; used here for the time and Hadamard variances too:
 * L = m/F + m·d, M = 1 + ⌊S(N − L)/m⌋ summands, J = min(M, (d + 1)S), with filter factor F = 1
 * (modified) or m (unmodified; ∞ for α ≤ 0 when m(d + 1) > 100) and stride factor S = m
 * (overlapping) or 1, and
 * 1/edf = [sz(0)² + 2 Σ_{j=1}^{J−1} (1 − j/M) sz(j/S)² + (1 − J/M) sz(J/S)²] / (M · sz(0)²),
 * sz the autocovariance of the d-th phase difference built from the power law's generalised
 * autocovariance (the paper's Eqs. 7–10). This is the paper's exact "basic sum" for every J;
 * the paper's tables for large J are not used. Instead, above 4096 lags the sum is taken by the
 * trapezoidal rule on 4096 evenly spaced lags (agrees with the full sum to well under 1 %), except
 * for unmodified white PM, whose covariance lives only at whole multiples of τ and is summed
 * exactly there, and unmodified flicker PM, which is always summed in full (its covariance has
 * narrow peaks a coarse grid would miss).
 *
 * @param estimator difference order d, m, N, overlapping, modified, noise type
 * @returns equivalent degrees of freedom (≥ 1)
 * @throws {MetrologyError} 'bad_argument' (m not a whole number ≥ 1, unknown noise),
 *   'too_short' (N below the estimator's span L)
 * @example greenhallEdf({ d: 3, m: 1, phasePoints: 10, overlapping: true, modified: false, noise: 'white_pm' }); // => 7²/(7 + 2(6·225 + 5·36 + 4)/400)
 */
export function greenhallEdf(estimator: EdfEstimator): number {
  const fn = 'greenhallEdf';
  const { d, m, phasePoints: N, overlapping, modified, noise } = estimator;
  const alpha = NOISE_ALPHA[noise];
  if (alpha === undefined) throw new MetrologyError('bad_argument', `${fn}: unknown noise type '${String(noise)}'`);
  if (!(Number.isInteger(m) && m >= 1 && Number.isInteger(N)))
    throw new MetrologyError('bad_argument', `${fn} requires whole m ≥ 1 and N (got m = ${m}, N = ${N})`);
  if (d !== 2 && d !== 3) throw new MetrologyError('bad_argument', `${fn} requires d = 2 or 3 (got ${String(d)})`);
  let F = modified ? 1 : m;
  const S = overlapping ? m : 1;
  const L = m / F + m * d;
  if (N < L) throw new MetrologyError('too_short', `${fn}: ${N} phase points are fewer than the ${L} one term of this estimator spans`);
  const M = 1 + Math.floor((S * (N - L)) / m);
  const J = Math.min(M, (d + 1) * S);
  if (!modified && alpha <= 0 && m * (d + 1) > J_MAX) F = Number.POSITIVE_INFINITY;
  const s0 = sz(0, F, alpha, d);
  const term = (j: number) => (1 - j / M) * sz(j / S, F, alpha, d) ** 2;
  let inner = 0; // Σ_{j=1}^{J−1} (1 − j/M) sz(j/S)²
  if (J <= EXACT_LAGS || (!modified && alpha === 1)) {
    for (let j = 1; j < J; j++) inner += term(j);
  } else if (!modified && alpha === 2) {
    for (let j = S; j < J; j += S) inner += term(j);
  } else {
    const steps = EXACT_LAGS;
    const h = J / steps;
    let trapezoid = (term(0) + term(J)) / 2;
    for (let i = 1; i < steps; i++) trapezoid += term(i * h);
    inner = trapezoid * h - (term(0) + term(J)) / 2;
  }
  const basicSum = s0 * s0 + 2 * inner + term(J);
  const edf = (M * s0 * s0) / basicSum;
  return Number.isFinite(edf) ? Math.max(edf, 1) : 1;
}
