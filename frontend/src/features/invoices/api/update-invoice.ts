import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Invoice, UpdateInvoiceRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getInvoiceQueryOptions } from './get-invoice';
import { refreshInvoices } from './refresh-invoices';

export type UpdateInvoiceInput = { id: number; changes: UpdateInvoiceRequest };

/** A draft's lines; an issued invoice answers 409 (corrections are credit notes). */
export function updateInvoice({ id, changes }: UpdateInvoiceInput): Promise<Invoice> {
  return api.patch<Invoice>(`/invoices/${id}`, changes, { notify: false });
}

export function useUpdateInvoice({ onSuccess }: { onSuccess?: (invoice: Invoice) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateInvoice,
    onSuccess: async (invoice) => {
      queryClient.setQueryData(getInvoiceQueryOptions(invoice.id).queryKey, invoice);
      await refreshInvoices(queryClient);
      onSuccess?.(invoice);
    },
  });
}
