import { useMutation, useQueryClient } from '@tanstack/react-query';
import { MONEY_LIMITS } from '@kilocycle/common/money';
import { PRICE_UNITS, type CreatePriceItemRequest, type PriceItem } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { getPriceItemsQueryOptions } from '@/lib/get-price-items';
import { requiredText, typedMoney } from '@/utils/form-schema';

/** Longest code and description the form takes; the server has the last word and its refusal is shown. */
export const PRICE_ITEM_LIMITS = { code: 40, description: 500 } as const;

/** The price item form, in the lab's currency: the unit price as typed, read exactly into minor units. */
export const priceItemSchema = (currency: string) =>
  z.object({
    code: requiredText(PRICE_ITEM_LIMITS.code, 'Give the service a code'),
    description: requiredText(PRICE_ITEM_LIMITS.description, 'Say what the service is'),
    unit: z.enum(PRICE_UNITS),
    unitPrice: typedMoney(currency, MONEY_LIMITS.maxUnitPriceMinor),
    proposeOnQuotes: z.boolean(),
    active: z.boolean(),
  });

export function createPriceItem(body: CreatePriceItemRequest): Promise<PriceItem> {
  return api.post<PriceItem>('/prices/items', body, { notify: false });
}

export function useCreatePriceItem({ onSuccess }: { onSuccess?: (item: PriceItem) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createPriceItem,
    onSuccess: async (item) => {
      await queryClient.invalidateQueries({ queryKey: getPriceItemsQueryOptions().queryKey });
      onSuccess?.(item);
    },
  });
}
