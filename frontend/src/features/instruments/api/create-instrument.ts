import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import type { CreateInstrumentRequest, Instrument } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { optionalNumber, optionalText, requiredId, requiredText } from '@/utils/form-schema';
import { getInstrumentsQueryOptions } from './get-instruments';

const { instrument: LIMITS } = FIELD_LIMITS;
const MONTHS = LIMITS.recallIntervalMonths;

/** The instrument form (new and edit): checked before sending; the server checks again. */
export const instrumentSchema = z.object({
  organizationId: requiredId('Choose the owner'),
  make: requiredText(LIMITS.text.max, 'Enter the make'),
  model: requiredText(LIMITS.text.max, 'Enter the model'),
  serial: requiredText(LIMITS.text.max, 'Enter the serial number'),
  assetTag: optionalText(LIMITS.text.max),
  description: optionalText(FIELD_LIMITS.notes.max),
  recallIntervalMonths: optionalNumber({ ...MONTHS, integer: true, message: `A whole number of months, ${MONTHS.min} to ${MONTHS.max}` }).transform(
    (months) => months ?? undefined,
  ),
  nextDueDate: z.string().transform((date) => date || null),
}) satisfies z.ZodType<CreateInstrumentRequest, unknown>;

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
