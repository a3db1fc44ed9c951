import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListQuery, ListResponse, TaxRate } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

export type ListTaxRatesQuery = ListQuery & { active?: boolean };

export function getTaxRates(query: ListTaxRatesQuery = {}): Promise<ListResponse<TaxRate>> {
  return api.get<ListResponse<TaxRate>>('/prices/tax-rates', { params: query });
}

export const getTaxRatesQueryOptions = (query?: ListTaxRatesQuery) =>
  queryOptions({
    queryKey: query ? [...sharedQueryKeys.prices, 'tax-rates', query] : [...sharedQueryKeys.prices, 'tax-rates'],
    queryFn: () => getTaxRates(query),
  });

export function useTaxRates({ query, enabled = true }: { query: ListTaxRatesQuery; enabled?: boolean }) {
  return useQuery({ ...getTaxRatesQueryOptions(query), placeholderData: keepPreviousData, enabled });
}
