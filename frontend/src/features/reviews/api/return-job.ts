import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { JobReview, ReturnJobRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getReviewQueryOptions } from './get-review';
import { invalidateJobEverywhere } from './invalidate-job';

export type ReturnJobInput = { jobId: number } & ReturnJobRequest;

/** Shortest comment the server accepts: it must say what needs rework. */
export const MIN_RETURN_COMMENT = 3;

export function returnJob({ jobId, comment }: ReturnJobInput): Promise<JobReview> {
  return api.post<JobReview>(`/jobs/${jobId}/return`, { comment }, { notify: false });
}

export function useReturnJob({ onSuccess }: { onSuccess?: (review: JobReview) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: returnJob,
    onSuccess: async (review, { jobId }) => {
      queryClient.setQueryData(getReviewQueryOptions(jobId).queryKey, review);
      await invalidateJobEverywhere(queryClient, jobId);
      onSuccess?.(review);
    },
  });
}
