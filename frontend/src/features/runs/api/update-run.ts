import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Run, UpdateRunRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getRunQueryOptions } from './get-run';
import { getRunsQueryOptions } from './get-runs';

export type UpdateRunInput = { id: number; changes: UpdateRunRequest };

export function updateRun({ id, changes }: UpdateRunInput): Promise<Run> {
  return api.patch<Run>(`/runs/${id}`, changes);
}

export function useUpdateRun({ onSuccess }: { onSuccess?: (run: Run) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateRun,
    onSuccess: async (run) => {
      queryClient.setQueryData(getRunQueryOptions(run.id).queryKey, run);
      await queryClient.invalidateQueries({ queryKey: getRunsQueryOptions().queryKey });
      onSuccess?.(run);
    },
  });
}
