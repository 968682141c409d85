import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PaymentView, RecordPaymentRequest } from '@loambook/common';
import { api } from '@/lib/api-client';

/** The bookkeeper records cash, a cheque or a transfer (posted to the bank). The request id makes a retry safe. */
export function recordPayment({
  contractId,
  ...input
}: { contractId: string } & RecordPaymentRequest): Promise<PaymentView> {
  return api.post<PaymentView>(`/contracts/${encodeURIComponent(contractId)}/payments`, input);
}

export function useRecordPayment() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: recordPayment,
    // The panel, the payments list, the ledger and the lead (its stage and timeline) all change.
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['payments'] }),
        queryClient.invalidateQueries({ queryKey: ['ledger'] }),
        queryClient.invalidateQueries({ queryKey: ['leads'] }),
      ]);
    },
  });
}
