import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProposalDetail } from '@loambook/common';
import { api } from '@/lib/api-client';
import { invalidateSelling } from './invalidate';

/** Within the floor and the submitter's authority → 'approved'; otherwise 'pending_approval' (managers e-mailed). */
export function submitProposal(id: string): Promise<ProposalDetail> {
  return api.post<ProposalDetail>(`/proposals/${encodeURIComponent(id)}/submit`);
}

export function useSubmitProposal() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: submitProposal,
    onSuccess: async (proposal) => {
      queryClient.setQueryData(['proposals', 'detail', proposal.id], proposal);
      await invalidateSelling(queryClient);
    },
  });
}
