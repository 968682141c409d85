import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ContractCommissionSplitsView } from '@loambook/common';
import { api } from '@/lib/api-client';

export function getContractSplits(
  contractId: string,
  signal?: AbortSignal,
): Promise<ContractCommissionSplitsView> {
  return api.get<ContractCommissionSplitsView>(
    `/contracts/${encodeURIComponent(contractId)}/commission-splits`,
    { signal },
  );
}

export const contractSplitsQueryOptions = (contractId: string) =>
  queryOptions({
    queryKey: ['commissions', 'splits', contractId],
    queryFn: ({ signal }) => getContractSplits(contractId, signal),
  });

export function useContractSplits(contractId: string) {
  return useQuery(contractSplitsQueryOptions(contractId));
}
