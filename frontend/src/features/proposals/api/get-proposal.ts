import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProposalDetail } from '@loambook/common';
import { api } from '@/lib/api-client';

export function getProposal(id: string, signal?: AbortSignal): Promise<ProposalDetail> {
  return api.get<ProposalDetail>(`/proposals/${encodeURIComponent(id)}`, { signal });
}

export const proposalQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ['proposals', 'detail', id],
    queryFn: ({ signal }) => getProposal(id, signal),
  });

export function useProposal(id: string) {
  return useQuery(proposalQueryOptions(id));
}
