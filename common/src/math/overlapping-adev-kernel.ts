import { adevEdf, chiSquaredInterval, type NoiseType } from './stability-confidence.js';
import type { StabilityPoint } from './overlapping-adev.js';

/**
 * The overlapping Allan deviation at one averaging factor m from phase data (NIST SP 1065,
 * Riley 2008, Eq. 14, phase form), with its χ² interval (SP 1065 §5.3, edf of Table 5):
 * σ²_y(mτ0) = Σ_{i=1}^{N−2m} (x_{i+2m} − 2x_{i+m} + x_i)² / (2 m² τ0² (N − 2m)),
 * x in units of τ0 (see phaseFromFrequency), so τ0 cancels from the sum. O(N) per factor.
 * The one kernel behind {@link overlappingAdev} (octaves) and {@link overlappingAdevAt} (chosen τ).
 * The caller checks 1 ≤ m ≤ (N − 1)/2 and the inputs.
 *
 * @param x phase in units of τ0 (N points: frequency points + 1)
 * @param m averaging factor
 * @param tau0 sampling interval, s
 * @param noise dominant noise type for the edf
 * @param confidence two-sided confidence of the interval
 * @returns the point at τ = m·τ0
 * @example overlappingAdevKernel(phaseFromFrequency([892, 809, 823, 798, 671, 644, 883, 903, 677]), 1, 1, 'white_fm', 0.683).deviation; // => 91.22945… (SP 1065 Table 30)
 */
export function overlappingAdevKernel(x: Float64Array, m: number, tau0: number, noise: NoiseType, confidence: number): StabilityPoint {
  const N = x.length;
  const terms = N - 2 * m;
  let sum = 0;
  for (let i = 0; i < terms; i++) {
    const secondDifference = x[i + 2 * m]! - 2 * x[i + m]! + x[i]!;
    sum += secondDifference * secondDifference;
  }
  const deviation = Math.sqrt(sum / (2 * m * m * terms));
  const edf = adevEdf(N, m, noise);
  const [ciLow, ciHigh] = chiSquaredInterval(deviation, edf, confidence);
  return { m, tau: m * tau0, deviation, n: terms, edf, ciLow, ciHigh };
}
