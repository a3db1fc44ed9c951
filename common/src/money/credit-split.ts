import { MetrologyError } from '../math/metrology-error.js';
import { divideRounded } from './divide-rounded.js';

/**
 * Splits a credit (a refund or a correction) of `amountMinor` gross into net and tax in the invoice's own
 * proportion, so a credit note carries the tax it takes back:
 *   tax = round(invoice tax × amount / invoice gross),  net = amount − tax
 * A whole credit gives back exactly the invoice's net and tax.
 *
 * @param invoice the invoice's totals
 * @param amountMinor gross amount credited, 1 … what is left to credit
 * @param alreadyCreditedMinor gross already credited on this invoice
 * @example creditSplit({ netMinor: 10000, taxMinor: 2000, grossMinor: 12000 }, 6000, 0); // => { netMinor: 5000, taxMinor: 1000, grossMinor: 6000 }
 * @throws {MetrologyError} 'bad_argument' for an amount that is not a whole number, not positive, or more than is left
 */
export function creditSplit(
  invoice: { netMinor: number; taxMinor: number; grossMinor: number },
  amountMinor: number,
  alreadyCreditedMinor = 0,
): { netMinor: number; taxMinor: number; grossMinor: number } {
  const left = invoice.grossMinor - alreadyCreditedMinor;
  if (!Number.isSafeInteger(amountMinor) || amountMinor <= 0) {
    throw new MetrologyError('bad_argument', `a credit must be a whole number of minor units above zero (got ${String(amountMinor)})`);
  }
  if (amountMinor > left) {
    throw new MetrologyError('bad_argument', `a credit of ${amountMinor} is more than the ${left} left to credit on this invoice`);
  }
  if (invoice.grossMinor <= 0) throw new MetrologyError('bad_argument', 'an invoice of zero cannot be credited');
  const taxMinor = divideRounded(BigInt(invoice.taxMinor) * BigInt(amountMinor), invoice.grossMinor);
  return { netMinor: amountMinor - taxMinor, taxMinor, grossMinor: amountMinor };
}
