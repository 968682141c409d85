import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TrialBalance } from '@loambook/common';
import { api } from '@/lib/api-client';

export interface TrialBalanceQuery {
  /** null: every branch the person may see, like accounts added together. */
  branchId: string | null;
  /** YYYY-MM-DD, or '' for today (the server's answer says which day it used). */
  asOf: string;
}

export function getTrialBalance(q: TrialBalanceQuery, signal?: AbortSignal): Promise<TrialBalance> {
  return api.get<TrialBalance>('/ledger/trial-balance', {
    query: { branchId: q.branchId, asOf: q.asOf },
    signal,
  });
}

export const trialBalanceQueryOptions = (q: TrialBalanceQuery) =>
  queryOptions({
    queryKey: ['ledger', 'trial-balance', q],
    queryFn: ({ signal }) => getTrialBalance(q, signal),
  });

export function useTrialBalance(q: TrialBalanceQuery) {
  return useQuery(trialBalanceQueryOptions(q));
}
