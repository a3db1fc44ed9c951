import { checkPhaseInput, confidenceOf, detrendPhase, noiseAt, resolveFactors, type DeviationOptions, type DeviationPoint } from './deviation-input.js';
import { greenhallEdf } from './greenhall-edf.js';
import { chiSquaredInterval } from './stability-confidence.js';

export type HadamardOptions = DeviationOptions & {
  /** false: the non-overlapping ("normal") estimator, stride τ instead of τ0. Default true. */
  overlapping?: boolean;
};

/**
 * Overlapping Hadamard deviation from phase data (NIST SP 1065, Riley 2008, §5.2, the Hadamard variance,
 * phase form), a three-sample variance that a linear frequency drift does not affect:
 * Hσ²_y(τ) = Σ_{i=1}^{N−3m} (x_{i+3m} − 3x_{i+2m} + 3x_{i+m} − x_i)² / (6 τ² (N − 3m)), τ = mτ0,
 * N phase points. With `overlapping: false`, the normal estimator of SP 1065 (the same third
 * differences taken every m points, ⌊(N − 1)/m⌋ − 2 terms). O(N) per factor.
 *
 * Degrees of freedom: {@link greenhallEdf} with d = 3, unmodified, for the noise type of each factor
 * (SP 1065 prints no closed form we could check for the Hadamard edf; see greenhallEdf); the interval is χ² ({@link chiSquaredInterval}).
 *
 * Checked against SP 1065 Table 30 (NBS14: 70.80607, 85.61487 overlapping; 70.80607, 116.7980 normal)
 * and Table 31 (1000-point set: 2.943883e-1, 9.581083e-2, 3.237638e-2 at τ = 1, 10, 100).
 *
 * @param x phase, s (or y's unit × s), at a fixed interval τ0; at least 4 points
 * @param tau0 sampling interval, s
 * @param opts averaging factors (default octaves), noise type for the edf, confidence, overlapping
 * @returns one point per factor
 * @throws {MetrologyError} 'too_few_points' (under 4), 'not_finite', 'bad_argument' (τ0 ≤ 0, a factor
 *   not a whole number ≥ 1, confidence outside (0, 1)), 'too_short' (a factor beyond (N − 1)/3)
 * @example hadamardDev(phaseFromFractionalFrequency([892, 809, 823, 798, 671, 644, 883, 903, 677], 1), 1)[1].deviation; // => 85.61487…
 */
export function hadamardDev(x: ArrayLike<number>, tau0: number, opts: HadamardOptions = {}): DeviationPoint[] {
  const fn = 'hadamardDev';
  const N = checkPhaseInput(fn, x, tau0, 4);
  const confidence = confidenceOf(fn, opts.confidence);
  const overlapping = opts.overlapping ?? true;
  const factors = resolveFactors(fn, opts.factors, (N - 1) / 3);
  return hadamardDevOfDetrended(detrendPhase(x), tau0, factors, opts.noise, confidence, overlapping);
}

/**
 * {@link hadamardDev} from phase already checked and through detrendPhase, at factors already checked: the stability
 * table detrends its phase once for the Hadamard, time and total deviations rather than once for each.
 */
export function hadamardDevOfDetrended(
  z: Float64Array,
  tau0: number,
  factors: readonly number[],
  noiseOption: HadamardOptions['noise'],
  confidence: number,
  overlapping: boolean,
): DeviationPoint[] {
  const N = z.length;
  return factors.map((m) => {
    const stride = overlapping ? 1 : m;
    const terms = Math.floor((N - 3 * m - 1) / stride) + 1; // the i = 0, stride, 2·stride, … with i + 3m < N
    const sum = thirdDifferenceSum(z, m, stride, terms);
    const tau = m * tau0;
    const deviation = Math.sqrt(sum / (6 * tau * tau * terms));
    const noise = noiseAt(noiseOption, m);
    const edf = greenhallEdf({ d: 3, m, phasePoints: N, overlapping, modified: false, noise });
    const [ciLow, ciHigh] = chiSquaredInterval(deviation, edf, confidence);
    return { m, tau, deviation, terms, noise, edf, ciLow, ciHigh };
  });
}

// Σ (x_{i+3m} − 3x_{i+2m} + 3x_{i+m} − x_i)² over i = 0, stride, … (terms of them). A plain function over a
// Float64Array rather than a loop inside the per-factor closure: V8 optimises it far better there (this
// pass is most of hadamardDev's time on 10⁶ points); the operations and their order are unchanged.
function thirdDifferenceSum(z: Float64Array, m: number, stride: number, terms: number): number {
  const m2 = 2 * m;
  const m3 = 3 * m;
  let sum = 0;
  for (let k = 0, i = 0; k < terms; k++, i += stride) {
    const third = z[i + m3]! - 3 * z[i + m2]! + 3 * z[i + m]! - z[i]!;
    sum += third * third;
  }
  return sum;
}
