import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SendProposalRequest, SendProposalResponse } from '@loambook/common';
import { api } from '@/lib/api-client';
import { invalidateSelling } from './invalidate';

export interface SendProposalVariables {
  id: string;
  input: SendProposalRequest;
}

/** E-mails an approved (or already sent) version with a new signing link; earlier unused links stop. */
export function sendProposal({ id, input }: SendProposalVariables): Promise<SendProposalResponse> {
  return api.post<SendProposalResponse>(`/proposals/${encodeURIComponent(id)}/send`, input);
}

export function useSendProposal() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: sendProposal,
    onSuccess: async (result) => {
      queryClient.setQueryData(['proposals', 'detail', result.proposal.id], result.proposal);
      await invalidateSelling(queryClient);
    },
  });
}
