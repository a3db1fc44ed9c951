/**
 * How many minor-unit digits a currency has (2 for EUR, 0 for JPY), from the runtime's ISO 4217 data
 * (Intl), so "minor units" means the same on the server, in the browser and at the payment service.
 *
 * @example currencyDigits('EUR'); // => 2
 */
export function currencyDigits(currency: string): number {
  return new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
}
