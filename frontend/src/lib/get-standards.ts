import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse, ListStandardsQuery, ReferenceStandard } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

// Shared by several features and routes (the standards pages, opening and correcting a run, benches, a job's
// open-run dialog), which never import each other: the reference-standard list query lives here, once.
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
