import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import type { Quote, UpdateQuoteRequest } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { optionalText, requiredNumber } from '@/utils/form-schema';
import { getQuotesQueryOptions } from './get-quotes';

/** Longest validity the form offers (days); the server has the last word. */
export const MAX_VALIDITY_DAYS = 365;

/** A draft's validity and notes (its lines are saved by the line editor). */
export const quoteSettingsSchema = z.object({
  validityDays: requiredNumber({ min: 1, max: MAX_VALIDITY_DAYS, integer: true, message: `Whole days, 1 to ${MAX_VALIDITY_DAYS}` }),
  notes: optionalText(FIELD_LIMITS.notes.max),
}) satisfies z.ZodType<UpdateQuoteRequest, unknown>;

export type UpdateQuoteInput = { id: number; changes: UpdateQuoteRequest };

/** Draft only; the server answers 409 for a quote already sent. */
export function updateQuote({ id, changes }: UpdateQuoteInput): Promise<Quote> {
  return api.patch<Quote>(`/quotes/${id}`, changes, { notify: false });
}

export function useUpdateQuote({ onSuccess }: { onSuccess?: (quote: Quote) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateQuote,
    onSuccess: async (quote) => {
      await queryClient.invalidateQueries({ queryKey: getQuotesQueryOptions().queryKey });
      onSuccess?.(quote);
    },
  });
}
