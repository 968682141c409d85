import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PriceBookItem, UpdatePriceBookItemRequest } from '@loambook/common';
import { api } from '@/lib/api-client';

export interface UpdatePriceBookItemVariables {
  id: string;
  patch: UpdatePriceBookItemRequest;
}

/** Any subset of the fields; `{ active: false }` deactivates. Proposals already made keep their copy. */
export function updatePriceBookItem({ id, patch }: UpdatePriceBookItemVariables): Promise<PriceBookItem> {
  return api.patch<PriceBookItem>(`/price-book/${encodeURIComponent(id)}`, patch);
}

export function useUpdatePriceBookItem() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updatePriceBookItem,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: ['price-book'] });
    },
  });
}
