import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import type { RunBudget, UpdateRunBudgetRequest } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';
import { optionalNumber, optionalText } from '@/utils/form-schema';
import { getRunBudgetQueryOptions } from './get-run-budget';
import { extraComponentDraftSchema, extraComponentsSchema } from './save-procedure';

const figure = optionalNumber({ min: 0, message: 'Each figure must be a number of zero or more, or empty to follow the procedure' });

/** A run's budget form: an empty figure follows the procedure; the extra components replace the procedure's only when switched on. */
export const runBudgetSchema = z
  .object({
    dialHalfDivision: figure,
    driftPpm: figure,
    driftHz: figure,
    counterResolutionHz: figure,
    note: optionalText(FIELD_LIMITS.notes.max),
    overrideExtras: z.boolean(),
    extras: z.array(extraComponentDraftSchema),
  })
  .transform(({ overrideExtras, extras, ...figures }, context): UpdateRunBudgetRequest => {
    if (!overrideExtras) return { ...figures, extraComponents: null };
    const parsed = extraComponentsSchema.safeParse(extras);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) context.addIssue({ code: 'custom', path: ['extras'], message: issue.message });
      return z.NEVER;
    }
    return { ...figures, extraComponents: parsed.data };
  });

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
