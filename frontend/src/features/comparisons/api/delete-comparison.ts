import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getComparisonsQueryOptions } from './get-comparisons';

export function deleteComparison(id: number): Promise<void> {
  return api.delete<void>(`/comparisons/${id}`);
}

export function useDeleteComparison({ onSuccess }: { onSuccess?: () => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteComparison,
    onSuccess: async (_data, id) => {
      queryClient.removeQueries({ queryKey: ['comparisons', 'saved', id] });
      await queryClient.invalidateQueries({ queryKey: getComparisonsQueryOptions().queryKey });
      onSuccess?.();
    },
  });
}
