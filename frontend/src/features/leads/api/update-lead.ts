import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LeadDetail, LeadInput } from '@loambook/common';
import { api } from '@/lib/api-client';

export type LeadPatch = Partial<Omit<LeadInput, 'branchId'>>;

export function updateLead({ id, patch }: { id: string; patch: LeadPatch }): Promise<LeadDetail> {
  return api.patch<LeadDetail>(`/leads/${encodeURIComponent(id)}`, patch);
}

/** Every change to a lead answers with the whole lead: it goes into the cache, and the lists refresh. */
export function useLeadChanged() {
  const queryClient = useQueryClient();
  return async (lead: LeadDetail) => {
    queryClient.setQueryData(['leads', 'detail', lead.id], lead);
    await queryClient.invalidateQueries({ queryKey: ['leads', 'list'] });
  };
}

export function useUpdateLead() {
  const changed = useLeadChanged();
  return useMutation({ mutationFn: updateLead, onSuccess: changed });
}
