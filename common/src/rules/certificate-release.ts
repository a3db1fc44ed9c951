import type { CertificateRelease, InvoiceStatus, PaymentTerms } from '../types/billing.js';
import type { Role } from '../types/auth.js';

export type ReleaseFacts = {
  role: Role;
  paymentTerms: PaymentTerms;
  /** The job's invoice, or null when none has been made. */
  invoice: { id: number; status: InvoiceStatus; number: string | null } | null;
};

/**
 * Whether the signed certificate's PDF may be downloaded now. The lab's staff always may; a client may at once
 * when the customer is on account, and otherwise once the job's invoice is settled (paid, or credited in full).
 * Public verification never asks this.
 *
 * @example certificateRelease({ role: 'client', paymentTerms: 'on_account', invoice: null }).released; // => true
 */
export function certificateRelease(facts: ReleaseFacts): CertificateRelease {
  const invoiceId = facts.invoice?.id ?? null;
  if (facts.role !== 'client' || facts.paymentTerms === 'on_account') return { released: true, heldReason: null, invoiceId };
  const invoice = facts.invoice;
  if (!invoice || invoice.status === 'draft') {
    return { released: false, heldReason: 'Held until the invoice for this job is paid: the lab is preparing the invoice.', invoiceId: null };
  }
  if (invoice.status === 'paid' || invoice.status === 'credited') return { released: true, heldReason: null, invoiceId };
  const what = invoice.status === 'part_paid' ? 'is part paid' : 'is not paid yet';
  return { released: false, heldReason: `Held until invoice ${invoice.number ?? ''} is paid: it ${what}.`, invoiceId };
}
