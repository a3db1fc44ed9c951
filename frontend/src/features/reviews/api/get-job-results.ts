import { queryOptions, useQuery } from '@tanstack/react-query';
import type { JobResults } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

export function getJobResults(jobId: number): Promise<JobResults> {
  return api.get<JobResults>(`/jobs/${jobId}/results`);
}

export const getJobResultsQueryOptions = (jobId: number) =>
  queryOptions({
    queryKey: [...sharedQueryKeys.reviews, 'results', jobId],
    queryFn: () => getJobResults(jobId),
  });

export function useJobResults(jobId: number) {
  return useQuery({ ...getJobResultsQueryOptions(jobId), enabled: Number.isInteger(jobId) && jobId > 0 });
}
