import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Run } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { runDetailQueryKey } from '@/lib/query-keys';

export function getRun(id: number): Promise<Run> {
  return api.get<Run>(`/runs/${id}`, { notify: false });
}

export const getRunQueryOptions = (id: number) =>
  queryOptions({
    queryKey: runDetailQueryKey(id),
    queryFn: () => getRun(id),
  });

export function useRun({ id, enabled = true }: { id: number; enabled?: boolean }) {
  return useQuery({ ...getRunQueryOptions(id), enabled: enabled && Number.isInteger(id) && id > 0 });
}
