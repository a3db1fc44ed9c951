import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateComparisonRequest, SavedComparison, UpdateComparisonRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getComparisonsQueryOptions } from './get-comparisons';

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
