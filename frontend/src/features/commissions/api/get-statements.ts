import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CommissionStatementStatus, CommissionStatementSummary } from '@loambook/common';
import { api } from '@/lib/api-client';

export interface StatementsFilter {
  /** null: every branch the person may see. */
  branchId: string | null;
  salespersonId?: string | null;
  /** Any day of the pay period, or '' for every period. */
  period: string;
  status: CommissionStatementStatus | null;
}

export function getStatements(
  f: StatementsFilter,
  signal?: AbortSignal,
): Promise<CommissionStatementSummary[]> {
  return api.get<CommissionStatementSummary[]>('/commission-statements', {
    query: {
      branchId: f.branchId,
      salespersonId: f.salespersonId ?? null,
      period: f.period || null,
      status: f.status,
    },
    signal,
  });
}

export const statementsQueryOptions = (f: StatementsFilter) =>
  queryOptions({
    queryKey: ['commissions', 'statements', 'list', f],
    queryFn: ({ signal }) => getStatements(f, signal),
  });

export function useStatements(f: StatementsFilter) {
  return useQuery(statementsQueryOptions(f));
}
