import { keepPreviousData, queryOptions, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useCallback } from 'react';
import type { ListReadingsQuery, ListResponse, Reading } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

export function getReadings(runId: number, query: ListReadingsQuery = {}): Promise<ListResponse<Reading>> {
  return api.get<ListResponse<Reading>>(`/runs/${runId}/readings`, { params: query });
}

export const getReadingsQueryOptions = (runId: number, query?: ListReadingsQuery) =>
  queryOptions({
    queryKey: query ? [...sharedQueryKeys.readings, runId, query] : [...sharedQueryKeys.readings, runId],
    queryFn: () => getReadings(runId, query),
  });

/** Fetches the run's reading lists again (not the live latest-readings entry, which the stream keeps current). */
export function refreshReadingLists(queryClient: QueryClient, runId: number) {
  return queryClient.invalidateQueries({
    queryKey: getReadingsQueryOptions(runId).queryKey,
    predicate: (query) => query.queryKey[2] !== 'latest',
  });
}

export function useRefreshReadings(runId: number) {
  const queryClient = useQueryClient();
  return useCallback(() => refreshReadingLists(queryClient, runId), [queryClient, runId]);
}

export function useReadings({ runId, query, enabled = true }: { runId: number; query: ListReadingsQuery; enabled?: boolean }) {
  return useQuery({ ...getReadingsQueryOptions(runId, query), placeholderData: keepPreviousData, enabled });
}
