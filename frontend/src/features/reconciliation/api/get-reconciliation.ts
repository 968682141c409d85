import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ReconciliationView } from '@loambook/common';
import { api } from '@/lib/api-client';

export interface ReconciliationQuery {
  bankAccountId: string;
  from: string;
  to: string;
}

export function getReconciliation(q: ReconciliationQuery, signal?: AbortSignal): Promise<ReconciliationView> {
  return api.get<ReconciliationView>('/reconciliation', { query: { ...q }, signal });
}

export const reconciliationQueryOptions = (q: ReconciliationQuery) =>
  queryOptions({
    queryKey: ['reconciliation', 'view', q],
    queryFn: ({ signal }) => getReconciliation(q, signal),
    placeholderData: keepPreviousData,
  });

export function useReconciliation(q: ReconciliationQuery | null) {
  return useQuery({
    ...reconciliationQueryOptions(q ?? { bankAccountId: '', from: '', to: '' }),
    enabled: q !== null,
  });
}
