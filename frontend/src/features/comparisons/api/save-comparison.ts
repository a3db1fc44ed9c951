import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import type { CreateComparisonRequest, SavedComparison, UpdateComparisonRequest } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { optionalText, requiredText } from '@/utils/form-schema';
import { getComparisonsQueryOptions } from './get-comparisons';

/** The title-and-notes form of a saved comparison. */
export const comparisonTextSchema = z.object({
  title: requiredText(FIELD_LIMITS.comparison.title.max, 'Give the comparison a title'),
  notes: optionalText(FIELD_LIMITS.notes.max),
}) satisfies z.ZodType<Pick<UpdateComparisonRequest, 'title' | 'notes'>, unknown>;

export type SaveComparisonInput = { id: null; body: CreateComparisonRequest } | { id: number; body: UpdateComparisonRequest };

export function saveComparison(input: SaveComparisonInput): Promise<SavedComparison> {
  return input.id === null
    ? api.post<SavedComparison>('/comparisons', input.body, { notify: false })
    : api.patch<SavedComparison>(`/comparisons/${input.id}`, input.body, { notify: false });
}

export function useSaveComparison({ onSuccess }: { onSuccess?: (saved: SavedComparison) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveComparison,
    onSuccess: async (saved) => {
      // The list, this comparison and its computed result.
      await queryClient.invalidateQueries({ queryKey: getComparisonsQueryOptions().queryKey });
      onSuccess?.(saved);
    },
  });
}
