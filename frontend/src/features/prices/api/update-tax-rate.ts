import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TaxRate, UpdateTaxRateRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getCustomerTermsQueryOptions } from './get-customer-terms';
import { getTaxRatesQueryOptions } from './get-tax-rates';

export type UpdateTaxRateInput = { id: number; changes: UpdateTaxRateRequest };

export function updateTaxRate({ id, changes }: UpdateTaxRateInput): Promise<TaxRate> {
  return api.patch<TaxRate>(`/prices/tax-rates/${id}`, changes, { notify: false });
}

export function useUpdateTaxRate({ onSuccess }: { onSuccess?: (rate: TaxRate) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateTaxRate,
    onSuccess: async (rate) => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: getTaxRatesQueryOptions().queryKey }),
        queryClient.invalidateQueries({ queryKey: getCustomerTermsQueryOptions().queryKey }),
      ]);
      onSuccess?.(rate);
    },
  });
}
