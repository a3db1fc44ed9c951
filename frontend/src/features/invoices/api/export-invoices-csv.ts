import { fetchFile } from '@/lib/api-client';
import { saveBlob } from '@/lib/file-transfer';

export type ExportInvoicesRange = { from: string; to: string };

/** The bookkeeper's CSV of invoices, payments, refunds and credit notes between two dates (yyyy-mm-dd, both included). */
export async function exportInvoicesCsv({ from, to }: ExportInvoicesRange): Promise<void> {
  const query = new URLSearchParams({ from, to }).toString();
  const file = await fetchFile(`/invoices/export.csv?${query}`);
  saveBlob(file.blob, file.filename ?? `invoices-${from}-to-${to}.csv`);
}
