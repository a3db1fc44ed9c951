import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditEventView, ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

/** A job's audit trail with its runs and reading exclusions, newest first (lab staff only). */
export function getJobHistory(jobId: number): Promise<ListResponse<AuditEventView>> {
  return api.get<ListResponse<AuditEventView>>('/audit', { params: { jobId, sort: '-at', pageSize: 200 }, notify: false });
}

export const getJobHistoryQueryOptions = (jobId: number) =>
  queryOptions({
    queryKey: [...sharedQueryKeys.jobs, 'history', jobId],
    queryFn: () => getJobHistory(jobId),
  });

export function useJobHistory({ jobId, enabled = true }: { jobId: number; enabled?: boolean }) {
  return useQuery({ ...getJobHistoryQueryOptions(jobId), enabled });
}
