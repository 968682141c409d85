import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ApprovalRequestStatus, ApprovalRequestView } from '@loambook/common';
import { api } from '@/lib/api-client';

/** The approval queue: a manager's branches, or every branch for the owner (others get 403). */
export function getApprovals(
  status: ApprovalRequestStatus,
  signal?: AbortSignal,
): Promise<ApprovalRequestView[]> {
  return api.get<ApprovalRequestView[]>('/approvals', { query: { status }, signal });
}

export const approvalsQueryOptions = (status: ApprovalRequestStatus) =>
  queryOptions({
    queryKey: ['approvals', 'list', { status }],
    queryFn: ({ signal }) => getApprovals(status, signal),
  });

export function useApprovals(
  status: ApprovalRequestStatus,
  options: { enabled?: boolean; refetchInterval?: number } = {},
) {
  return useQuery({
    ...approvalsQueryOptions(status),
    enabled: options.enabled ?? true,
    refetchInterval: options.refetchInterval,
  });
}
