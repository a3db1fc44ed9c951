import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Invoice } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

export function getInvoice(id: number): Promise<Invoice> {
  return api.get<Invoice>(`/invoices/${id}`, { notify: false });
}

export const getInvoiceQueryOptions = (id: number) =>
  queryOptions({
    queryKey: [...sharedQueryKeys.invoices, 'detail', id],
    queryFn: () => getInvoice(id),
  });

/** `refetchInterval` polls while the caller waits for something, e.g. a payment's webhook to land. */
/** Milliseconds between polls, or false; a function decides from the invoice as last fetched. */
type Polling = number | false | ((invoice: Invoice | undefined) => number | false);

export function useInvoice({ id, enabled = true, refetchInterval = false }: { id: number; enabled?: boolean; refetchInterval?: Polling }) {
  return useQuery({
    ...getInvoiceQueryOptions(id),
    enabled: enabled && Number.isInteger(id) && id > 0,
    refetchInterval: typeof refetchInterval === 'function' ? (query) => refetchInterval(query.state.data) : refetchInterval,
  });
}
