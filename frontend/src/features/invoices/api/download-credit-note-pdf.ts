import type { CreditNote } from '@kilocycle/common/types';
import { downloadFile } from '@/lib/file-transfer';

/** GET /credit-notes/:id/pdf with the session's token. */
export function downloadCreditNotePdf(note: Pick<CreditNote, 'id' | 'number'>): Promise<void> {
  return downloadFile(`/credit-notes/${note.id}/pdf`, `${note.number}.pdf`);
}
