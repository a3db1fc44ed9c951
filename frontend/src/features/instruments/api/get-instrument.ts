import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Instrument } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

export function getInstrument(id: number): Promise<Instrument> {
  return api.get<Instrument>(`/instruments/${id}`, { notify: false });
}

export const getInstrumentQueryOptions = (id: number) =>
  queryOptions({
    queryKey: ['instruments', 'detail', id],
    queryFn: () => getInstrument(id),
  });

export function useInstrument({ id, enabled = true }: { id: number; enabled?: boolean }) {
  return useQuery({ ...getInstrumentQueryOptions(id), enabled: enabled && Number.isInteger(id) && id > 0 });
}
