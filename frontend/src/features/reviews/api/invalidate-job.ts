import type { QueryClient } from '@tanstack/react-query';
import { sharedQueryKeys } from '@/lib/query-keys';
import { getJobResultsQueryOptions } from './get-job-results';
import { getReviewQueryOptions } from './get-review';
import { getReviewQueueQueryOptions } from './get-review-queue';

/**
 * A job's status changed: refresh its review, its results and the queue, and any job list or page cached
 * under the jobs feature's shared key root.
 */
export async function invalidateJobEverywhere(queryClient: QueryClient, jobId: number): Promise<void> {
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: getReviewQueryOptions(jobId).queryKey }),
    queryClient.invalidateQueries({ queryKey: getJobResultsQueryOptions(jobId).queryKey }),
    queryClient.invalidateQueries({ queryKey: getReviewQueueQueryOptions().queryKey }),
    queryClient.invalidateQueries({ queryKey: sharedQueryKeys.jobs }),
  ]);
}
