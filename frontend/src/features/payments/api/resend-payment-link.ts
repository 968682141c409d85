import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PaymentRequestView } from '@loambook/common';
import { api } from '@/lib/api-client';

/** E-mails an open link to the homeowner again. */
export function resendPaymentLink(requestId: string): Promise<PaymentRequestView> {
  return api.post<PaymentRequestView>(`/payment-requests/${encodeURIComponent(requestId)}/resend`, {});
}

export function useResendPaymentLink() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: resendPaymentLink,
    onSuccess: async (request) => {
      await queryClient.invalidateQueries({ queryKey: ['payments', 'contract', request.contractId] });
    },
  });
}
