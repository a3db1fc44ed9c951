import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Quote } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getQuotesQueryOptions } from './get-quotes';

/** A draft quote for the job, starting from the proposed lines (409 while the job has a draft or sent quote). */
export function createQuote(jobId: number): Promise<Quote> {
  return api.post<Quote>(`/jobs/${jobId}/quote`, undefined, { notify: false });
}

export function useCreateQuote({ onSuccess }: { onSuccess?: (quote: Quote) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createQuote,
    onSuccess: async (quote) => {
      await queryClient.invalidateQueries({ queryKey: getQuotesQueryOptions().queryKey });
      onSuccess?.(quote);
    },
  });
}
