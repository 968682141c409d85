import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateProposalRequest, ProposalDetail } from '@loambook/common';
import { api } from '@/lib/api-client';
import { invalidateSelling } from './invalidate';

export interface CreateProposalVariables {
  leadId: string;
  input: CreateProposalRequest;
}

/** 409 PROPOSAL.EXISTS (details.proposalId) when the lead already has a live proposal: open that one. */
export function createProposal({ leadId, input }: CreateProposalVariables): Promise<ProposalDetail> {
  return api.post<ProposalDetail>(`/leads/${encodeURIComponent(leadId)}/proposals`, input);
}

export function useCreateProposal() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createProposal,
    onSuccess: async (proposal) => {
      queryClient.setQueryData(['proposals', 'detail', proposal.id], proposal);
      await invalidateSelling(queryClient);
    },
  });
}
