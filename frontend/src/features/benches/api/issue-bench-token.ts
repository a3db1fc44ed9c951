import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BenchTokenResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getBenchesQueryOptions } from './get-benches';

/** A fresh bridge token for a bench; the old one stops working at once. The answer is the only time it is shown. */
export function issueBenchToken(benchId: number): Promise<BenchTokenResponse> {
  return api.post<BenchTokenResponse>(`/benches/${benchId}/token`);
}

export function useIssueBenchToken({ onSuccess }: { onSuccess?: (answer: BenchTokenResponse) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: issueBenchToken,
    onSuccess: async (answer) => {
      onSuccess?.(answer);
      await queryClient.invalidateQueries({ queryKey: getBenchesQueryOptions().queryKey });
    },
  });
}
