import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateInstrumentRequest, Instrument } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getInstrumentsQueryOptions } from './get-instruments';

export type CreateInstrumentErrors = Partial<Record<'organizationId' | 'make' | 'model' | 'serial' | 'recallIntervalMonths', string>>;

export function validateCreateInstrument(input: CreateInstrumentRequest): CreateInstrumentErrors {
  const errors: CreateInstrumentErrors = {};
  if (!input.organizationId) errors.organizationId = 'Choose the owner';
  if (!input.make.trim()) errors.make = 'Enter the make';
  if (!input.model.trim()) errors.model = 'Enter the model';
  if (!input.serial.trim()) errors.serial = 'Enter the serial number';
  const months = input.recallIntervalMonths;
  if (months !== undefined && (!Number.isInteger(months) || months < 1 || months > 120))
    errors.recallIntervalMonths = 'A whole number of months, 1 to 120';
  return errors;
}

export function createInstrument(body: CreateInstrumentRequest): Promise<Instrument> {
  return api.post<Instrument>('/instruments', body, { notify: false });
}

export function useCreateInstrument({ onSuccess }: { onSuccess?: (instrument: Instrument) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createInstrument,
    onSuccess: async (instrument) => {
      await queryClient.invalidateQueries({ queryKey: getInstrumentsQueryOptions().queryKey });
      onSuccess?.(instrument);
    },
  });
}
