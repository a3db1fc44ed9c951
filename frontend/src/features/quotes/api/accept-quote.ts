import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AcceptanceChannel, AcceptQuoteRequest, Quote } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';
import { requiredText } from '@/utils/form-schema';
import { getQuotesQueryOptions } from './get-quotes';

/** Ways a customer tells the lab, other than the portal (where the client accepts for itself). */
export const RECORDED_CHANNELS = ['phone', 'email', 'in_person'] as const satisfies readonly AcceptanceChannel[];

/** The lab records an acceptance given another way: how, and a note of who said what. */
export const recordAcceptanceSchema = z.object({
  channel: z.enum(RECORDED_CHANNELS),
  note: requiredText(2000, 'Note who accepted and how, for the record'),
}) satisfies z.ZodType<AcceptQuoteRequest, unknown>;

export type AcceptQuoteInput = { id: number } & AcceptQuoteRequest;

/** A client accepts with an empty body (channel portal); staff send the channel and a note. */
export function acceptQuote({ id, ...body }: AcceptQuoteInput): Promise<Quote> {
  return api.post<Quote>(`/quotes/${id}/accept`, body, { notify: false });
}

export function useAcceptQuote({ onSuccess }: { onSuccess?: (quote: Quote) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptQuote,
    onSuccess: async (quote) => {
      // An accepted quote opens the job to work: its page may offer to start now.
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: getQuotesQueryOptions().queryKey }),
        queryClient.invalidateQueries({ queryKey: sharedQueryKeys.jobs }),
      ]);
      onSuccess?.(quote);
    },
  });
}
