import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SavedComparison } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

export function getComparison(id: number): Promise<SavedComparison> {
  return api.get<SavedComparison>(`/comparisons/${id}`);
}

export const getComparisonQueryOptions = (id: number) =>
  queryOptions({
    queryKey: ['comparisons', 'saved', id],
    queryFn: () => getComparison(id),
  });

export function useComparison(id: number | null) {
  return useQuery({ ...getComparisonQueryOptions(id ?? 0), enabled: id !== null && id > 0 });
}
