import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import type { JobReview, SubmitJobRequest } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { getJobHistoryQueryOptions } from './get-job-history';
import { getJobsQueryOptions } from './get-jobs';

export type SubmitJobInput = { id: number; body: SubmitJobRequest };

const { submitComment: COMMENT } = FIELD_LIMITS.review;

/** The submit form: an optional note for the lead (left out of the request when empty). */
export const submitJobSchema = z
  .object({ comment: z.string().trim().max(COMMENT.max, `At most ${COMMENT.max} characters`) })
  .transform(({ comment }): SubmitJobRequest => (comment ? { comment } : {}));

/** Hands the job to the lead for review (the server checks there is calibration data to review). */
export function submitJob({ id, body }: SubmitJobInput): Promise<JobReview> {
  return api.post<JobReview>(`/jobs/${id}/submit`, body, { notify: false });
}

export function useSubmitJob({ onSuccess }: { onSuccess?: (review: JobReview) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: submitJob,
    onSuccess: async (review, { id }) => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: getJobsQueryOptions().queryKey }),
        queryClient.invalidateQueries({ queryKey: getJobHistoryQueryOptions(id).queryKey }),
      ]);
      onSuccess?.(review);
    },
  });
}
