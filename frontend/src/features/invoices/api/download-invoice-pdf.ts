import type { Invoice } from '@kilocycle/common/types';
import { downloadFile } from '@/lib/file-transfer';

/** GET /invoices/:id/pdf with the session's token, saved under the server's name (or the invoice's number). */
export function downloadInvoicePdf(invoice: Pick<Invoice, 'id' | 'number'>): Promise<void> {
  return downloadFile(`/invoices/${invoice.id}/pdf`, `${invoice.number ?? `invoice-${invoice.id}`}.pdf`);
}
