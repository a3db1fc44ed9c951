import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditEventView, ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

/** Corrections of a run's details (audit action update on the run), newest first (lab staff only). */
export function getRunCorrections(runId: number): Promise<ListResponse<AuditEventView>> {
  return api.get<ListResponse<AuditEventView>>('/audit', {
    params: { entity: 'run', entityId: String(runId), action: 'update', sort: '-at', pageSize: 100 },
    notify: false,
  });
}

export const getRunCorrectionsQueryOptions = (runId: number) =>
  queryOptions({
    queryKey: [...sharedQueryKeys.runs, 'corrections', runId],
    queryFn: () => getRunCorrections(runId),
  });

export function useRunCorrections({ runId, enabled = true }: { runId: number; enabled?: boolean }) {
  return useQuery({ ...getRunCorrectionsQueryOptions(runId), enabled });
}
