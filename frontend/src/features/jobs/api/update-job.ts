import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Job, UpdateJobRequest } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { jobDetailsFields } from './create-job';
import { getJobHistoryQueryOptions } from './get-job-history';
import { getJobQueryOptions } from './get-job';
import { getJobsQueryOptions } from './get-jobs';

export type UpdateJobInput = { id: number; changes: UpdateJobRequest };

/** The job's edit form (reception details and bench conditions). */
export const updateJobSchema = z.object(jobDetailsFields) satisfies z.ZodType<UpdateJobRequest, unknown>;

export function updateJob({ id, changes }: UpdateJobInput): Promise<Job> {
  return api.patch<Job>(`/jobs/${id}`, changes, { notify: false });
}

export function useUpdateJob({ onSuccess }: { onSuccess?: (job: Job) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateJob,
    onSuccess: async (job) => {
      queryClient.setQueryData(getJobQueryOptions(job.id).queryKey, job);
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: getJobsQueryOptions().queryKey }),
        queryClient.invalidateQueries({ queryKey: getJobHistoryQueryOptions(job.id).queryKey }),
      ]);
      onSuccess?.(job);
    },
  });
}
