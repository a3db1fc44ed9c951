import { queryOptions, useQuery } from '@tanstack/react-query';
import { MAX_PAGE_SIZE, type Instrument, type ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

/** The organisation's instruments, soonest due first (the server scopes a client to its own). */
export function getPortalInstruments(): Promise<ListResponse<Instrument>> {
  return api.get<ListResponse<Instrument>>('/instruments', { params: { pageSize: MAX_PAGE_SIZE, sort: 'nextDueDate' } });
}

export const getPortalInstrumentsQueryOptions = () =>
  queryOptions({
    queryKey: [...sharedQueryKeys.portal, 'instruments'],
    queryFn: getPortalInstruments,
  });

export function usePortalInstruments() {
  return useQuery(getPortalInstrumentsQueryOptions());
}
