import { formatQuantityMilli } from '@kilocycle/common/money';
import type { PaymentTerms, PriceUnit } from '@kilocycle/common/types';

/** How a price is counted, as the price list and the line dialogs say it. */
export const PRICE_UNIT_LABELS: Record<PriceUnit, string> = {
  per_range: 'Per range',
  per_hour: 'Per hour of study',
  per_job: 'Per job',
};

const UNIT_WORDS: Record<PriceUnit, [one: string, many: string]> = {
  per_range: ['range', 'ranges'],
  per_hour: ['h', 'h'],
  per_job: ['job', 'jobs'],
};

/** A line's quantity with its unit: "3 ranges", "1.5 h", "1 job". */
export function describeQuantity(quantityMilli: number, unit: PriceUnit): string {
  const [one, many] = UNIT_WORDS[unit];
  return `${formatQuantityMilli(quantityMilli)} ${quantityMilli === 1000 ? one : many}`;
}

/** A customer's payment terms in a few words. */
export function describeTerms(terms: { paymentTerms: PaymentTerms; netDays: number }): string {
  return terms.paymentTerms === 'pay_before_release' ? 'Pay before release' : `On account, ${terms.netDays} days net`;
}
