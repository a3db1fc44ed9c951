import type { BillingLine, BillingLineInput, CustomerTerms, DocumentTotals } from '@kilocycle/common/types';
import { documentTotals, lineAmounts } from '@kilocycle/common/money';
import type { InvoiceLine } from './invoice-line.entity.js';

/** The customer's tax treatment as an invoice stores it: exempt (rate 0, with the registration) or the rate charged. */
export type TaxTreatment = { taxExempt: boolean; taxRegistration: string | null; taxRateBasisPoints: number };

export function taxTreatment(terms: CustomerTerms): TaxTreatment {
  const exempt = terms.taxRateId === null;
  return { taxExempt: exempt, taxRegistration: terms.taxRegistration, taxRateBasisPoints: exempt ? 0 : (terms.taxRateBasisPoints ?? 0) };
}

/** Lines as entered, priced at one rate (per-line rounding: common/src/money/line-amounts.ts), numbered 1, 2, … */
export function priceLines(inputs: readonly BillingLineInput[], rateBasisPoints: number): BillingLine[] {
  return inputs.map((input, i) => ({
    position: i + 1,
    priceItemId: input.priceItemId ?? null,
    code: input.code ?? null,
    description: input.description,
    unit: input.unit,
    quantityMilli: input.quantityMilli,
    unitPriceMinor: input.unitPriceMinor,
    taxRateBasisPoints: rateBasisPoints,
    ...lineAmounts(input.quantityMilli, input.unitPriceMinor, rateBasisPoints),
  }));
}

export function totalsOf(lines: readonly BillingLine[]): DocumentTotals {
  return documentTotals(lines.map((l) => ({ netMinor: l.netMinor, taxMinor: l.taxMinor, rateBasisPoints: l.taxRateBasisPoints })));
}

export function lineView(row: InvoiceLine): BillingLine {
  return {
    position: row.position,
    priceItemId: row.priceItemId,
    code: row.code,
    description: row.description,
    unit: row.unit,
    quantityMilli: row.quantityMilli,
    unitPriceMinor: row.unitPriceMinor,
    taxRateBasisPoints: row.taxRateBasisPoints,
    netMinor: row.netMinor,
    taxMinor: row.taxMinor,
    grossMinor: row.grossMinor,
  };
}

export function asInput(line: BillingLine): BillingLineInput {
  const { priceItemId, code, description, unit, quantityMilli, unitPriceMinor } = line;
  return { priceItemId, code, description, unit, quantityMilli, unitPriceMinor };
}
