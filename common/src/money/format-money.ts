import { currencyDigits } from './currency-digits.js';

/**
 * Minor units as money for people: "€1,234.50", with the currency's own number of decimals.
 *
 * @example formatMoney(123450, 'EUR'); // => '€1,234.50'
 */
export function formatMoney(minor: number, currency: string, locale = 'en-GB'): string {
  const digits = currencyDigits(currency);
  return new Intl.NumberFormat(locale, { style: 'currency', currency, minimumFractionDigits: digits, maximumFractionDigits: digits }).format(
    minor / 10 ** digits,
  );
}
