import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Run } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

export function getImportRun(runId: number): Promise<Run> {
  return api.get<Run>(`/runs/${runId}`);
}

// Under the runs key, so an import (which invalidates ['runs']) refreshes the counts shown here too.
export const getImportRunQueryOptions = (runId: number) =>
  queryOptions({
    queryKey: ['runs', 'detail', runId],
    queryFn: () => getImportRun(runId),
  });

export function useImportRun(runId: number) {
  return useQuery({ ...getImportRunQueryOptions(runId), enabled: runId > 0 });
}
