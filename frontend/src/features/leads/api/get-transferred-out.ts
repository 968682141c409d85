import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LeadStage } from '@loambook/common';
import { api } from '@/lib/api-client';

/** A lead that a branch of the person's handed to another branch (they keep a read-only view). */
export interface TransferredLead {
  id: string;
  homeownerName: string;
  addressLine1: string;
  city: string;
  stage: LeadStage;
  fromBranchCode: string;
  toBranchCode: string;
  transferredAt: string;
}

export function getTransferredOut(signal?: AbortSignal): Promise<TransferredLead[]> {
  return api.get<TransferredLead[]>('/leads/transferred-out', { signal });
}

export const transferredOutQueryOptions = () =>
  queryOptions({
    queryKey: ['leads', 'transferred-out'],
    queryFn: ({ signal }) => getTransferredOut(signal),
  });

export function useTransferredOut(options: { enabled: boolean }) {
  return useQuery({ ...transferredOutQueryOptions(), enabled: options.enabled });
}
