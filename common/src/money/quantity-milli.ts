import { formatDecimalFixed, parseDecimalFixed } from './decimal-fixed.js';

/**
 * A quantity as typed ("1.5" hours, "3" ranges, "0,25") to the integer thousandths lines carry, exactly.
 *
 * @example parseQuantityMilli('1.25'); // => 1250
 * @throws {MetrologyError} 'bad_number' for anything but a plain decimal with at most three decimals
 */
export function parseQuantityMilli(text: string): number {
  return parseDecimalFixed(text, 3, 'quantity');
}

/** Thousandths as the quantity people read: 1500 → "1.5", 3000 → "3". */
export function formatQuantityMilli(milli: number): string {
  return formatDecimalFixed(milli, 3);
}
