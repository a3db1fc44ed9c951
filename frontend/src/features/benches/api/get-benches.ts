import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Bench, ListQuery, ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

export type BenchesQuery = ListQuery & { active?: boolean };

export function getBenches(query: BenchesQuery = {}): Promise<ListResponse<Bench>> {
  return api.get<ListResponse<Bench>>('/benches', { params: query });
}

export const getBenchesQueryOptions = (query?: BenchesQuery) =>
  queryOptions({
    queryKey: query ? ['benches', query] : ['benches'],
    queryFn: () => getBenches(query),
  });

export function useBenches({ query, enabled = true }: { query: BenchesQuery; enabled?: boolean }) {
  return useQuery({ ...getBenchesQueryOptions(query), placeholderData: keepPreviousData, enabled });
}
