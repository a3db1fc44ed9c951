import { resolveFactors } from './deviation-input.js';
import { assertFiniteArray, assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';
import { modifiedAdevKernel } from './modified-adev-kernel.js';
import { octaves, phaseFromFrequency, type StabilityOptions, type StabilityPoint } from './overlapping-adev.js';

/**
 * Modified Allan deviation at octave averaging factors (NIST SP 1065, Riley 2008, Eq. 15,
 * phase form):
 * Mod σ²_y(mτ0) = Σ_{j=1}^{N−3m+1} ( Σ_{i=j}^{j+m−1} (x_{i+2m} − 2x_{i+m} + x_i) )² / (2 m² τ² (N − 3m + 1)),
 * τ = mτ0, N phase points. The inner sum is carried as a running (sliding) sum ({@link modifiedVarianceSum},
 * shared with {@link timeDev}; one factor is {@link modifiedAdevKernel}), so each factor costs O(N) and all octaves O(N log N).
 * Factors run while N − 3m + 1 ≥ 1.
 *
 * Confidence interval: χ² ({@link chiSquaredInterval}) with the degrees of freedom of Greenhall's
 * algorithm, through which SP 1065 §5.3 gives the MVAR edf ({@link greenhallEdf}: d = 2, modified,
 * overlapping), for the chosen noise type.
 *
 * Checked against SP 1065 Table 30 (NBS14 data): 91.22945 and 74.78849 at m = 1, 2.
 *
 * @param y frequency data at a fixed interval
 * @param tau0 sampling interval, s
 * @param opts noise type and confidence for the interval, largest m
 * @returns one row per octave (or per factor asked for)
 * @throws {MetrologyError} 'too_few_points' (under 2 frequency points), 'not_finite', 'bad_argument', 'too_short' (a factor beyond N/3)
 * @example modifiedAdev([892, 809, 823, 798, 671, 644, 883, 903, 677], 1)[1].deviation; // => 74.78849…
 */
export function modifiedAdev(y: ArrayLike<number>, tau0: number, opts: StabilityOptions = {}): StabilityPoint[] {
  const fn = 'modifiedAdev';
  if (y.length < 2) throw new MetrologyError('too_few_points', `${fn} requires at least 2 data points`);
  assertFiniteArray(fn, 'y', y);
  assertPositive(fn, 'tau0', tau0);
  const noise = opts.noise ?? 'white_fm';
  const confidence = opts.confidence ?? 0.683;
  const x = phaseFromFrequency(y);
  const N = x.length;
  const limit = Math.min(Math.floor(N / 3), opts.maxM ?? Number.POSITIVE_INFINITY);
  const factors = opts.factors === undefined ? octaves(limit) : resolveFactors(fn, opts.factors, N / 3);
  return factors.map((m) => modifiedAdevKernel(x, m, tau0, noise, confidence));
}
