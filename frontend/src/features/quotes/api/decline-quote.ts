import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DeclineQuoteRequest, Quote } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { optionalText } from '@/utils/form-schema';
import { getQuotesQueryOptions } from './get-quotes';

export const declineQuoteSchema = z.object({ note: optionalText(2000) }) satisfies z.ZodType<DeclineQuoteRequest, unknown>;

export type DeclineQuoteInput = { id: number } & DeclineQuoteRequest;

export function declineQuote({ id, ...body }: DeclineQuoteInput): Promise<Quote> {
  return api.post<Quote>(`/quotes/${id}/decline`, body, { notify: false });
}

export function useDeclineQuote({ onSuccess }: { onSuccess?: (quote: Quote) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: declineQuote,
    onSuccess: async (quote) => {
      await queryClient.invalidateQueries({ queryKey: getQuotesQueryOptions().queryKey });
      onSuccess?.(quote);
    },
  });
}
