import { useQuery } from '@tanstack/react-query';
import { branchQueryOptions } from '@/features/branches/api/get-branch';
import { leadQueryOptions } from '@/features/leads/api/get-lead';

/** The lead a proposal is for (shared cache with the lead page), once its id is known. */
export function useLeadOf(leadId: string | undefined) {
  return useQuery({ ...leadQueryOptions(leadId ?? ''), enabled: !!leadId });
}

/** The branch's settings: margin floor, discount authority and tax, for the live preview. */
export function useBranchOf(branchId: string | undefined) {
  return useQuery({ ...branchQueryOptions(branchId ?? ''), enabled: !!branchId });
}
