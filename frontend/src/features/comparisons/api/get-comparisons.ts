import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListComparisonsQuery, ListResponse, SavedComparison } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

export function getComparisons(query: ListComparisonsQuery = {}): Promise<ListResponse<SavedComparison>> {
  return api.get<ListResponse<SavedComparison>>('/comparisons', { params: query });
}

export const getComparisonsQueryOptions = (query?: ListComparisonsQuery) =>
  queryOptions({
    queryKey: query ? ['comparisons', 'list', query] : ['comparisons'],
    queryFn: () => getComparisons(query),
  });

export function useComparisons({ query }: { query: ListComparisonsQuery }) {
  return useQuery({ ...getComparisonsQueryOptions(query), placeholderData: keepPreviousData });
}
