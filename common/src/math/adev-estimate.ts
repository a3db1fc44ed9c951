import { MetrologyError } from './metrology-error.js';
import type { StabilityPoint } from './overlapping-adev.js';
import type { Estimate } from './welch-from-estimates.js';

/**
 * An Allan deviation as an estimate with a standard error, for {@link welchFromEstimates}.
 * The variance estimate is χ²-distributed with the equivalent degrees of freedom ν = edf
 * (NIST SP 1065 §5.3): σ̂² ~ σ²·χ²_ν/ν, so Var(σ̂²) = 2σ⁴/ν and, by the first-order delta method
 * for σ̂ = √σ̂², se(σ̂) ≈ σ/√(2ν), with ν carried as the degrees of freedom.
 * The χ² interval of the point itself stays the better description of one deviation (it is not
 * symmetric); this form serves only to set two deviations side by side.
 *
 * @param point an Allan deviation point (deviation ≥ 0, edf > 0)
 * @returns { value: σ, se: σ/√(2·edf), df: edf }
 * @throws {MetrologyError} 'bad_argument' for a negative or non-finite deviation or edf ≤ 0
 * @example adevEstimate({ m: 1, tau: 1, deviation: 2e-9, n: 99, edf: 50, ciLow: 0, ciHigh: 0 }).se; // => 2e-10
 */
export function adevEstimate(point: Pick<StabilityPoint, 'deviation' | 'edf'>): Estimate {
  if (!(point.deviation >= 0) || !Number.isFinite(point.deviation) || !(point.edf > 0)) {
    throw new MetrologyError(
      'bad_argument',
      `adevEstimate requires a deviation of zero or more and edf greater than zero (got ${point.deviation}, ${point.edf})`,
    );
  }
  return { value: point.deviation, se: point.deviation / Math.sqrt(2 * point.edf), df: point.edf };
}
