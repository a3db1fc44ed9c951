import { unitMultiplier, type FrequencyUnit } from './frequency-unit.js';
import { UnitParseError } from './unit-parse-error.js';

/**
 * Writes a frequency in a chosen unit and resolution with digit grouping: a plain
 * space (U+0020) every three digits in the integer part (from the point leftwards)
 * and in the fraction (from the point rightwards), then the unit. Rounding is
 * JavaScript's `toFixed` on the value in the chosen unit. Negative values keep their
 * sign (errors and offsets use this too); a value that rounds to zero prints unsigned.
 *
 * @param hz frequency in Hz (finite)
 * @param unit unit to print in
 * @param decimals digits after the decimal point, an integer 0 to 12
 * @returns text such as `7 001.250 kHz`
 * @throws {UnitParseError} 'not_finite' for NaN or Infinity, 'bad_number' for a bad `decimals`,
 *   'unknown_unit' for an unsupported unit
 * @example formatFrequency(7001250, 'kHz', 3); // => '7 001.250 kHz'
 */
export function formatFrequency(hz: number, unit: FrequencyUnit, decimals: number): string {
  if (typeof hz !== 'number' || !Number.isFinite(hz)) {
    throw new UnitParseError('not_finite', `formatFrequency requires a finite frequency (got ${String(hz)})`, String(hz));
  }
  if (!Number.isInteger(decimals) || decimals < 0 || decimals > 12) {
    throw new UnitParseError('bad_number', `formatFrequency requires decimals as an integer from 0 to 12 (got ${String(decimals)})`, String(decimals));
  }
  const fixed = (hz / unitMultiplier(unit)).toFixed(decimals);
  const negative = fixed.startsWith('-') && /[1-9]/.test(fixed);
  const [integerPart = '0', fractionPart = ''] = fixed.replace('-', '').split('.');
  const groupedInteger = integerPart.replace(/\B(?=(\d{3})+$)/g, ' ');
  const groupedFraction = fractionPart.replace(/(\d{3})(?=\d)/g, '$1 ');
  const number = groupedFraction === '' ? groupedInteger : `${groupedInteger}.${groupedFraction}`;
  return `${negative ? '-' : ''}${number} ${unit}`;
}
