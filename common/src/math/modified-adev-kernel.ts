import { greenhallEdf } from './greenhall-edf.js';
import { modifiedVarianceSum } from './modified-variance-sum.js';
import type { StabilityPoint } from './overlapping-adev.js';
import { chiSquaredInterval, type NoiseType } from './stability-confidence.js';

/**
 * The modified Allan deviation at one averaging factor m from phase data (NIST SP 1065, Riley 2008, Eq. 15,
 * phase form), with its χ² interval (Greenhall's edf, d = 2, modified, overlapping):
 * Mod σ²_y(mτ0) = Σ_{j=1}^{N−3m+1} ( Σ_{i=j}^{j+m−1} (x_{i+2m} − 2x_{i+m} + x_i) )² / (2 m⁴ (N − 3m + 1)),
 * x in units of τ0 (see phaseFromFrequency), so τ0 cancels from the sum. The one kernel behind
 * {@link modifiedAdev} and the stability table (which builds the phase once for every factor and noise type).
 * The caller checks 1 ≤ m ≤ N/3 and the inputs.
 *
 * @param x phase in units of τ0 (N points: frequency points + 1)
 * @param m averaging factor
 * @param tau0 sampling interval, s
 * @param noise dominant noise type for the edf
 * @param confidence two-sided confidence of the interval
 * @returns the point at τ = m·τ0
 * @example modifiedAdevKernel(phaseFromFrequency([892, 809, 823, 798, 671, 644, 883, 903, 677]), 2, 1, 'white_fm', 0.683).deviation; // => 74.78849… (SP 1065 Table 30)
 */
export function modifiedAdevKernel(x: Float64Array, m: number, tau0: number, noise: NoiseType, confidence: number): StabilityPoint {
  const N = x.length;
  const terms = N - 3 * m + 1;
  const deviation = Math.sqrt(modifiedVarianceSum(x, m) / (2 * m ** 4 * terms));
  const edf = greenhallEdf({ d: 2, m, phasePoints: N, overlapping: true, modified: true, noise });
  const [ciLow, ciHigh] = chiSquaredInterval(deviation, edf, confidence);
  return { m, tau: m * tau0, deviation, n: terms, edf, ciLow, ciHigh };
}
