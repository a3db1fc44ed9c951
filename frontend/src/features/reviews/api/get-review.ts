import { queryOptions, useQuery } from '@tanstack/react-query';
import type { JobReview } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

export function getReview(jobId: number): Promise<JobReview> {
  return api.get<JobReview>(`/reviews/${jobId}`);
}

export const getReviewQueryOptions = (jobId: number) =>
  queryOptions({
    queryKey: [...sharedQueryKeys.reviews, 'job', jobId],
    queryFn: () => getReview(jobId),
  });

export function useReview(jobId: number, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...getReviewQueryOptions(jobId), enabled: enabled && Number.isInteger(jobId) && jobId > 0 });
}
