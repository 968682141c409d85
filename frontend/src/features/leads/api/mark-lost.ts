import { useMutation } from '@tanstack/react-query';
import type { LeadDetail } from '@loambook/common';
import { api } from '@/lib/api-client';
import { useLeadChanged } from './update-lead';

/** The one stage move made by hand; the server refuses it (409) once something is signed. */
export function markLost({ leadId, reason }: { leadId: string; reason: string }): Promise<LeadDetail> {
  return api.post<LeadDetail>(`/leads/${encodeURIComponent(leadId)}/stage`, { to: 'lost', reason });
}

export function useMarkLost() {
  const changed = useLeadChanged();
  return useMutation({ mutationFn: markLost, onSuccess: changed });
}
