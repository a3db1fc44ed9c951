import { queryOptions, useQuery } from '@tanstack/react-query';
import { MAX_PAGE_SIZE, type ListProceduresQuery, type ListResponse, type Procedure } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

export function getProcedures(query: ListProceduresQuery = {}): Promise<ListResponse<Procedure>> {
  return api.get<ListResponse<Procedure>>('/procedures', { params: query });
}

// A lab has a handful of procedures: one page holds them all.
const ALL: ListProceduresQuery = { pageSize: MAX_PAGE_SIZE, sort: 'name' };

/** The root of every procedures query, whatever its filters. */
export const proceduresQueryKey = ['procedures'] as const;

export const getProceduresQueryOptions = (query: ListProceduresQuery = ALL) =>
  queryOptions({
    queryKey: [...proceduresQueryKey, query],
    queryFn: () => getProcedures(query),
  });

export function useProcedures(query?: ListProceduresQuery) {
  return useQuery(getProceduresQueryOptions(query));
}
