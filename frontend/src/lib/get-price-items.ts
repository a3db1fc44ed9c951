import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListPriceItemsQuery, PriceItemsResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

// Shared by the prices page and the quote and invoice line dialogs (which start a line from a price item);
// features never import each other, so the price-item list query lives here, once.
export function getPriceItems(query: ListPriceItemsQuery = {}): Promise<PriceItemsResponse> {
  return api.get<PriceItemsResponse>('/prices/items', { params: query });
}

export const getPriceItemsQueryOptions = (query?: ListPriceItemsQuery) =>
  queryOptions({
    queryKey: query ? [...sharedQueryKeys.prices, 'items', query] : [...sharedQueryKeys.prices, 'items'],
    queryFn: () => getPriceItems(query),
  });

export function usePriceItems({ query, enabled = true }: { query: ListPriceItemsQuery; enabled?: boolean }) {
  return useQuery({ ...getPriceItemsQueryOptions(query), placeholderData: keepPreviousData, enabled });
}
