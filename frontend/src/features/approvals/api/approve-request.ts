import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApprovalRequestView } from '@loambook/common';
import { api } from '@/lib/api-client';
import { invalidateSelling } from '@/features/proposals/api/invalidate';

export interface DecideVariables {
  id: string;
  note: string;
}

/** 403 APPROVAL.BEYOND_AUTHORITY / APPROVAL.OWN_REQUEST, 409 APPROVAL.ALREADY_DECIDED. */
export function approveRequest({ id, note }: DecideVariables): Promise<ApprovalRequestView> {
  return api.post<ApprovalRequestView>(
    `/approvals/${encodeURIComponent(id)}/approve`,
    note.trim() ? { note: note.trim() } : {},
  );
}

export function useApproveRequest() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: approveRequest,
    onSuccess: async () => {
      await invalidateSelling(queryClient);
    },
  });
}
