import { queryOptions, useQuery } from '@tanstack/react-query';
import { MAX_PAGE_SIZE, type ComparableRunKind, type ListResponse, type Run } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

/** An instrument's warm-up or stability runs, oldest first (before comes before after). */
export function getStudyRuns(instrumentId: number, kind: ComparableRunKind): Promise<ListResponse<Run>> {
  return api.get<ListResponse<Run>>('/runs', { params: { instrumentId, kind, pageSize: MAX_PAGE_SIZE, sort: 'startedAt' } });
}

export const getStudyRunsQueryOptions = (instrumentId: number, kind: ComparableRunKind) =>
  queryOptions({
    queryKey: ['comparisons', 'runs', instrumentId, kind],
    queryFn: () => getStudyRuns(instrumentId, kind),
  });

export function useStudyRuns(instrumentId: number | null, kind: ComparableRunKind) {
  return useQuery({ ...getStudyRunsQueryOptions(instrumentId ?? 0, kind), enabled: instrumentId !== null });
}
