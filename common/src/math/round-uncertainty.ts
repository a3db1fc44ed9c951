import { assertFinite } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/**
 * Number of decimal places at which an uncertainty rounded to two significant digits
 * ends (negative: tens, hundreds …). 0.0123 → 4, 1.23 → 1, 123 → −1.
 */
function twoDigitDecimals(value: number): number {
  return 1 - Math.floor(Math.log10(value));
}

/**
 * Rounds an expanded uncertainty to two significant digits (GUM 7.2.6: "at most two
 * significant digits"), by ordinary rounding, half away from zero, on the decimal value
 * (the value is first cleaned to 12 significant digits so binary noise such as
 * 0.014999999999999999 does not decide the rounding). Rounding up is not applied: the
 * convention is stated so a certificate can print it.
 *
 * @param U expanded uncertainty, > 0
 * @returns U with two significant digits
 * @throws {MetrologyError} 'not_finite', 'bad_argument' (U ≤ 0)
 * @example roundUncertainty(0.01234); // => 0.012
 * @example roundUncertainty(1.25); // => 1.3
 */
export function roundUncertainty(U: number): number {
  assertFinite('roundUncertainty', 'U', U);
  if (!(U > 0)) throw new MetrologyError('bad_argument', `roundUncertainty requires U greater than zero (got ${U})`);
  const clean = Number(U.toPrecision(12));
  return roundAt(clean, twoDigitDecimals(clean));
}

/**
 * Rounds a result to the last digit of its uncertainty (GUM 7.2.6): U to two significant
 * digits ({@link roundUncertainty}), then x to the same decimal place.
 *
 * @param x measured value
 * @param U its expanded uncertainty, > 0
 * @returns rounded value and uncertainty, and `decimals`, the decimal places to print
 *   (negative means rounding to tens, hundreds …; print with Math.max(0, decimals) places)
 * @throws {MetrologyError} 'not_finite', 'bad_argument' (U ≤ 0)
 * @example roundResultToUncertainty(1_735_012.3456, 0.834); // => { value: 1735012.35, uncertainty: 0.83, decimals: 2 }
 */
export function roundResultToUncertainty(x: number, U: number): { value: number; uncertainty: number; decimals: number } {
  assertFinite('roundResultToUncertainty', 'x', x);
  const uncertainty = roundUncertainty(U);
  const decimals = twoDigitDecimals(uncertainty);
  return { value: roundAt(x, decimals), uncertainty, decimals };
}

// Half away from zero at a decimal place. The scaled value is cleaned to 15 significant
// digits first so a decimal tie stored as 0.4999… in binary still rounds away from zero.
function roundAt(value: number, decimals: number): number {
  const sign = value < 0 ? -1 : 1;
  const magnitude = Math.abs(value);
  const shifted = Number((decimals >= 0 ? magnitude * 10 ** decimals : magnitude / 10 ** -decimals).toPrecision(15));
  const rounded = Math.floor(shifted + 0.5);
  return sign * (decimals >= 0 ? rounded / 10 ** decimals : rounded * 10 ** -decimals);
}
