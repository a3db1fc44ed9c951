import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Bench, CreateBenchRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getBenchesQueryOptions } from './get-benches';

export function createBench(body: CreateBenchRequest): Promise<Bench> {
  return api.post<Bench>('/benches', body, { notify: false });
}

export function useCreateBench({ onSuccess }: { onSuccess?: (bench: Bench) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createBench,
    onSuccess: async (bench) => {
      await queryClient.invalidateQueries({ queryKey: getBenchesQueryOptions().queryKey });
      onSuccess?.(bench);
    },
  });
}
