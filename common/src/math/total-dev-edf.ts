import { MetrologyError } from './metrology-error.js';
import { adevEdf, type NoiseType } from './stability-confidence.js';

/**
 * Coefficients (b, c) of the total-variance edf, NIST SP 1065 (Riley 2008) §5.3 (total-variance confidence), Table 7, for the
 * FM noises. Entered from a secondary transcription of the table, not read from the publication
 * itself: check them (in particular the sign of c for random-walk FM) against a copy of SP 1065.
 */
export const TOTAL_DEV_EDF_COEFFICIENTS: Readonly<Partial<Record<NoiseType, readonly [number, number]>>> = Object.freeze({
  white_fm: [1.5, 0],
  flicker_fm: [1.17, 0.22],
  random_walk_fm: [0.93, 0.36],
});

/**
 * Equivalent degrees of freedom of a total-deviation estimate (NIST SP 1065, Riley 2008, §5.3,
 * Table 7): edf = b·(T/τ) − c, with T = (N − 1)τ0 the length of the phase record and τ = mτ0,
 * so T/τ = (N − 1)/m, and (b, c) = (1.50, 0) white FM, (1.17, 0.22) flicker FM, (0.93, 0.36)
 * random-walk FM. SP 1065 gives no total-variance edf for white or flicker PM (the total deviation
 * is meant for the FM noises at long τ); for those the overlapping-ADEV edf of SP 1065 Table 5
 * ({@link adevEdf}) is used, the estimator being the overlapping ADEV away from the ends.
 * The result is kept at 1 or more.
 *
 * @param phasePoints N, number of phase points
 * @param m averaging factor
 * @param noise dominant noise type
 * @returns equivalent degrees of freedom (≥ 1)
 * @throws {MetrologyError} 'bad_argument' (N < 3, m not a whole number in 1 … (N − 1)/2, unknown noise)
 * @example totalDevEdf(1001, 10, 'white_fm'); // => 150
 */
export function totalDevEdf(phasePoints: number, m: number, noise: NoiseType): number {
  const N = phasePoints;
  if (!(Number.isInteger(N) && Number.isInteger(m) && N >= 3 && m >= 1 && 2 * m <= N - 1)) {
    throw new MetrologyError('bad_argument', `totalDevEdf requires integers N ≥ 3 and 1 ≤ m ≤ (N − 1)/2 (got N = ${N}, m = ${m})`);
  }
  if (noise === 'white_pm' || noise === 'flicker_pm') return adevEdf(N, m, noise);
  const coefficients = TOTAL_DEV_EDF_COEFFICIENTS[noise];
  if (coefficients === undefined) throw new MetrologyError('bad_argument', `totalDevEdf: unknown noise type '${String(noise)}'`);
  const [b, c] = coefficients;
  return Math.max(b * ((N - 1) / m) - c, 1);
}
