import { useMutation } from '@tanstack/react-query';
import type { PayInvoiceResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

/** Starts a card payment of the invoice's balance; the answer holds the payment page's address. */
export function payInvoice(invoiceId: number): Promise<PayInvoiceResponse> {
  return api.post<PayInvoiceResponse>(`/invoices/${invoiceId}/pay`, undefined, { notify: false });
}

export function usePayInvoice({ onSuccess }: { onSuccess?: (response: PayInvoiceResponse) => void } = {}) {
  return useMutation({ mutationFn: payInvoice, onSuccess });
}
