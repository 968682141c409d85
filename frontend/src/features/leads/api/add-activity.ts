import { useMutation } from '@tanstack/react-query';
import type { LeadDetail, ManualActivityKind } from '@loambook/common';
import { api } from '@/lib/api-client';
import { useLeadChanged } from './update-lead';

export function addActivity({
  leadId,
  kind,
  body,
}: {
  leadId: string;
  kind: ManualActivityKind;
  body: string;
}): Promise<LeadDetail> {
  return api.post<LeadDetail>(`/leads/${encodeURIComponent(leadId)}/activities`, { kind, body });
}

export function useAddActivity() {
  const changed = useLeadChanged();
  return useMutation({ mutationFn: addActivity, onSuccess: changed });
}
