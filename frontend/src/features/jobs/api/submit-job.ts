import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { JobReview, SubmitJobRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getJobHistoryQueryOptions } from './get-job-history';
import { getJobsQueryOptions } from './get-jobs';

export type SubmitJobInput = { id: number; body: SubmitJobRequest };

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
