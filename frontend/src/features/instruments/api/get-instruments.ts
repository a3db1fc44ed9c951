import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Instrument, ListInstrumentsQuery, ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

export function getInstruments(query: ListInstrumentsQuery = {}): Promise<ListResponse<Instrument>> {
  return api.get<ListResponse<Instrument>>('/instruments', { params: query });
}

export const getInstrumentsQueryOptions = (query?: ListInstrumentsQuery) =>
  queryOptions({
    queryKey: query ? ['instruments', query] : ['instruments'],
    queryFn: () => getInstruments(query),
  });

type UseInstrumentsOptions = { query: ListInstrumentsQuery; enabled?: boolean };

export function useInstruments({ query, enabled = true }: UseInstrumentsOptions) {
  return useQuery({ ...getInstrumentsQueryOptions(query), placeholderData: keepPreviousData, enabled });
}
