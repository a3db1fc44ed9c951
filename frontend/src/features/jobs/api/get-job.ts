import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Job } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

export function getJob(id: number): Promise<Job> {
  return api.get<Job>(`/jobs/${id}`, { notify: false });
}

export const getJobQueryOptions = (id: number) =>
  queryOptions({
    queryKey: [...sharedQueryKeys.jobs, 'detail', id],
    queryFn: () => getJob(id),
  });

export function useJob({ id, enabled = true }: { id: number; enabled?: boolean }) {
  return useQuery({ ...getJobQueryOptions(id), enabled: enabled && Number.isInteger(id) && id > 0 });
}
