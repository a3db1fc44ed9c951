import { useMutation, useQueryClient } from '@tanstack/react-query';
import { PAYMENT_TERMS, type CustomerTerms, type UpdateCustomerTermsRequest } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { optionalText, requiredNumber } from '@/utils/form-schema';
import { getCustomerTermsQueryOptions } from './get-customer-terms';

/** Longest net terms the form takes (days); the server has the last word. */
export const MAX_NET_DAYS = 365;

/** The tax select's value for an exempt customer. */
export const EXEMPT = 'exempt';

export const customerTermsSchema = z
  .object({
    tax: z.string().min(1, 'Choose a tax rate, or exempt'),
    taxRegistration: optionalText(60),
    paymentTerms: z.enum(PAYMENT_TERMS),
    netDays: requiredNumber({ min: 0, max: MAX_NET_DAYS, integer: true, message: `Whole days, 0 to ${MAX_NET_DAYS}` }),
    requiresQuote: z.boolean(),
  })
  .superRefine((terms, context) => {
    if (terms.tax === EXEMPT && !terms.taxRegistration)
      context.addIssue({ code: 'custom', path: ['taxRegistration'], message: 'An exempt customer needs its tax registration number' });
  })
  .transform(({ tax, paymentTerms, netDays, ...rest }): UpdateCustomerTermsRequest => ({
    ...rest,
    taxRateId: tax === EXEMPT ? null : Number(tax),
    paymentTerms,
    // Paying before release has no credit period.
    netDays: paymentTerms === 'pay_before_release' ? 0 : netDays,
  }));

export type UpdateCustomerTermsInput = { organizationId: number; terms: UpdateCustomerTermsRequest };

export function updateCustomerTerms({ organizationId, terms }: UpdateCustomerTermsInput): Promise<CustomerTerms> {
  return api.put<CustomerTerms>(`/prices/customer-terms/${organizationId}`, terms, { notify: false });
}

export function useUpdateCustomerTerms({ onSuccess }: { onSuccess?: (terms: CustomerTerms) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateCustomerTerms,
    onSuccess: async (terms) => {
      await queryClient.invalidateQueries({ queryKey: getCustomerTermsQueryOptions().queryKey });
      onSuccess?.(terms);
    },
  });
}
