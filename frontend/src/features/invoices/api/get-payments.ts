import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListQuery, ListResponse, Payment } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

export type ListPaymentsQuery = ListQuery & { invoiceId?: number };

export function getPayments(query: ListPaymentsQuery = {}): Promise<ListResponse<Payment>> {
  return api.get<ListResponse<Payment>>('/payments', { params: query });
}

export const getPaymentsQueryOptions = (query?: ListPaymentsQuery) =>
  queryOptions({
    queryKey: query ? [...sharedQueryKeys.invoices, 'payments', query] : [...sharedQueryKeys.invoices, 'payments'],
    queryFn: () => getPayments(query),
  });

export function usePayments({ query, enabled = true }: { query: ListPaymentsQuery; enabled?: boolean }) {
  return useQuery({ ...getPaymentsQueryOptions(query), enabled });
}
