import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AccountLedger } from '@loambook/common';
import { api } from '@/lib/api-client';

export const ACCOUNT_PAGE_SIZES = [50, 100, 250, 500] as const;
export type AccountPageSize = (typeof ACCOUNT_PAGE_SIZES)[number];

export interface AccountLedgerQuery {
  accountId: string;
  from: string;
  to: string;
  page: number;
  pageSize: AccountPageSize;
}

export type AccountLedgerPage = AccountLedger & { total: number; page: number; pageSize: number };

export function accountLinesPath(accountId: string): string {
  return `/ledger/accounts/${encodeURIComponent(accountId)}/lines`;
}

export function getAccountLedger(q: AccountLedgerQuery, signal?: AbortSignal): Promise<AccountLedgerPage> {
  return api.get<AccountLedgerPage>(accountLinesPath(q.accountId), {
    query: { from: q.from, to: q.to, page: String(q.page), pageSize: String(q.pageSize) },
    signal,
  });
}

export const accountLedgerQueryOptions = (q: AccountLedgerQuery) =>
  queryOptions({
    queryKey: ['ledger', 'account-lines', q],
    queryFn: ({ signal }) => getAccountLedger(q, signal),
    placeholderData: keepPreviousData,
  });

export function useAccountLedger(q: AccountLedgerQuery | null) {
  return useQuery({
    ...accountLedgerQueryOptions(q ?? { accountId: '', from: '', to: '', page: 1, pageSize: 100 }),
    enabled: q !== null,
  });
}
