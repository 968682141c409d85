import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CommissionStatementDetail } from '@loambook/common';
import { api } from '@/lib/api-client';

export function getStatement(id: string, signal?: AbortSignal): Promise<CommissionStatementDetail> {
  return api.get<CommissionStatementDetail>(`/commission-statements/${encodeURIComponent(id)}`, { signal });
}

export const statementQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ['commissions', 'statements', 'detail', id],
    queryFn: ({ signal }) => getStatement(id, signal),
  });

export function useStatement(id: string) {
  return useQuery(statementQueryOptions(id));
}
