import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { RunAnalysis, RunAnalysisQuery } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { runAnalysisQueryKey } from '@/lib/query-keys';

/**
 * What common computes for the run's kind, from the full data on the server (the reference).
 * 422 means the readings cannot support the computation yet (too few, no curvature…): shown in place, not as a failure.
 */
export function getRunAnalysis(id: number, query: RunAnalysisQuery = {}): Promise<RunAnalysis> {
  return api.get<RunAnalysis>(`/runs/${id}/analysis`, { params: query, notify: false });
}

export const getRunAnalysisQueryOptions = (id: number, query?: RunAnalysisQuery) =>
  queryOptions({
    queryKey: query ? [...runAnalysisQueryKey(id), query] : runAnalysisQueryKey(id),
    queryFn: () => getRunAnalysis(id, query),
  });

export function useRunAnalysis({ id, query, enabled = true }: { id: number; query?: RunAnalysisQuery; enabled?: boolean }) {
  // The previous analysis stays on screen while the next is computed, so charts do not flash empty.
  return useQuery({ ...getRunAnalysisQueryOptions(id, query ?? {}), placeholderData: keepPreviousData, enabled });
}
