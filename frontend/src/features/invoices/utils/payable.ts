import type { Invoice, InvoiceStatus } from '@kilocycle/common/types';

const PAYABLE: readonly InvoiceStatus[] = ['issued', 'part_paid'];

/** Whether a client can pay the invoice by card now: issued and something still owed (the server's balance). */
export function payable(invoice: Pick<Invoice, 'status' | 'balanceMinor'>): boolean {
  return PAYABLE.includes(invoice.status) && invoice.balanceMinor > 0;
}

/** Nothing left to pay: the server's state and balance say so. */
export function settled(invoice: Pick<Invoice, 'status' | 'balanceMinor'>): boolean {
  return invoice.status === 'paid' || invoice.status === 'credited' || invoice.balanceMinor <= 0;
}
