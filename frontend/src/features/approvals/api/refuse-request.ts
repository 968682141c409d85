import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApprovalRequestView } from '@loambook/common';
import { api } from '@/lib/api-client';
import { invalidateSelling } from '@/features/proposals/api/invalidate';
import type { DecideVariables } from './approve-request';

/** The note is required: the salesperson reads why. */
export function refuseRequest({ id, note }: DecideVariables): Promise<ApprovalRequestView> {
  return api.post<ApprovalRequestView>(`/approvals/${encodeURIComponent(id)}/refuse`, { note: note.trim() });
}

export function useRefuseRequest() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: refuseRequest,
    onSuccess: async () => {
      await invalidateSelling(queryClient);
    },
  });
}
