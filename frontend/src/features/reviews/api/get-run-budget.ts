import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunBudget } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

export function getRunBudget(runId: number): Promise<RunBudget> {
  return api.get<RunBudget>(`/runs/${runId}/budget`);
}

export const getRunBudgetQueryOptions = (runId: number) =>
  queryOptions({
    queryKey: [...sharedQueryKeys.reviews, 'run-budget', runId],
    queryFn: () => getRunBudget(runId),
  });

export function useRunBudget(runId: number | null) {
  return useQuery({ ...getRunBudgetQueryOptions(runId ?? 0), enabled: runId !== null });
}
