import type { QueryClient } from '@tanstack/react-query';
import { sharedQueryKeys } from '@/lib/query-keys';

/**
 * After any change to an invoice, its payments or credit notes: every invoice list, invoice, payment list and
 * statement (all under the invoices root), and what a client sees of its certificates, whose release follows
 * the invoice.
 */
export function refreshInvoices(queryClient: QueryClient): Promise<unknown> {
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: sharedQueryKeys.invoices }),
    queryClient.invalidateQueries({ queryKey: sharedQueryKeys.certificates }),
    queryClient.invalidateQueries({ queryKey: sharedQueryKeys.portal }),
  ]);
}
