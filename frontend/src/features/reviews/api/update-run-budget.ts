import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RunBudget, UpdateRunBudgetRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';
import { getRunBudgetQueryOptions } from './get-run-budget';

export type UpdateRunBudgetInput = { runId: number; changes: UpdateRunBudgetRequest };

export function updateRunBudget({ runId, changes }: UpdateRunBudgetInput): Promise<RunBudget> {
  return api.put<RunBudget>(`/runs/${runId}/budget`, changes, { notify: false });
}

export function useUpdateRunBudget({ onSuccess }: { onSuccess?: (budget: RunBudget) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateRunBudget,
    onSuccess: async (budget) => {
      queryClient.setQueryData(getRunBudgetQueryOptions(budget.runId).queryKey, budget);
      // Every review and result figure may have moved with the budget.
      await queryClient.invalidateQueries({ queryKey: sharedQueryKeys.reviews });
      onSuccess?.(budget);
    },
  });
}
