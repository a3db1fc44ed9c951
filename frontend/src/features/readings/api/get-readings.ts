import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListReadingsQuery, ListResponse, Reading } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

export function getReadings(runId: number, query: ListReadingsQuery = {}): Promise<ListResponse<Reading>> {
  return api.get<ListResponse<Reading>>(`/runs/${runId}/readings`, { params: query });
}

export const getReadingsQueryOptions = (runId: number, query?: ListReadingsQuery) =>
  queryOptions({
    queryKey: query ? ['readings', runId, query] : ['readings', runId],
    queryFn: () => getReadings(runId, query),
  });

export function useReadings({ runId, query, enabled = true }: { runId: number; query: ListReadingsQuery; enabled?: boolean }) {
  return useQuery({ ...getReadingsQueryOptions(runId, query), placeholderData: keepPreviousData, enabled });
}
