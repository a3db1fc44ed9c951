import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Job, ListJobsQuery, ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

export function getJobs(query: ListJobsQuery = {}): Promise<ListResponse<Job>> {
  return api.get<ListResponse<Job>>('/jobs', { params: query });
}

export const getJobsQueryOptions = (query?: ListJobsQuery) =>
  queryOptions({
    queryKey: query ? [...sharedQueryKeys.jobs, query] : sharedQueryKeys.jobs,
    queryFn: () => getJobs(query),
  });

export function useJobs({ query, enabled = true }: { query: ListJobsQuery; enabled?: boolean }) {
  return useQuery({ ...getJobsQueryOptions(query), placeholderData: keepPreviousData, enabled });
}
