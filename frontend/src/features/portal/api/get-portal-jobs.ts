import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Job, ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

/** The organisation's jobs, newest first. */
export function getPortalJobs(): Promise<ListResponse<Job>> {
  return api.get<ListResponse<Job>>('/jobs', { params: { pageSize: 50, sort: '-receivedDate' } });
}

export const getPortalJobsQueryOptions = () =>
  queryOptions({
    queryKey: [...sharedQueryKeys.portal, 'jobs'],
    queryFn: getPortalJobs,
  });

export function usePortalJobs() {
  return useQuery(getPortalJobsQueryOptions());
}
