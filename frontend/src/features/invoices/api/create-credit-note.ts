import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateCreditNoteRequest, CreditNote } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { requiredText, typedMoney } from '@/utils/form-schema';
import { refreshInvoices } from './refresh-invoices';

/** Reasons and notes on money documents: at least a few words, at most this many characters. */
export const REASON_LIMITS = { min: 3, max: 2000 } as const;

/** The amount (gross, tax included) as typed, read exactly, at most what is left to credit; and why. */
export const amountAndReasonSchema = (currency: string, maxMinor: number) =>
  z.object({
    amount: typedMoney(currency, maxMinor).refine((minor) => minor > 0, 'More than zero'),
    reason: requiredText(REASON_LIMITS.max, 'Say why, for the record').refine(
      (text) => text.length >= REASON_LIMITS.min,
      `At least ${REASON_LIMITS.min} characters`,
    ),
  });

export type CreateCreditNoteInput = { invoiceId: number } & CreateCreditNoteRequest;

export function createCreditNote({ invoiceId, ...body }: CreateCreditNoteInput): Promise<CreditNote> {
  return api.post<CreditNote>(`/invoices/${invoiceId}/credit-notes`, body, { notify: false });
}

export function useCreateCreditNote({ onSuccess }: { onSuccess?: (note: CreditNote) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createCreditNote,
    onSuccess: async (note) => {
      await refreshInvoices(queryClient);
      onSuccess?.(note);
    },
  });
}
