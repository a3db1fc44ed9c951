import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PriceItem, UpdatePriceItemRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getPriceItemsQueryOptions } from '@/lib/get-price-items';

export type UpdatePriceItemInput = { id: number; changes: UpdatePriceItemRequest };

export function updatePriceItem({ id, changes }: UpdatePriceItemInput): Promise<PriceItem> {
  return api.patch<PriceItem>(`/prices/items/${id}`, changes, { notify: false });
}

export function useUpdatePriceItem({ onSuccess }: { onSuccess?: (item: PriceItem) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updatePriceItem,
    onSuccess: async (item) => {
      await queryClient.invalidateQueries({ queryKey: getPriceItemsQueryOptions().queryKey });
      onSuccess?.(item);
    },
  });
}
