import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Bench } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getBenchesQueryOptions } from './get-benches';

export function revokeBenchToken(benchId: number): Promise<Bench> {
  return api.delete<Bench>(`/benches/${benchId}/token`);
}

export function useRevokeBenchToken({ onSuccess }: { onSuccess?: (bench: Bench) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeBenchToken,
    onSuccess: async (bench) => {
      await queryClient.invalidateQueries({ queryKey: getBenchesQueryOptions().queryKey });
      onSuccess?.(bench);
    },
  });
}
