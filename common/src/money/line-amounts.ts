import { MetrologyError } from '../math/metrology-error.js';
import { divideRounded } from './divide-rounded.js';
import { MONEY_LIMITS } from './money-limits.js';

export type LineAmounts = { netMinor: number; taxMinor: number; grossMinor: number };

/**
 * The amounts of one line. Rounding is per line, halves away from zero:
 *   net   = round(quantity × unit price)            (quantity in thousandths: round(q·p / 1000))
 *   tax   = round(net × rate)                       (rate in basis points: round(net·r / 10000))
 *   gross = net + tax
 * A document's totals are the sums of its lines' rounded figures, so the printed lines always add up.
 *
 * @param quantityMilli quantity in thousandths (1.5 h = 1500), an integer ≥ 0
 * @param unitPriceMinor unit price in minor units, an integer ≥ 0
 * @param rateBasisPoints tax rate in basis points (20 % = 2000; exempt = 0)
 * @example lineAmounts(1500, 4_999, 2000); // => { netMinor: 7499, taxMinor: 1500, grossMinor: 8999 }
 * @throws {MetrologyError} 'bad_argument' for a negative, fractional or out-of-range input
 */
export function lineAmounts(quantityMilli: number, unitPriceMinor: number, rateBasisPoints: number): LineAmounts {
  check('quantityMilli', quantityMilli, MONEY_LIMITS.maxQuantityMilli);
  check('unitPriceMinor', unitPriceMinor, MONEY_LIMITS.maxUnitPriceMinor);
  check('rateBasisPoints', rateBasisPoints, MONEY_LIMITS.maxRateBasisPoints);
  const netMinor = divideRounded(BigInt(quantityMilli) * BigInt(unitPriceMinor), 1000);
  const taxMinor = divideRounded(BigInt(netMinor) * BigInt(rateBasisPoints), 10_000);
  return { netMinor, taxMinor, grossMinor: netMinor + taxMinor };
}

function check(name: string, value: number, max: number): void {
  if (!Number.isInteger(value) || value < 0 || value > max) {
    throw new MetrologyError('bad_argument', `lineAmounts requires ${name} to be a whole number from 0 to ${max} (got ${String(value)})`);
  }
}
