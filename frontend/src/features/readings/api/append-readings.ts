import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AppendReadingsRequest, AppendReadingsResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getReadingsQueryOptions } from './get-readings';

export type AppendReadingsInput = { runId: number; body: AppendReadingsRequest };

/** Stores typed readings (all or nothing: a 400 names each refused field and nothing is written). */
export function appendReadings({ runId, body }: AppendReadingsInput): Promise<AppendReadingsResponse> {
  return api.post<AppendReadingsResponse>(`/runs/${runId}/readings`, body, { notify: false });
}

export function useAppendReadings({ onSuccess }: { onSuccess?: (answer: AppendReadingsResponse) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: appendReadings,
    // The list is refreshed without holding the mutation open, so the next reading can be typed and saved at once.
    onSuccess: (answer, { runId }) => {
      onSuccess?.(answer);
      void queryClient.invalidateQueries({ queryKey: getReadingsQueryOptions(runId).queryKey });
    },
  });
}
