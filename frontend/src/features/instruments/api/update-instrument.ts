import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Instrument, UpdateInstrumentRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getInstrumentQueryOptions } from './get-instrument';
import { getInstrumentsQueryOptions } from './get-instruments';

export type UpdateInstrumentInput = { id: number; changes: UpdateInstrumentRequest };

export function updateInstrument({ id, changes }: UpdateInstrumentInput): Promise<Instrument> {
  return api.patch<Instrument>(`/instruments/${id}`, changes, { notify: false });
}

export function useUpdateInstrument({ onSuccess }: { onSuccess?: (instrument: Instrument) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateInstrument,
    onSuccess: async (instrument) => {
      queryClient.setQueryData(getInstrumentQueryOptions(instrument.id).queryKey, instrument);
      await queryClient.invalidateQueries({ queryKey: getInstrumentsQueryOptions().queryKey });
      onSuccess?.(instrument);
    },
  });
}
