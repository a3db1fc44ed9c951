import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Quote } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getQuotesQueryOptions } from './get-quotes';

/** Stores the PDF and mails it to the customer's contact; the quote is then valid until sent date + validity days. */
export function sendQuote(id: number): Promise<Quote> {
  return api.post<Quote>(`/quotes/${id}/send`, undefined, { notify: false });
}

export function useSendQuote({ onSuccess }: { onSuccess?: (quote: Quote) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: sendQuote,
    onSuccess: async (quote) => {
      await queryClient.invalidateQueries({ queryKey: getQuotesQueryOptions().queryKey });
      onSuccess?.(quote);
    },
  });
}
