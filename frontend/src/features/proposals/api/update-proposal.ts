import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProposalDetail, UpdateProposalRequest } from '@loambook/common';
import { apiRequest } from '@/lib/api-client';
import { invalidateSelling } from './invalidate';

export interface UpdateProposalVariables {
  id: string;
  input: UpdateProposalRequest;
}

/**
 * Replaces the options. A draft, refused or approved version changes in place (and returns to draft); a
 * sent one answers with a NEW version — its id differs from the one sent: open it.
 */
export function updateProposal({ id, input }: UpdateProposalVariables): Promise<ProposalDetail> {
  return apiRequest<ProposalDetail>(`/proposals/${encodeURIComponent(id)}`, { method: 'PUT', body: input });
}

export function useUpdateProposal() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateProposal,
    onSuccess: async (proposal) => {
      queryClient.setQueryData(['proposals', 'detail', proposal.id], proposal);
      await invalidateSelling(queryClient);
    },
  });
}
