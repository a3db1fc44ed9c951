import { formatDecimalFixed, parseDecimalFixed } from './decimal-fixed.js';

/**
 * A tax rate typed in percent ("20", "17.5", "5,25") to basis points (hundredths of a percent), exactly.
 *
 * @example parseRatePercent('17.5'); // => 1750
 * @throws {MetrologyError} 'bad_number' for anything but a plain decimal with at most two decimals
 */
export function parseRatePercent(text: string): number {
  return parseDecimalFixed(text.replace(/%\s*$/, ''), 2, 'percentage');
}

/** Basis points as a percentage people read: 2000 → "20 %", 1750 → "17.5 %". */
export function formatRatePercent(basisPoints: number): string {
  return `${formatDecimalFixed(basisPoints, 2)} %`;
}
