import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import type { Reading } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { getReadingsQueryOptions } from './get-readings';

export type ExcludeReadingInput = { runId: number; readingId: number; reason: string };

const { excludeReason: REASON } = FIELD_LIMITS.reading;

/** The exclusion form: the reason is kept with the struck-through reading. */
export const excludeReadingSchema = z.object({
  reason: z.string().trim().min(REASON.min, `At least ${REASON.min} characters`).max(REASON.max, `At most ${REASON.max} characters`),
});

/** Marks a reading as excluded with the reason; the reading itself never changes. */
export function excludeReading({ runId, readingId, reason }: ExcludeReadingInput): Promise<Reading> {
  return api.post<Reading>(`/runs/${runId}/readings/${readingId}/exclusion`, { reason }, { notify: false });
}

export function useExcludeReading({ onSuccess }: { onSuccess?: (reading: Reading) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: excludeReading,
    onSuccess: async (reading, { runId }) => {
      onSuccess?.(reading);
      await queryClient.invalidateQueries({ queryKey: getReadingsQueryOptions(runId).queryKey });
    },
  });
}
