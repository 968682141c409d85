import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ContractView } from '@loambook/common';
import { api, isApiError } from '@/lib/api-client';

/** The lead's latest contract, or null when it has none (the API answers 404). */
export async function getLeadContract(leadId: string, signal?: AbortSignal): Promise<ContractView | null> {
  try {
    return await api.get<ContractView>(`/leads/${encodeURIComponent(leadId)}/contract`, { signal });
  } catch (error) {
    if (isApiError(error) && error.status === 404) return null;
    throw error;
  }
}

export const leadContractQueryOptions = (leadId: string) =>
  queryOptions({
    queryKey: ['contracts', 'lead', leadId],
    queryFn: ({ signal }) => getLeadContract(leadId, signal),
  });

export function useLeadContract(leadId: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...leadContractQueryOptions(leadId), enabled: options.enabled ?? true });
}
