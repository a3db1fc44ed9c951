import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Invoice, ListInvoicesQuery, ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

/** The server scopes the list: a client gets its own organisation's invoices, never a draft. */
export function getInvoices(query: ListInvoicesQuery = {}): Promise<ListResponse<Invoice>> {
  return api.get<ListResponse<Invoice>>('/invoices', { params: query });
}

export const getInvoicesQueryOptions = (query?: ListInvoicesQuery) =>
  queryOptions({
    queryKey: query ? [...sharedQueryKeys.invoices, 'list', query] : [...sharedQueryKeys.invoices, 'list'],
    queryFn: () => getInvoices(query),
  });

export function useInvoices({ query, enabled = true }: { query: ListInvoicesQuery; enabled?: boolean }) {
  return useQuery({ ...getInvoicesQueryOptions(query), placeholderData: keepPreviousData, enabled });
}
