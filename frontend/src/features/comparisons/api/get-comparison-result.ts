import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ComparisonResult } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

/** A saved comparison computed now from its runs (readings excluded since then are left out). */
export function getComparisonResult(id: number): Promise<ComparisonResult> {
  return api.get<ComparisonResult>(`/comparisons/${id}/result`);
}

export const getComparisonResultQueryOptions = (id: number) =>
  queryOptions({
    queryKey: ['comparisons', 'saved', id, 'result'],
    queryFn: () => getComparisonResult(id),
  });

export function useComparisonResult(id: number) {
  return useQuery({ ...getComparisonResultQueryOptions(id), enabled: id > 0 });
}
