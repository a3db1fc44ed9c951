import type { WarmupFit } from './fit-warmup.js';
import { assertFiniteArray } from './guards.js';
import { MetrologyError } from './metrology-error.js';
import { invertSmall } from './small-linear-algebra.js';

/** Parameter order of {@link warmupCovariance}: f∞, A (at t = 0), τ, then c when the fit has a linear term. */
export type WarmupCovariance = { parameters: Array<'fInf' | 'amplitude' | 'tau' | 'linear'>; matrix: number[][]; df: number };

/**
 * Covariance matrix of a warm-up fit's parameters, the asymptotic least-squares one
 * (Seber & Wild 1989, Nonlinear Regression, §2.1.2; the same s²·(JᵀJ)⁻¹ that {@link fitWarmup} takes
 * its standard errors from): C = s²·(JᵀJ)⁻¹ with s the fit's residual SD and J the Jacobian of
 * f(t) = f∞ + A·e^(−t/τ) (+ c·t) at the fitted values over every reading:
 * ∂f/∂f∞ = 1, ∂f/∂A = e^(−t/τ), ∂f/∂τ = A·t·e^(−t/τ)/τ², ∂f/∂c = t.
 * JᵀJ is scaled to unit diagonal before inversion (Jacobi scaling), so records of a million seconds
 * keep their precision. The diagonal reproduces the fit's own standard errors; the off-diagonal terms
 * (τ and A are usually strongly correlated) are what a derived quantity such as the settling time
 * needs for its uncertainty. Degrees of freedom ν = n − p.
 *
 * @param t the times the fit was made on, s since power-on
 * @param fit the result of fitWarmup on those times
 * @returns parameter names, the p × p covariance matrix in physical units, and ν
 * @throws {MetrologyError} 'not_finite', 'length_mismatch' (t.length differs from fit.n),
 *   'no_convergence' (JᵀJ numerically singular)
 * @example warmupCovariance(t, fitWarmup(t, f)).matrix[2][2]; // => fit.seTau²
 */
export function warmupCovariance(t: ArrayLike<number>, fit: WarmupFit): WarmupCovariance {
  const fn = 'warmupCovariance';
  assertFiniteArray(fn, 't', t);
  if (t.length !== fit.n) throw new MetrologyError('length_mismatch', `${fn} requires the ${fit.n} times the fit was made on (got ${t.length})`);
  const linear = fit.linear !== null;
  const p = linear ? 4 : 3;
  const jtj = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  const row = new Array<number>(p).fill(0);
  for (let i = 0; i < t.length; i++) {
    const time = t[i]!;
    const e = Math.exp(-time / fit.tau);
    row[0] = 1;
    row[1] = e;
    row[2] = (fit.amplitude * time * e) / (fit.tau * fit.tau);
    if (linear) row[3] = time;
    for (let j = 0; j < p; j++) for (let k = j; k < p; k++) jtj[j]![k]! += row[j]! * row[k]!;
  }
  for (let j = 0; j < p; j++) for (let k = 0; k < j; k++) jtj[j]![k] = jtj[k]![j]!;
  const scale = jtj.map((line, j) => 1 / Math.sqrt(line[j]!));
  if (!scale.every(Number.isFinite)) throw new MetrologyError('no_convergence', `${fn}: a parameter has no influence on the fit`);
  const scaled = jtj.map((line, j) => line.map((value, k) => value * scale[j]! * scale[k]!));
  const inverse = invertSmall(scaled);
  if (inverse === null) throw new MetrologyError('no_convergence', `${fn}: the parameters cannot be told apart by these readings`);
  const variance = fit.residualSd * fit.residualSd;
  const matrix = inverse.map((line, j) => line.map((value, k) => value * scale[j]! * scale[k]! * variance));
  return { parameters: linear ? ['fInf', 'amplitude', 'tau', 'linear'] : ['fInf', 'amplitude', 'tau'], matrix, df: fit.n - p };
}
