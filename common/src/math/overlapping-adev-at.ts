import { assertFiniteArray, assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';
import { phaseFromFrequency, type StabilityOptions, type StabilityPoint } from './overlapping-adev.js';
import { overlappingAdevKernel } from './overlapping-adev-kernel.js';

/** Averaging times this close (relative) to a whole multiple of τ0 count as that multiple. */
const WHOLE_MULTIPLE_TOLERANCE = 1e-6;

/**
 * Overlapping Allan deviation at chosen averaging times τ (e.g. 1 s, 10 s, 100 s) rather than at
 * octaves, by the same estimator as {@link overlappingAdev} (NIST SP 1065, Riley 2008, Eq. 14,
 * phase form, phase built by summing the frequency data):
 * σ²_y(mτ0) = Σ_{i=1}^{N−2m} (x_{i+2m} − 2x_{i+m} + x_i)² / (2 m² τ0² (N − 2m)), m = τ/τ0,
 * with the χ² interval of SP 1065 §5.3 and the Table 5 edf for the chosen noise type.
 * An averaging time the data cannot give is answered with null: τ not a whole multiple of τ0
 * (within 1e-6), or m above (N − 1)/2 (fewer than one second difference).
 *
 * @param y frequency data at the fixed interval τ0 (fractional frequency, or Hz)
 * @param tau0 sampling interval, s
 * @param taus averaging times wanted, s (each > 0)
 * @param opts noise type and confidence for the interval (maxM is ignored)
 * @returns one entry per wanted τ, in order: the point, or null where the data do not allow it
 * @throws {MetrologyError} 'too_few_points' (under 2 frequency points), 'not_finite',
 *   'bad_argument' (τ0 or a τ ≤ 0, confidence outside (0, 1))
 * @example overlappingAdevAt([892, 809, 823, 798, 671, 644, 883, 903, 677], 1, [1, 3])[0]?.deviation; // => 91.22945…
 */
export function overlappingAdevAt(y: ArrayLike<number>, tau0: number, taus: readonly number[], opts: StabilityOptions = {}): Array<StabilityPoint | null> {
  const fn = 'overlappingAdevAt';
  if (y.length < 2) throw new MetrologyError('too_few_points', `${fn} requires at least 2 data points`);
  assertFiniteArray(fn, 'y', y);
  assertPositive(fn, 'tau0', tau0);
  for (const tau of taus) assertPositive(fn, 'each averaging time', tau);
  const noise = opts.noise ?? 'white_fm';
  const confidence = opts.confidence ?? 0.683;
  const x = phaseFromFrequency(y);
  const N = x.length;
  return taus.map((tau) => {
    const ratio = tau / tau0;
    const m = Math.round(ratio);
    if (m < 1 || Math.abs(ratio - m) > WHOLE_MULTIPLE_TOLERANCE * ratio) return null;
    if (2 * m > N - 1) return null;
    return overlappingAdevKernel(x, m, tau0, noise, confidence);
  });
}
