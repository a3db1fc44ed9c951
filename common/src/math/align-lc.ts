import { assertFinite, assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';

export type AlignLCInput = {
  /** Frequency measured at the low-frequency end of the range, Hz. */
  lowMeasured: number;
  /** Frequency the dial mark at that end calls for, Hz. */
  lowTarget: number;
  /** Frequency measured at the high-frequency end, Hz. */
  highMeasured: number;
  highTarget: number;
  /** Capacitance across the coil at the low end as it is now, pF (optional; gives the move in pF). */
  tuningCapLowPf?: number;
  /** Frequency measured at a mid-range mark (optional; see the model). */
  midMeasured?: number;
  /** Frequency that mid-range mark calls for (optional; default the mean of the two targets). */
  midTarget?: number;
};

export type AlignLCResult = {
  /** Relative inductance change ΔL/L (e.g. −0.012 = reduce L by 1.2 %). */
  inductanceChange: number;
  /** Parallel capacitance to add (negative: remove), as a fraction of the low-end tuning capacitance. */
  parallelCapChangeFraction: number;
  /** The same in pF, null when tuningCapLowPf was not given. */
  parallelCapChangePf: number | null;
  /** Frequency the mid mark will give after both moves, minus its target, Hz. */
  predictedMidTrackingHz: number;
  /** The same as a percentage of the mid target. */
  predictedMidTrackingPercent: number;
  /** The mid target used, Hz. */
  midTargetHz: number;
};

/**
 * Two-end alignment of an LC-tuned oscillator, f = 1/(2π√(L·C)) (Thomson's formula).
 *
 * Model. C is the whole capacitance across the coil; at the low-frequency end it is
 * C_low, at the high end C_high, and the measured frequencies fix their ratio:
 * ρ = C_low/C_high = (f_high,meas / f_low,meas)². The adjustment multiplies L by
 * (1 + λ) (core slug) and adds ΔC in parallel at every setting (trimmer), δ = ΔC/C_low.
 * Both ends land on their marks when
 *   a = (f_low,meas/f_low,target)² = (1 + λ)(1 + δ)  and
 *   b = (f_high,meas/f_high,target)² = (1 + λ)(1 + δρ),
 * which solve in closed form to δ = (b − a)/(aρ − b), 1 + λ = a/(1 + δ).
 *
 * Mid-range tracking. The mid mark is the one whose target is midTarget (default the
 * mean of the two targets). Its frequency now is midMeasured if given, otherwise it is
 * taken halfway between the two measured end frequencies (the present error varies
 * linearly along the dial). Its capacitance follows from the LC law,
 * C_mid/C_low = (f_low,meas/f_mid,meas)², and after the moves it gives
 * f_mid' = f_mid,meas / √((1 + λ)(1 + δ·C_low/C_mid)); the tracking error is f_mid' − midTarget.
 *
 * @param input measured and target frequencies at both ends (Hz), optional pF and mid point
 * @returns relative L change, parallel C change (fraction and pF), predicted mid tracking error
 * With both ends in order (high above low, measured and target) a solution always exists and
 * keeps every capacitance positive; it may still be impractically large, so look at the sizes.
 *
 * @throws {MetrologyError} 'bad_frequency' (a frequency ≤ 0 or not finite, or the ends in the
 *   wrong order), 'no_convergence' (a degenerate case lost to rounding: no usable solution)
 * @example alignLC({ lowMeasured: 1.735e6, lowTarget: 1.75e6, highMeasured: 1.99e6, highTarget: 2.0e6 });
 */
export function alignLC(input: AlignLCInput): AlignLCResult {
  const fn = 'alignLC';
  const { lowMeasured, lowTarget, highMeasured, highTarget } = input;
  assertPositive(fn, 'lowMeasured', lowMeasured, 'bad_frequency');
  assertPositive(fn, 'lowTarget', lowTarget, 'bad_frequency');
  assertPositive(fn, 'highMeasured', highMeasured, 'bad_frequency');
  assertPositive(fn, 'highTarget', highTarget, 'bad_frequency');
  if (!(highMeasured > lowMeasured) || !(highTarget > lowTarget)) {
    throw new MetrologyError('bad_frequency', `${fn} requires the high end above the low end, both measured and target`);
  }
  if (input.tuningCapLowPf !== undefined) assertPositive(fn, 'tuningCapLowPf', input.tuningCapLowPf);

  const a = (lowMeasured / lowTarget) ** 2;
  const b = (highMeasured / highTarget) ** 2;
  const rho = (highMeasured / lowMeasured) ** 2;
  const denominator = a * rho - b;
  if (Math.abs(denominator) <= 1e-12 * a * rho) {
    throw new MetrologyError('no_convergence', `${fn}: the targets ask for a frequency ratio the LC law cannot give with L and a parallel trimmer`);
  }
  const delta = (b - a) / denominator;
  if (!(1 + delta > 0) || !(1 + delta * rho > 0)) {
    throw new MetrologyError('no_convergence', `${fn}: reaching both marks would need a negative total capacitance; check the readings and targets`);
  }
  const inductanceFactor = a / (1 + delta);

  const midTargetHz = input.midTarget ?? (lowTarget + highTarget) / 2;
  const midMeasured = input.midMeasured ?? (lowMeasured + highMeasured) / 2;
  assertPositive(fn, 'midTarget', midTargetHz, 'bad_frequency');
  assertPositive(fn, 'midMeasured', midMeasured, 'bad_frequency');
  const lowOverMid = (midMeasured / lowMeasured) ** 2; // C_low / C_mid
  const midAfter = midMeasured / Math.sqrt(inductanceFactor * (1 + delta * lowOverMid));
  const tracking = midAfter - midTargetHz;
  return {
    inductanceChange: inductanceFactor - 1,
    parallelCapChangeFraction: delta,
    parallelCapChangePf: input.tuningCapLowPf === undefined ? null : delta * input.tuningCapLowPf,
    predictedMidTrackingHz: tracking,
    predictedMidTrackingPercent: (tracking / midTargetHz) * 100,
    midTargetHz,
  };
}

/**
 * Parallel (shunt) capacitance that moves an LC circuit from f1 to f2, from
 * f = 1/(2π√(LC)) with L fixed: f2 = f1·√(C/(C + Cp)), so Cp = C·((f1/f2)² − 1).
 * Negative when f2 > f1 (capacitance must be removed).
 *
 * @param f1 present frequency, Hz
 * @param f2 wanted frequency, Hz
 * @param tuningCapPf capacitance across the coil now, pF
 * @returns capacitance to add in parallel, pF
 * @throws {MetrologyError} 'bad_frequency' or 'bad_argument' for values ≤ 0 or not finite
 * @example paddingForShift(7e6, 6e6, 74.8); // => 27.01… (pF)
 */
export function paddingForShift(f1: number, f2: number, tuningCapPf: number): number {
  const fn = 'paddingForShift';
  assertPositive(fn, 'f1', f1, 'bad_frequency');
  assertPositive(fn, 'f2', f2, 'bad_frequency');
  assertPositive(fn, 'the tuning capacitance', tuningCapPf);
  return tuningCapPf * ((f1 / f2) ** 2 - 1);
}

/**
 * Frequency after a capacitance Cp is put in parallel with C (f = 1/(2π√(LC)), L fixed):
 * f = f1·√(C/(C + Cp)).
 *
 * @param f1 frequency without it, Hz
 * @param tuningCapPf capacitance across the coil without it, pF
 * @param padderPf added parallel capacitance, pF (negative: removed; C + Cp must stay > 0)
 * @returns new frequency, Hz
 * @throws {MetrologyError} 'bad_frequency', 'bad_argument' (C + Cp ≤ 0 or values not finite)
 * @example frequencyWithPadder(7e6, 74.8, 27); // => 6 000 3xx Hz
 */
export function frequencyWithPadder(f1: number, tuningCapPf: number, padderPf: number): number {
  const fn = 'frequencyWithPadder';
  assertPositive(fn, 'f1', f1, 'bad_frequency');
  assertPositive(fn, 'the tuning capacitance', tuningCapPf);
  assertFinite(fn, 'the padder capacitance', padderPf);
  if (!(tuningCapPf + padderPf > 0)) {
    throw new MetrologyError('bad_argument', `${fn} requires the total capacitance to stay above zero (got ${tuningCapPf} + ${padderPf} pF)`);
  }
  return f1 * Math.sqrt(tuningCapPf / (tuningCapPf + padderPf));
}
