import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse, Reading } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

/** How many of a run's newest readings the live pages keep at hand. */
export const LATEST_READINGS = 500;

/** The run's newest readings, oldest first; live events append to this same cache entry. */
export async function getLatestReadings(runId: number): Promise<Reading[]> {
  const page = await api.get<ListResponse<Reading>>(`/runs/${runId}/readings`, { params: { sort: '-seq', pageSize: LATEST_READINGS } });
  return [...page.items].reverse();
}

export const getLatestReadingsQueryOptions = (runId: number) =>
  queryOptions({
    queryKey: [...sharedQueryKeys.readings, runId, 'latest'],
    queryFn: () => getLatestReadings(runId),
    // Kept current by the live stream, not by refetching.
    staleTime: Infinity,
  });

export function useLatestReadings({ runId, enabled = true }: { runId: number; enabled?: boolean }) {
  return useQuery({ ...getLatestReadingsQueryOptions(runId), enabled });
}

/** Adds readings that arrived live, in seq order, without duplicates, keeping the newest LATEST_READINGS. */
export function mergeReadings(current: readonly Reading[] | undefined, arrived: readonly Reading[]): Reading[] {
  const bySeq = new Map<number, Reading>();
  for (const r of current ?? []) bySeq.set(r.seq, r);
  for (const r of arrived) bySeq.set(r.seq, r);
  const merged = [...bySeq.values()].sort((a, b) => a.seq - b.seq);
  return merged.length > LATEST_READINGS ? merged.slice(merged.length - LATEST_READINGS) : merged;
}
