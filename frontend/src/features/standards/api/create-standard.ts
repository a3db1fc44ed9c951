import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateStandardRequest, ReferenceStandard } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getStandardsQueryOptions } from './get-standards';

export function createStandard(body: CreateStandardRequest): Promise<ReferenceStandard> {
  return api.post<ReferenceStandard>('/standards', body, { notify: false });
}

export function useCreateStandard({ onSuccess }: { onSuccess?: (standard: ReferenceStandard) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createStandard,
    onSuccess: async (standard) => {
      await queryClient.invalidateQueries({ queryKey: getStandardsQueryOptions().queryKey });
      onSuccess?.(standard);
    },
  });
}
