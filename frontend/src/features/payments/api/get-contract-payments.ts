import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ContractPayments } from '@loambook/common';
import { api, isApiError } from '@/lib/api-client';

/** A contract's payment links, payments, refunds and balance; null when the person may not see them (404). */
export async function getContractPayments(
  contractId: string,
  signal?: AbortSignal,
): Promise<ContractPayments | null> {
  try {
    return await api.get<ContractPayments>(`/contracts/${encodeURIComponent(contractId)}/payments`, {
      signal,
    });
  } catch (error) {
    if (isApiError(error) && (error.status === 404 || error.status === 403)) return null;
    throw error;
  }
}

export const contractPaymentsQueryOptions = (contractId: string) =>
  queryOptions({
    queryKey: ['payments', 'contract', contractId],
    queryFn: ({ signal }) => getContractPayments(contractId, signal),
  });

export function useContractPayments(contractId: string | null) {
  return useQuery({ ...contractPaymentsQueryOptions(contractId ?? ''), enabled: Boolean(contractId) });
}
