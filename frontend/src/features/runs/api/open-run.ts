import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateRunRequest, Run } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getRunsQueryOptions } from './get-runs';

export type OpenRunInput = { jobId: number; body: CreateRunRequest };

/** Opens a run on one of the job's instrument's ranges; 409 when the standard has lapsed (the reason says why). */
export function openRun({ jobId, body }: OpenRunInput): Promise<Run> {
  return api.post<Run>(`/jobs/${jobId}/runs`, body, { notify: false });
}

export function useOpenRun({ onSuccess }: { onSuccess?: (run: Run) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: openRun,
    onSuccess: async (run) => {
      await queryClient.invalidateQueries({ queryKey: getRunsQueryOptions().queryKey });
      onSuccess?.(run);
    },
  });
}
