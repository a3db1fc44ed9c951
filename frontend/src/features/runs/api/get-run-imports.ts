import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditEventView, ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

/** The run's file imports (audit action import on the run: file, mode, rows, imported, skipped), newest first (lab staff only). */
export function getRunImports(runId: number): Promise<ListResponse<AuditEventView>> {
  return api.get<ListResponse<AuditEventView>>('/audit', {
    params: { entity: 'run', entityId: String(runId), action: 'import', sort: '-at', pageSize: 100 },
    notify: false,
  });
}

// Under ['runs', …] so that an import, which refreshes ['runs'], refreshes this list too.
export const getRunImportsQueryOptions = (runId: number) =>
  queryOptions({
    queryKey: [...sharedQueryKeys.runs, 'imports', runId],
    queryFn: () => getRunImports(runId),
  });

export function useRunImports({ runId, enabled = true }: { runId: number; enabled?: boolean }) {
  return useQuery({ ...getRunImportsQueryOptions(runId), enabled });
}
