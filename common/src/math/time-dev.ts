import { checkPhaseInput, confidenceOf, detrendPhase, noiseAt, resolveFactors, type DeviationOptions, type DeviationPoint } from './deviation-input.js';
import { greenhallEdf } from './greenhall-edf.js';
import { modifiedVarianceSum } from './modified-variance-sum.js';
import { chiSquaredInterval } from './stability-confidence.js';

/**
 * Time deviation from phase data (NIST SP 1065, Riley 2008, §5.2, the time variance): TDEV = τ/√3 · MDEV,
 * with the modified Allan variance in its phase form (SP 1065 Eq. 15, as in {@link modifiedAdev})
 * Mod σ²_y(τ) = Σ_{j=1}^{N−3m+1} ( Σ_{i=j}^{j+m−1} (x_{i+2m} − 2x_{i+m} + x_i) )² / (2 m² τ² (N − 3m + 1)),
 * τ = mτ0, N phase points, so σ²_x(τ) = Σ_j (…)² / (6 m² (N − 3m + 1)). The inner sum slides
 * (one term in, one out; the same kernel as MDEV, {@link modifiedVarianceSum}), so each factor costs O(N). TDEV has the unit of x (seconds for phase in s).
 *
 * Degrees of freedom: {@link greenhallEdf} with d = 2, modified, overlapping, for the noise type of
 * each factor (TDEV is a fixed multiple of MDEV, so it has MDEV's edf); the interval is χ².
 *
 * Checked against SP 1065 Table 30 (NBS14: 52.67135, 86.35831) and Table 31 (1000-point set:
 * 1.687202e-1, 3.563623e-1, 1.253382 at τ = 1, 10, 100).
 *
 * @param x phase, s, at a fixed interval τ0; at least 3 points
 * @param tau0 sampling interval, s
 * @param opts averaging factors (default octaves), noise type for the edf, confidence
 * @returns one point per factor
 * @throws {MetrologyError} 'too_few_points' (under 3), 'not_finite', 'bad_argument', 'too_short' (a factor beyond N/3)
 * @example timeDev(phaseFromFractionalFrequency([892, 809, 823, 798, 671, 644, 883, 903, 677], 1), 1)[0].deviation; // => 52.67135…
 */
export function timeDev(x: ArrayLike<number>, tau0: number, opts: DeviationOptions = {}): DeviationPoint[] {
  const fn = 'timeDev';
  const N = checkPhaseInput(fn, x, tau0, 3);
  const confidence = confidenceOf(fn, opts.confidence);
  const factors = resolveFactors(fn, opts.factors, N / 3);
  return timeDevOfDetrended(detrendPhase(x), tau0, factors, opts.noise, confidence);
}

/** {@link timeDev} from phase already checked and through detrendPhase, at factors already checked (see hadamardDevOfDetrended). */
export function timeDevOfDetrended(
  z: Float64Array,
  tau0: number,
  factors: readonly number[],
  noiseOption: DeviationOptions['noise'],
  confidence: number,
): DeviationPoint[] {
  const N = z.length;
  return factors.map((m) => {
    const terms = N - 3 * m + 1;
    const deviation = Math.sqrt(modifiedVarianceSum(z, m) / (6 * m * m * terms));
    const noise = noiseAt(noiseOption, m);
    const edf = greenhallEdf({ d: 2, m, phasePoints: N, overlapping: true, modified: true, noise });
    const [ciLow, ciHigh] = chiSquaredInterval(deviation, edf, confidence);
    return { m, tau: m * tau0, deviation, terms, noise, edf, ciLow, ciHigh };
  });
}
