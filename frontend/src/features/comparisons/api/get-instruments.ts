import { queryOptions, useQuery } from '@tanstack/react-query';
import { MAX_PAGE_SIZE, type Instrument, type ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

/** Every instrument, to pick the one whose studies are compared. */
export function getComparableInstruments(): Promise<ListResponse<Instrument>> {
  return api.get<ListResponse<Instrument>>('/instruments', { params: { pageSize: MAX_PAGE_SIZE, sort: 'make' } });
}

export const getComparableInstrumentsQueryOptions = () =>
  queryOptions({
    queryKey: ['comparisons', 'instruments'],
    queryFn: getComparableInstruments,
  });

export function useComparableInstruments() {
  return useQuery(getComparableInstrumentsQueryOptions());
}
