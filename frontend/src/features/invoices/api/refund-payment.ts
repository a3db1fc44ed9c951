import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Payment, RefundPaymentRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { refreshInvoices } from './refresh-invoices';

export type RefundPaymentInput = { paymentId: number } & RefundPaymentRequest;

/** Refunds through the payment service; the server records a credit note of the refunded amount with it. */
export function refundPayment({ paymentId, ...body }: RefundPaymentInput): Promise<Payment> {
  return api.post<Payment>(`/payments/${paymentId}/refund`, body, { notify: false });
}

export function useRefundPayment({ onSuccess }: { onSuccess?: (payment: Payment) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: refundPayment,
    onSuccess: async (payment) => {
      await refreshInvoices(queryClient);
      onSuccess?.(payment);
    },
  });
}
