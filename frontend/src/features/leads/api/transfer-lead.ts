import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LeadDetail } from '@loambook/common';
import { api } from '@/lib/api-client';
import { useLeadChanged } from './update-lead';

/** Only before a proposal has gone out; later the server answers 409 LEAD.TRANSFER_TOO_LATE. */
export function transferLead({
  leadId,
  branchId,
  note,
}: {
  leadId: string;
  branchId: string;
  note?: string;
}): Promise<LeadDetail> {
  return api.post<LeadDetail>(`/leads/${encodeURIComponent(leadId)}/transfer`, {
    branchId,
    ...(note ? { note } : {}),
  });
}

export function useTransferLead() {
  const changed = useLeadChanged();
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: transferLead,
    onSuccess: async (lead) => {
      await changed(lead);
      // Its inspections moved with it.
      await queryClient.invalidateQueries({ queryKey: ['inspections'] });
    },
  });
}
