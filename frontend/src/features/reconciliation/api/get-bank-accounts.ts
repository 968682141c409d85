import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BankAccount } from '@loambook/common';
import { api } from '@/lib/api-client';

export function getBankAccounts(signal?: AbortSignal): Promise<BankAccount[]> {
  return api.get<BankAccount[]>('/bank-accounts', { signal });
}

export const bankAccountsQueryOptions = () =>
  queryOptions({
    queryKey: ['reconciliation', 'bank-accounts'],
    queryFn: ({ signal }) => getBankAccounts(signal),
  });

export function useBankAccounts() {
  return useQuery(bankAccountsQueryOptions());
}
