import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RefundRequest, RefundView } from '@loambook/common';
import { api } from '@/lib/api-client';

/** Gives a cancelled contract's card payments back through the processor. */
export function refundPayments({
  contractId,
  ...input
}: { contractId: string } & RefundRequest): Promise<RefundView[]> {
  return api.post<RefundView[]>(`/contracts/${encodeURIComponent(contractId)}/refunds`, input);
}

export function useRefundPayments() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: refundPayments,
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['payments'] }),
        queryClient.invalidateQueries({ queryKey: ['ledger'] }),
        queryClient.invalidateQueries({ queryKey: ['leads'] }),
      ]);
    },
  });
}
