import { welchFromSamples } from './welch-difference.js';

export type KeyingShift = {
  /** Mean key-down frequency − mean key-up frequency, Hz. */
  shiftHz: number;
  /** Standard error of the shift, Hz. */
  seHz: number;
  /** 95 % Welch interval of the shift, Hz. */
  low: number;
  high: number;
  df: number;
  keyUpMeanHz: number;
  keyDownMeanHz: number;
  nUp: number;
  nDown: number;
  /** Transient: largest |key-down reading − key-down mean|, Hz. */
  keyDownPeakDeviationHz: number;
};

/**
 * Keying shift (PRODUCT §5.5): mean key-down minus mean key-up frequency with its
 * standard error and 95 % Welch interval ({@link welchFromSamples}), plus the largest
 * excursion of a key-down reading from the key-down mean as a measure of the transient.
 *
 * @param keyUp frequencies with the key up, Hz (at least 2)
 * @param keyDown frequencies with the key down, Hz (at least 2)
 * @returns shift, standard error, interval and the means
 * @throws {MetrologyError} 'too_few_points', 'not_finite', 'no_spread' (no spread in either sample)
 * @example keyingShift([7e6, 7e6 + 2], [7e6 - 40, 7e6 - 38]).shiftHz; // => -40
 */
export function keyingShift(keyUp: ArrayLike<number>, keyDown: ArrayLike<number>): KeyingShift {
  const welch = welchFromSamples(keyUp, keyDown, 0.95);
  let upSum = 0;
  for (let i = 0; i < keyUp.length; i++) upSum += keyUp[i]!;
  let downSum = 0;
  for (let i = 0; i < keyDown.length; i++) downSum += keyDown[i]!;
  const keyUpMeanHz = upSum / keyUp.length;
  const keyDownMeanHz = downSum / keyDown.length;
  let peak = 0;
  for (let i = 0; i < keyDown.length; i++) peak = Math.max(peak, Math.abs(keyDown[i]! - keyDownMeanHz));
  return {
    shiftHz: welch.difference,
    seHz: welch.se,
    low: welch.low,
    high: welch.high,
    df: welch.df,
    keyUpMeanHz,
    keyDownMeanHz,
    nUp: keyUp.length,
    nDown: keyDown.length,
    keyDownPeakDeviationHz: peak,
  };
}
