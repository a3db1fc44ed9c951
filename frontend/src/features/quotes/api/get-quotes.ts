import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListQuotesQuery, ListResponse, Quote } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

/** The server scopes the list: a client gets its own organisation's quotes, never a draft. */
export function getQuotes(query: ListQuotesQuery = {}): Promise<ListResponse<Quote>> {
  return api.get<ListResponse<Quote>>('/quotes', { params: query });
}

export const getQuotesQueryOptions = (query?: ListQuotesQuery) =>
  queryOptions({
    queryKey: query ? [...sharedQueryKeys.quotes, 'list', query] : sharedQueryKeys.quotes,
    queryFn: () => getQuotes(query),
  });

export function useQuotes({ query, enabled = true }: { query: ListQuotesQuery; enabled?: boolean }) {
  return useQuery({ ...getQuotesQueryOptions(query), placeholderData: keepPreviousData, enabled });
}
