import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Invoice } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { refreshInvoices } from './refresh-invoices';

/** A draft invoice for an issued job that has none (the server makes one at signing; this is for a job without). */
export function createInvoice(jobId: number): Promise<Invoice> {
  return api.post<Invoice>(`/jobs/${jobId}/invoice`, undefined, { notify: false });
}

export function useCreateInvoice({ onSuccess }: { onSuccess?: (invoice: Invoice) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createInvoice,
    onSuccess: async (invoice) => {
      await refreshInvoices(queryClient);
      onSuccess?.(invoice);
    },
  });
}
