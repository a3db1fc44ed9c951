import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import type { JobReview, ReturnJobRequest } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { getReviewQueryOptions } from './get-review';
import { invalidateJobEverywhere } from './invalidate-job';

export type ReturnJobInput = { jobId: number } & ReturnJobRequest;

const { returnComment: COMMENT } = FIELD_LIMITS.review;

/** The return form: the comment must say what needs rework (the server's shortest is the same). */
export const returnJobSchema = z.object({
  comment: z.string().trim().min(COMMENT.min, 'Say what needs rework').max(COMMENT.max, `At most ${COMMENT.max} characters`),
}) satisfies z.ZodType<ReturnJobRequest, unknown>;

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
