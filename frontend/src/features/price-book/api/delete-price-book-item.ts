import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** Only an item no proposal line names; otherwise 409 PRICE_BOOK.ITEM_IN_USE (deactivate it instead). */
export function deletePriceBookItem(id: string): Promise<void> {
  return api.delete(`/price-book/${encodeURIComponent(id)}`);
}

export function useDeletePriceBookItem() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deletePriceBookItem,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: ['price-book'] });
    },
  });
}
