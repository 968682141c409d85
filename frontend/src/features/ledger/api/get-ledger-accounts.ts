import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LedgerAccount } from '@loambook/common';
import { api } from '@/lib/api-client';

/** A branch's chart of accounts, by code. */
export function getLedgerAccounts(branchId: string, signal?: AbortSignal): Promise<LedgerAccount[]> {
  return api.get<LedgerAccount[]>('/ledger/accounts', { query: { branchId }, signal });
}

export const ledgerAccountsQueryOptions = (branchId: string) =>
  queryOptions({
    queryKey: ['ledger', 'accounts', branchId],
    queryFn: ({ signal }) => getLedgerAccounts(branchId, signal),
    // The chart changes only when a branch is opened.
    staleTime: 5 * 60_000,
  });

export function useLedgerAccounts(branchId: string | null) {
  return useQuery({ ...ledgerAccountsQueryOptions(branchId ?? ''), enabled: !!branchId });
}
