import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreatePriceBookItemRequest, PriceBookItem } from '@loambook/common';
import { api } from '@/lib/api-client';

export interface CreatePriceBookItemVariables {
  branchId: string;
  input: CreatePriceBookItemRequest;
}

/** 409 PRICE_BOOK.CODE_TAKEN (field "code") when the branch already has the code. */
export function createPriceBookItem({
  branchId,
  input,
}: CreatePriceBookItemVariables): Promise<PriceBookItem> {
  return api.post<PriceBookItem>(`/branches/${encodeURIComponent(branchId)}/price-book`, input);
}

export function useCreatePriceBookItem() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createPriceBookItem,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: ['price-book'] });
    },
  });
}
