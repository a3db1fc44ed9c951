import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getComparisonsQueryOptions } from './get-comparisons';
import { getComparisonQueryOptions } from './get-comparison';

export function deleteComparison(id: number): Promise<void> {
  return api.delete<void>(`/comparisons/${id}`);
}

export function useDeleteComparison({ onSuccess }: { onSuccess?: () => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteComparison,
    onSuccess: async (_data, id) => {
      queryClient.removeQueries({ queryKey: getComparisonQueryOptions(id).queryKey });
      await queryClient.invalidateQueries({ queryKey: getComparisonsQueryOptions().queryKey });
      onSuccess?.();
    },
  });
}
