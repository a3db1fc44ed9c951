import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { CustomerTerms, ListQuery, ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

/** One row per customer organisation; those without terms of their own show the defaults (updatedAt null). */
export function getCustomerTerms(query: ListQuery = {}): Promise<ListResponse<CustomerTerms>> {
  return api.get<ListResponse<CustomerTerms>>('/prices/customer-terms', { params: query });
}

export const getCustomerTermsQueryOptions = (query?: ListQuery) =>
  queryOptions({
    queryKey: query ? [...sharedQueryKeys.prices, 'customer-terms', query] : [...sharedQueryKeys.prices, 'customer-terms'],
    queryFn: () => getCustomerTerms(query),
  });

export function useCustomerTerms({ query, enabled = true }: { query: ListQuery; enabled?: boolean }) {
  return useQuery({ ...getCustomerTermsQueryOptions(query), placeholderData: keepPreviousData, enabled });
}
