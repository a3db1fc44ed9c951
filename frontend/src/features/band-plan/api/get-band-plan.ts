import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { BandPlanQuery, BandPlanResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

export function getBandPlan(instrumentId: number, query: BandPlanQuery = {}): Promise<BandPlanResponse> {
  return api.get<BandPlanResponse>(`/instruments/${instrumentId}/band-plan`, { params: query, notify: false });
}

export const getBandPlanQueryOptions = (instrumentId: number, query?: BandPlanQuery) =>
  queryOptions({
    queryKey: query ? ['band-plan', instrumentId, query] : ['band-plan', instrumentId],
    queryFn: () => getBandPlan(instrumentId, query),
  });

export function useBandPlan({ instrumentId, query }: { instrumentId: number; query: BandPlanQuery }) {
  return useQuery({ ...getBandPlanQueryOptions(instrumentId, query), placeholderData: keepPreviousData });
}
