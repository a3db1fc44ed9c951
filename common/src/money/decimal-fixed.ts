import { MetrologyError } from '../math/metrology-error.js';

/**
 * A plain decimal as typed ("1.5", "0,25", "12") to an integer count of 10^-digits, exactly (text, not floating
 * point): one '.' or ',' as the decimal mark, no grouping, no sign.
 *
 * @example parseDecimalFixed('1,5', 3, 'quantity'); // => 1500
 * @throws {MetrologyError} 'bad_number' for anything else, or more decimals than `digits`
 */
export function parseDecimalFixed(text: string, digits: number, what: string): number {
  const compact = text.trim().replace(/[\s\u00a0\u202f]/g, '');
  const match = /^(\d+)(?:[.,](\d*))?$|^[.,](\d+)$/.exec(compact);
  if (!match) throw new MetrologyError('bad_number', `"${text}" is not a ${what}`);
  const whole = match[1] ?? '0';
  const fraction = match[2] ?? match[3] ?? '';
  if (fraction.length > digits) throw new MetrologyError('bad_number', `"${text}" has more than ${digits} decimals`);
  const value = BigInt(whole) * 10n ** BigInt(digits) + BigInt((fraction + '0'.repeat(digits)).slice(0, digits) || '0');
  if (value > BigInt(Number.MAX_SAFE_INTEGER)) throw new MetrologyError('bad_number', `"${text}" is too large`);
  return Number(value);
}

/**
 * An integer count of 10^-digits as a plain decimal, trailing zeros dropped ("1.5", "2", "0.25"); the inverse of
 * parseDecimalFixed.
 *
 * @example formatDecimalFixed(1500, 3); // => '1.5'
 */
export function formatDecimalFixed(value: number, digits: number): string {
  if (!Number.isSafeInteger(value)) throw new MetrologyError('bad_argument', `${value} is not a whole count`);
  const sign = value < 0 ? '-' : '';
  const text = String(Math.abs(value)).padStart(digits + 1, '0');
  const whole = text.slice(0, text.length - digits);
  const fraction = text.slice(text.length - digits).replace(/0+$/, '');
  return `${sign}${whole}${fraction ? `.${fraction}` : ''}`;
}
