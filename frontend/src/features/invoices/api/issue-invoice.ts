import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Invoice } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getInvoiceQueryOptions } from './get-invoice';
import { refreshInvoices } from './refresh-invoices';

/** Numbers the draft from the gap-free sequence, sets its due date from the customer's terms, and mails the PDF. */
export function issueInvoice(id: number): Promise<Invoice> {
  return api.post<Invoice>(`/invoices/${id}/issue`, undefined, { notify: false });
}

export function useIssueInvoice({ onSuccess }: { onSuccess?: (invoice: Invoice) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: issueInvoice,
    onSuccess: async (invoice) => {
      queryClient.setQueryData(getInvoiceQueryOptions(invoice.id).queryKey, invoice);
      await refreshInvoices(queryClient);
      onSuccess?.(invoice);
    },
  });
}
