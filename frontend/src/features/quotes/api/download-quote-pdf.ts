import type { Quote } from '@kilocycle/common/types';
import { downloadFile } from '@/lib/file-transfer';

/** GET /quotes/:id/pdf with the session's token, saved under the server's name (or the quote's number). */
export function downloadQuotePdf(quote: Pick<Quote, 'id' | 'number'>): Promise<void> {
  return downloadFile(`/quotes/${quote.id}/pdf`, `${quote.number}.pdf`);
}
