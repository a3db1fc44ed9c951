import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse, ListStandardsQuery, ReferenceStandard } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

export function getStandards(query: ListStandardsQuery = {}): Promise<ListResponse<ReferenceStandard>> {
  return api.get<ListResponse<ReferenceStandard>>('/standards', { params: query });
}

export const getStandardsQueryOptions = (query?: ListStandardsQuery) =>
  queryOptions({
    queryKey: query ? ['standards', query] : ['standards'],
    queryFn: () => getStandards(query),
  });

export function useStandards({ query, enabled = true }: { query: ListStandardsQuery; enabled?: boolean }) {
  return useQuery({ ...getStandardsQueryOptions(query), placeholderData: keepPreviousData, enabled });
}
