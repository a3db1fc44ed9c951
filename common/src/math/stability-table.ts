import { decades } from './decades.js';
import { detrendPhaseInPlace, type DeviationPoint } from './deviation-input.js';
import { assertFiniteArray, assertPositive } from './guards.js';
import { hadamardDevOfDetrended } from './hadamard-dev.js';
import { checkNoiseInput, identifyCheckedNoise } from './identify-noise.js';
import { MetrologyError } from './metrology-error.js';
import { modifiedAdevKernel } from './modified-adev-kernel.js';
import { octaves, phaseFromFrequency, type StabilityPoint } from './overlapping-adev.js';
import { overlappingAdevKernel } from './overlapping-adev-kernel.js';
import { phaseFromFractionalFrequency } from './phase-from-fractional-frequency.js';
import type { NoiseType } from './stability-confidence.js';
import { timeDevOfDetrended } from './time-dev.js';
import { totalDevOfDetrended } from './total-dev.js';

/** The deviations of a stability table, in the order they are shown. */
export const TABLE_DEVIATIONS = ['adev', 'mdev', 'hdev', 'tdev', 'totdev'] as const;
export type TableDeviation = (typeof TABLE_DEVIATIONS)[number];

/** The noise named at one averaging factor, or why none could be. */
export type NoiseAtFactor =
  { status: 'identified'; noise: NoiseType; method: 'lag1_acf' | 'b1_ratio'; alternatives: NoiseType[] } | { status: 'too_short'; message: string };

/** One deviation at one averaging time. */
export type DeviationValue = {
  deviation: number;
  /** Number of terms summed. */
  terms: number;
  /** Equivalent degrees of freedom for the row's edfNoise. */
  edf: number;
  /** χ² interval at the table's confidence. */
  ciLow: number;
  ciHigh: number;
};

export type StabilityTableRow = {
  /** Averaging factor; τ = m·τ0. */
  m: number;
  tau: number;
  noise: NoiseAtFactor;
  /** Noise type the degrees of freedom (and so the intervals) were taken for. */
  edfNoise: NoiseType;
  /** 'identified' at this τ; 'shorter_tau': too short here, so the type named at the nearest shorter τ; 'white_fm_default': none named at all. */
  edfNoiseFrom: 'identified' | 'shorter_tau' | 'white_fm_default';
  /** null where the record is too short for that deviation at this τ (each has its own limit, below). */
  adev: DeviationValue | null;
  mdev: DeviationValue | null;
  hdev: DeviationValue | null;
  tdev: DeviationValue | null;
  totdev: DeviationValue | null;
};

export type StabilityTableOptions = {
  /** Averaging factors wanted; each a whole number from 1 to {@link stabilityFactorLimit}. Default: `spacing`. */
  factors?: readonly number[];
  /** Octaves (default) or 1-2-5 decades up to the limit, when no factors are given. */
  spacing?: 'octaves' | 'decades';
  /** Two-sided confidence of every interval; default 0.95. */
  confidence?: number;
};

/**
 * Largest averaging factor of each deviation for M frequency points (N = M + 1 phase points), as each
 * function states it: overlapping ADEV and total deviation (N − 1)/2, modified ADEV and time deviation
 * N/3, overlapping Hadamard deviation (N − 1)/3.
 */
const LIMITS: Readonly<Record<TableDeviation, (M: number) => number>> = {
  adev: (M) => M / 2,
  mdev: (M) => (M + 1) / 3,
  hdev: (M) => M / 3,
  tdev: (M) => (M + 1) / 3,
  totdev: (M) => M / 2,
};

/**
 * The largest averaging factor a stability table can hold for M frequency points: ⌊M/2⌋, the last one the
 * overlapping Allan and total deviations give (the others stop sooner and are left empty there).
 *
 * @param frequencyPoints M
 * @returns ⌊M/2⌋
 * @example stabilityFactorLimit(1000); // => 500
 */
export function stabilityFactorLimit(frequencyPoints: number): number {
  return Math.floor(frequencyPoints / 2);
}

const roundTau = (tau: number) => Number(tau.toPrecision(9));

/**
 * A stability table of fractional-frequency data: at each averaging factor the overlapping Allan
 * ({@link overlappingAdev}), modified Allan ({@link modifiedAdev}), overlapping Hadamard
 * ({@link hadamardDev}), time ({@link timeDev}) and total ({@link totalDev}) deviations of NIST SP 1065
 * (Riley 2008) §5.2, each with its number of terms, its equivalent degrees of freedom and χ² interval
 * for the noise type named at that τ by {@link identifyNoise} (lag-1 autocorrelation, B1 ratio where
 * few points remain). Where the data are too short to name one, the type named at the nearest shorter τ
 * is used (white FM when none was named), and the row says so. The phase for the Hadamard, time and total
 * deviations is x = Σ y·τ0 ({@link phaseFromFractionalFrequency}), so the time deviation is in seconds.
 * No drift is removed here (see removeLinearFrequencyDrift).
 *
 * @param y fractional frequency at a fixed interval τ0, at least 3 points
 * @param tau0 sampling interval, s
 * @param opts averaging factors (or octaves / decades), confidence
 * @returns one row per factor, in the order asked (octaves or decades ascending)
 * @throws {MetrologyError} 'too_few_points' (under 3), 'not_finite', 'bad_argument' (τ0 ≤ 0, a factor not a whole
 *   number ≥ 1, confidence outside (0, 1)), 'too_short' (a factor beyond ⌊M/2⌋: the message names its τ)
 * @example stabilityTable(sp1065Suite, 1, { factors: [1, 10, 100] })[1].hdev.deviation; // => 9.581083e-2 (SP 1065 Table 31)
 */
