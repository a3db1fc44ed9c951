import { currencyDigits } from './currency-digits.js';
import { MetrologyError } from '../math/metrology-error.js';

/**
 * Minor units as the plain text a money field starts from ("1234.50": no symbol, no grouping, every decimal of
 * the currency), which parseMoney reads back to the same minor units.
 *
 * @example moneyEditText(8500, 'EUR'); // => '85.00'
 */
export function moneyEditText(minor: number, currency: string): string {
  if (!Number.isSafeInteger(minor)) throw new MetrologyError('bad_argument', `${minor} is not a whole number of minor units`);
  const digits = currencyDigits(currency);
  const sign = minor < 0 ? '-' : '';
  const text = String(Math.abs(minor)).padStart(digits + 1, '0');
  return digits === 0 ? `${sign}${text}` : `${sign}${text.slice(0, -digits)}.${text.slice(-digits)}`;
}
