import type { InvoiceStatus } from '../types/billing.js';

export type InvoiceMoney = { grossMinor: number; paidMinor: number; refundedMinor: number; creditedMinor: number };

/**
 * What the customer still owes: gross − credited − (paid − refunded). A refund is always recorded with a
 * credit note of the same amount, so refunding part of a paid invoice leaves its balance at zero.
 *
 * @example invoiceBalance({ grossMinor: 12000, paidMinor: 12000, refundedMinor: 2000, creditedMinor: 2000 }); // => 0
 */
export function invoiceBalance(money: InvoiceMoney): number {
  return money.grossMinor - money.creditedMinor - (money.paidMinor - money.refundedMinor);
}

/**
 * An issued invoice's state from its money: credited when credit notes cover it and nothing was kept from
 * a payment, paid when nothing is left and a payment was kept, part paid when some is paid, issued otherwise.
 *
 * @example issuedInvoiceStatus({ grossMinor: 100, paidMinor: 40, refundedMinor: 0, creditedMinor: 0 }); // => 'part_paid'
 */
export function issuedInvoiceStatus(money: InvoiceMoney): Exclude<InvoiceStatus, 'draft'> {
  const kept = money.paidMinor - money.refundedMinor;
  if (invoiceBalance(money) <= 0) return kept > 0 ? 'paid' : 'credited';
  return kept > 0 ? 'part_paid' : 'issued';
}
