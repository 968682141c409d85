import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProposalSummary } from '@loambook/common';
import { api } from '@/lib/api-client';

/** Every version of the lead's proposal that the person may see, newest first. */
export function getLeadProposals(leadId: string, signal?: AbortSignal): Promise<ProposalSummary[]> {
  return api.get<ProposalSummary[]>(`/leads/${encodeURIComponent(leadId)}/proposals`, { signal });
}

export const leadProposalsQueryOptions = (leadId: string) =>
  queryOptions({
    queryKey: ['proposals', 'list', { leadId }],
    queryFn: ({ signal }) => getLeadProposals(leadId, signal),
  });

export function useLeadProposals(leadId: string) {
  return useQuery(leadProposalsQueryOptions(leadId));
}
