import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ReferenceStandard, UpdateStandardRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getStandardsQueryOptions } from '@/lib/get-standards';

export type UpdateStandardInput = { id: number; changes: UpdateStandardRequest };

export function updateStandard({ id, changes }: UpdateStandardInput): Promise<ReferenceStandard> {
  return api.patch<ReferenceStandard>(`/standards/${id}`, changes, { notify: false });
}

export function useUpdateStandard({ onSuccess }: { onSuccess?: (standard: ReferenceStandard) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateStandard,
    onSuccess: async (standard) => {
      await queryClient.invalidateQueries({ queryKey: getStandardsQueryOptions().queryKey });
      onSuccess?.(standard);
    },
  });
}
