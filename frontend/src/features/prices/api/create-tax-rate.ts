import { useMutation, useQueryClient } from '@tanstack/react-query';
import { MONEY_LIMITS } from '@kilocycle/common/money';
import type { CreateTaxRateRequest, TaxRate } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { requiredText, typedRate } from '@/utils/form-schema';
import { getCustomerTermsQueryOptions } from './get-customer-terms';
import { getTaxRatesQueryOptions } from './get-tax-rates';

/** The tax rate form: the rate as typed in percent, read exactly into basis points. */
export const taxRateSchema = z.object({
  name: requiredText(120, 'Name the rate'),
  rate: typedRate(MONEY_LIMITS.maxRateBasisPoints),
  active: z.boolean(),
});

export function createTaxRate(body: CreateTaxRateRequest): Promise<TaxRate> {
  return api.post<TaxRate>('/prices/tax-rates', body, { notify: false });
}

export function useCreateTaxRate({ onSuccess }: { onSuccess?: (rate: TaxRate) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createTaxRate,
    onSuccess: async (rate) => {
      // A customer without terms of its own is taxed at the lowest-id active rate: the defaults may change.
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: getTaxRatesQueryOptions().queryKey }),
        queryClient.invalidateQueries({ queryKey: getCustomerTermsQueryOptions().queryKey }),
      ]);
      onSuccess?.(rate);
    },
  });
}
