import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Bench, UpdateBenchRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getBenchesQueryOptions } from './get-benches';

export type UpdateBenchInput = { id: number; changes: UpdateBenchRequest };

export function updateBench({ id, changes }: UpdateBenchInput): Promise<Bench> {
  return api.patch<Bench>(`/benches/${id}`, changes);
}

export function useUpdateBench({ onSuccess }: { onSuccess?: (bench: Bench) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateBench,
    onSuccess: async (bench) => {
      await queryClient.invalidateQueries({ queryKey: getBenchesQueryOptions().queryKey });
      onSuccess?.(bench);
    },
  });
}
