import jstat from 'jstat';
import { MetrologyError } from './metrology-error.js';

/** Dominant power-law noise type assumed for the confidence interval. */
export type NoiseType = 'white_pm' | 'flicker_pm' | 'white_fm' | 'flicker_fm' | 'random_walk_fm';

/**
 * Equivalent degrees of freedom of an overlapping Allan variance estimate, by the
 * simple approximations of NIST SP 1065 (Riley 2008) Table 5, after Howe, Allan &
 * Barnes (1981); N = number of phase points, m = averaging factor:
 * - white PM: (N + 1)(N − 2m) / (2(N − m))
 * - flicker PM: exp(√(ln((N − 1)/(2m)) · ln((2m + 1)(N − 1)/4)))
 * - white FM: (3(N − 1)/(2m) − 2(N − 2)/N) · 4m²/(4m² + 5)
 * - flicker FM: 2(N − 2)²/(2.3N − 4.9) for m = 1, 5N²/(4m(N + 3m)) for m ≥ 2
 * - random-walk FM: (N − 2)/m · ((N − 1)² − 3m(N − 1) + 4m²)/(N − 3)²
 * The result is kept at 1 or more (the formulas can fall below that at the last octave).
 *
 * @param phasePoints N, number of phase points (frequency points + 1)
 * @param m averaging factor
 * @param noise dominant noise type
 * @returns equivalent degrees of freedom (≥ 1)
 * @throws {MetrologyError} 'bad_argument' for N < 3, m < 1 or 2m > N − 1
 * @example adevEdf(10, 1, 'white_fm'); // => 5.2888… ((13.5 − 1.6)·4/9 = 47.6/9)
 */
export function adevEdf(phasePoints: number, m: number, noise: NoiseType): number {
  const N = phasePoints;
  if (!(Number.isInteger(N) && Number.isInteger(m) && N >= 3 && m >= 1 && 2 * m <= N - 1)) {
    throw new MetrologyError('bad_argument', `adevEdf requires integers N ≥ 3 and 1 ≤ m ≤ (N − 1)/2 (got N = ${N}, m = ${m})`);
  }
  let edf: number;
  switch (noise) {
    case 'white_pm':
      edf = ((N + 1) * (N - 2 * m)) / (2 * (N - m));
      break;
    case 'flicker_pm':
      edf = Math.exp(Math.sqrt(Math.max(Math.log((N - 1) / (2 * m)), 0) * Math.log(((2 * m + 1) * (N - 1)) / 4)));
      break;
    case 'white_fm':
      edf = ((3 * (N - 1)) / (2 * m) - (2 * (N - 2)) / N) * ((4 * m * m) / (4 * m * m + 5));
      break;
    case 'flicker_fm':
      edf = m === 1 ? (2 * (N - 2) ** 2) / (2.3 * N - 4.9) : (5 * N * N) / (4 * m * (N + 3 * m));
      break;
    case 'random_walk_fm':
      edf = N <= 3 ? 1 : ((N - 2) / m) * (((N - 1) ** 2 - 3 * m * (N - 1) + 4 * m * m) / (N - 3) ** 2);
      break;
    default:
      throw new MetrologyError('bad_argument', `adevEdf: unknown noise type '${String(noise)}'`);
  }
  return Number.isFinite(edf) ? Math.max(edf, 1) : 1;
}

/**
 * Chi-squared confidence interval of a deviation (NIST SP 1065 §5.3.1):
 * σ·√(edf/χ²(1 − α/2, edf)) ≤ σ_true ≤ σ·√(edf/χ²(α/2, edf)), α = 1 − confidence,
 * χ² quantiles from jstat.
 *
 * @param deviation estimated deviation (≥ 0)
 * @param edf equivalent degrees of freedom (> 0)
 * @param confidence two-sided confidence, 0 < p < 1
 * @returns [low, high]
 * @throws {MetrologyError} 'bad_argument' for edf ≤ 0 or confidence outside (0, 1)
 * @example chiSquaredInterval(91.22945, 5.2889, 0.683); // => [~70, ~130]
 */
export function chiSquaredInterval(deviation: number, edf: number, confidence: number): [number, number] {
  if (!(edf > 0) || !(confidence > 0 && confidence < 1)) {
    throw new MetrologyError('bad_argument', `chiSquaredInterval requires edf > 0 and 0 < confidence < 1 (got ${edf}, ${confidence})`);
  }
  const alpha = 1 - confidence;
  const upperQuantile = jstat.chisquare.inv(1 - alpha / 2, edf);
  const lowerQuantile = jstat.chisquare.inv(alpha / 2, edf);
  return [deviation * Math.sqrt(edf / upperQuantile), deviation * Math.sqrt(edf / lowerQuantile)];
}
