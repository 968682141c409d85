import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreatePaymentLinkRequest, PaymentLinkResult } from '@loambook/common';
import { api } from '@/lib/api-client';

/** A card payment link (the processor's hosted page) for the deposit or the balance, e-mailed to the homeowner. */
export function createPaymentLink({
  contractId,
  ...input
}: { contractId: string } & CreatePaymentLinkRequest): Promise<PaymentLinkResult> {
  return api.post<PaymentLinkResult>(`/contracts/${encodeURIComponent(contractId)}/payment-links`, input);
}

export function useCreatePaymentLink() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createPaymentLink,
    onSuccess: async (_result, { contractId }) => {
      await queryClient.invalidateQueries({ queryKey: ['payments', 'contract', contractId] });
    },
  });
}
