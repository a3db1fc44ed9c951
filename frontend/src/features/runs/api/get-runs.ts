import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse, ListRunsQuery, Run } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

export function getRuns(query: ListRunsQuery = {}): Promise<ListResponse<Run>> {
  return api.get<ListResponse<Run>>('/runs', { params: query });
}

export const getRunsQueryOptions = (query?: ListRunsQuery) =>
  queryOptions({
    queryKey: query ? [...sharedQueryKeys.runs, 'list', query] : [...sharedQueryKeys.runs, 'list'],
    queryFn: () => getRuns(query),
  });

export function useRuns({ query, enabled = true }: { query: ListRunsQuery; enabled?: boolean }) {
  return useQuery({ ...getRunsQueryOptions(query), placeholderData: keepPreviousData, enabled });
}