export function stabilityTable(y: ArrayLike<number>, tau0: number, opts: StabilityTableOptions = {}): StabilityTableRow[] {
  const fn = 'stabilityTable';
  const M = y.length;
  if (M < 3) throw new MetrologyError('too_few_points', `${fn} requires at least 3 frequency points (got ${M})`);
  assertFiniteArray(fn, 'y', y);
  assertPositive(fn, 'tau0', tau0);
  const confidence = opts.confidence ?? 0.95;
  if (!(confidence > 0 && confidence < 1)) throw new MetrologyError('bad_argument', `${fn} requires a confidence between 0 and 1 (got ${confidence})`);
  const limit = stabilityFactorLimit(M);
  const factors = opts.factors ? [...opts.factors] : opts.spacing === 'decades' ? decades(limit) : octaves(limit);
  for (const m of factors) {
    if (!(Number.isInteger(m) && m >= 1)) throw new MetrologyError('bad_argument', `${fn} requires whole averaging factors of 1 or more (got ${m})`);
    if (m > limit) {
      throw new MetrologyError(
        'too_short',
        `τ = ${roundTau(m * tau0)} s (m = ${m}) is too long for this record: ${M} readings at τ0 = ${roundTau(tau0)} s give at most τ = ${roundTau(limit * tau0)} s (m = ${limit})`,
      );
    }
  }

  // Noise at each factor, then the type the degrees of freedom use (carried up from the nearest shorter τ where too short).
  const idPhase = phaseFromFrequency(y);
  checkNoiseInput(idPhase);
  const named = new Map<number, NoiseAtFactor>();
  const edfNoise = new Map<number, { noise: NoiseType; from: StabilityTableRow['edfNoiseFrom'] }>();
  let previous: NoiseType | null = null;
  for (const m of [...new Set(factors)].sort((a, b) => a - b)) {
    const id = identifyCheckedNoise(idPhase, m);
    if (id.status === 'identified') {
      named.set(m, { status: 'identified', noise: id.noise, method: id.method, alternatives: id.method === 'b1_ratio' ? id.alternatives : [] });
      edfNoise.set(m, { noise: id.noise, from: 'identified' });
      previous = id.noise;
    } else {
      named.set(m, { status: 'too_short', message: id.message });
      edfNoise.set(m, previous ? { noise: previous, from: 'shorter_tau' } : { noise: 'white_fm', from: 'white_fm_default' });
    }
  }
  const noiseOf = (m: number) => edfNoise.get(m)!.noise;
  const within = (deviation: TableDeviation) => [...new Set(factors)].filter((m) => m <= LIMITS[deviation](M));

  // ADEV and MDEV by their one-factor kernels on the phase built above for the noise identification: the phase
  // overlappingAdev and modifiedAdev build from y themselves (the same numbers), built once rather than once per
  // call, and each factor with its own noise type.
  const byNoise = (deviation: 'adev' | 'mdev'): Map<number, StabilityPoint> => {
    const kernel = deviation === 'adev' ? overlappingAdevKernel : modifiedAdevKernel;
    return new Map(within(deviation).map((m) => [m, kernel(idPhase, m, tau0, noiseOf(m), confidence)]));
  };
  // The phase in seconds for the Hadamard, time and total deviations, checked and detrended once for the three, in
  // place (each function does both itself, into a copy, when called alone: the same checks and the same numbers).
  const z = phaseFromFractionalFrequency(y, tau0);
  assertFiniteArray(fn, 'the phase', z);
  detrendPhaseInPlace(z);
  const byFactor = (points: DeviationPoint[]) => new Map(points.map((p) => [p.m, p]));
  const adev = byNoise('adev');
  const mdev = byNoise('mdev');
  const hdev = byFactor(hadamardDevOfDetrended(z, tau0, within('hdev'), noiseOf, confidence, true));
  const tdev = byFactor(timeDevOfDetrended(z, tau0, within('tdev'), noiseOf, confidence));
  const totdev = byFactor(totalDevOfDetrended(z, tau0, within('totdev'), noiseOf, confidence));
  const fromStability = (p: StabilityPoint | undefined): DeviationValue | null =>
    p ? { deviation: p.deviation, terms: p.n, edf: p.edf, ciLow: p.ciLow, ciHigh: p.ciHigh } : null;
  const fromPhase = (p: DeviationPoint | undefined): DeviationValue | null =>
    p ? { deviation: p.deviation, terms: p.terms, edf: p.edf, ciLow: p.ciLow, ciHigh: p.ciHigh } : null;
  return factors.map((m) => ({
    m,
    tau: roundTau(m * tau0),
    noise: named.get(m)!,
    edfNoise: noiseOf(m),
    edfNoiseFrom: edfNoise.get(m)!.from,
    adev: fromStability(adev.get(m)),
    mdev: fromStability(mdev.get(m)),
    hdev: fromPhase(hdev.get(m)),
    tdev: fromPhase(tdev.get(m)),
    totdev: fromPhase(totdev.get(m)),
  }));
}
