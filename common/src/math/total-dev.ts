import { checkPhaseInput, confidenceOf, detrendPhase, noiseAt, resolveFactors, type DeviationOptions, type DeviationPoint } from './deviation-input.js';
import { chiSquaredInterval } from './stability-confidence.js';
import { totalDevEdf } from './total-dev-edf.js';

/**
 * Total deviation from phase data (NIST SP 1065, Riley 2008, §5.2, the total variance): the overlapping Allan
 * variance taken over the phase record extended by reflection about both end points,
 * Totvar(τ) = Σ_{i=2}^{N−1} (x*_{i−m} − 2x*_i + x*_{i+m})² / (2 τ² (N − 2)), τ = mτ0,
 * x*_{1−j} = 2x_1 − x_{1+j} and x*_{N+j} = 2x_N − x_{N−j} for j = 1 … N − 2, so the virtual series runs
 * from 3 − N to 2N − 2 (3N − 4 points) with the data in its middle. The extended series is never built:
 * a point outside the data is computed from its mirror image where it is needed, and each factor is one
 * pass of N − 2 second differences: O(N) per τ, no O(N²) loop, no extra memory.
 * No bias correction is applied (the SP 1065 Table 31 values below are matched without one).
 * Factors run to (N − 1)/2, half the record (our limit; the reflection itself would allow N − 1).
 *
 * Degrees of freedom: {@link totalDevEdf} (SP 1065 Table 7); the interval is χ².
 *
 * Checked against SP 1065 Table 31 (1000-point set: 2.922319e-1, 9.134743e-2, 3.406530e-2 at
 * τ = 1, 10, 100); the NBS14 value at m = 2 (93.90379) was recomputed, not read from the publication.
 *
 * @param x phase, s (or y's unit × s), at a fixed interval τ0; at least 3 points
 * @param tau0 sampling interval, s
 * @param opts averaging factors (default octaves), noise type for the edf, confidence
 * @returns one point per factor
 * @throws {MetrologyError} 'too_few_points' (under 3), 'not_finite', 'bad_argument', 'too_short' (a factor beyond (N − 1)/2)
 * @example totalDev(phaseFromFractionalFrequency([892, 809, 823, 798, 671, 644, 883, 903, 677], 1), 1)[0].deviation; // => 91.22945…
 */
export function totalDev(x: ArrayLike<number>, tau0: number, opts: DeviationOptions = {}): DeviationPoint[] {
  const fn = 'totalDev';
  const N = checkPhaseInput(fn, x, tau0, 3);
  const confidence = confidenceOf(fn, opts.confidence);
  const factors = resolveFactors(fn, opts.factors, (N - 1) / 2);
  return totalDevOfDetrended(detrendPhase(x), tau0, factors, opts.noise, confidence);
}

/** {@link totalDev} from phase already checked and through detrendPhase, at factors already checked (see hadamardDevOfDetrended). */
export function totalDevOfDetrended(
  z: Float64Array,
  tau0: number,
  factors: readonly number[],
  noiseOption: DeviationOptions['noise'],
  confidence: number,
): DeviationPoint[] {
  const N = z.length;
  const terms = N - 2;
  return factors.map((m) => {
    const sum = reflectedSecondDifferenceSum(z, m);
    const tau = m * tau0;
    const deviation = Math.sqrt(sum / (2 * tau * tau * terms));
    const noise = noiseAt(noiseOption, m);
    const edf = totalDevEdf(N, m, noise);
    const [ciLow, ciHigh] = chiSquaredInterval(deviation, edf, confidence);
    return { m, tau, deviation, terms, noise, edf, ciLow, ciHigh };
  });
}

// Σ_{k=1}^{N−2} (x*_{k−m} − 2x_k + x*_{k+m})², 0-based, x* the reflected series: x*_{−j} = 2x_0 − x_j,
// x*_{N−1+j} = 2x_{N−1} − x_{N−1−j}. With 2m ≤ N − 1 (the caller's limit) only the first m − 1 terms reach left of the data
// and only the last m − 1 right of it, so the pass is split in three loops instead of building the
// 3N − 4-point extended array (24 MB on 10⁶ points) and reading through it; each reflected point is
// the same 2x_end − x_j as that array held, and the terms are added in the same order, so the sum is
// unchanged to the last bit.
function reflectedSecondDifferenceSum(z: Float64Array, m: number): number {
  const N = z.length;
  const first = z[0]!;
  const last = z[N - 1]!;
  let sum = 0;
  for (let k = 1; k < m; k++) {
    const second = 2 * first - z[m - k]! - 2 * z[k]! + z[k + m]!;
    sum += second * second;
  }
  for (let k = m; k <= N - 1 - m; k++) {
    const second = z[k - m]! - 2 * z[k]! + z[k + m]!;
    sum += second * second;
  }
  for (let k = N - m; k <= N - 2; k++) {
    const second = z[k - m]! - 2 * z[k]! + (2 * last - z[2 * (N - 1) - k - m]!);
    sum += second * second;
  }
  return sum;
}
