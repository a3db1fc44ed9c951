import { MetrologyError } from '../math/metrology-error.js';
import { currencyDigits } from './currency-digits.js';

/**
 * Money as typed ("1234.5", "1 234,50", "1,234.50") to minor units, exactly (no floating point): the last
 * '.' or ',' followed by at most the currency's digits is the decimal mark; spaces, and the other mark
 * used as thousands separator, are dropped. A lone '.' before three digits is a decimal mark (refused for a
 * two-decimal currency), a lone ',' before three digits is grouping.
 *
 * @example parseMoney('1,234.50', 'EUR'); // => 123450
 * @throws {MetrologyError} 'bad_number' for anything else, or more decimals than the currency has
 */
export function parseMoney(text: string, currency: string): number {
  const digits = currencyDigits(currency);
  const compact = text.trim().replace(/[\s\u00a0\u202f]/g, '');
  // A lone '.' before three digits ("1.005") is read as a decimal mark, never as grouping, so a price with one
  // decimal too many is refused instead of becoming a thousand times larger; a lone ',' there is grouping ("1,234").
  const lonePoint = /^(\d+)\.(\d{3})$/.exec(compact);
  if (lonePoint && digits < 3) throw new MetrologyError('bad_number', `"${text}" has more than ${digits} decimals`);
  const match = /^(\d{1,3}(?:([.,])\d{3})*|\d+)(?:([.,])(\d+))?$/.exec(compact);
  if (!match || (match[2] && match[3] && match[2] === match[3])) {
    throw new MetrologyError('bad_number', `"${text}" is not an amount of money`);
  }
  const whole = match[1].replace(/[.,]/g, '');
  const fraction = match[4] ?? '';
  if (fraction.length > digits) throw new MetrologyError('bad_number', `"${text}" has more than ${digits} decimals`);
  const minor = BigInt(whole) * 10n ** BigInt(digits) + BigInt((fraction + '0'.repeat(digits)).slice(0, digits) || '0');
  if (minor > BigInt(Number.MAX_SAFE_INTEGER)) throw new MetrologyError('bad_number', `"${text}" is too large`);
  return Number(minor);
}
