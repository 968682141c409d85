import type { SuggestResult } from '@loambook/common';
import { api } from '@/lib/api-client';
import type { ReconciliationQuery } from './get-reconciliation';
import { useReconciliationMutation } from './use-reconciliation-mutation';

export function suggestMatches(q: ReconciliationQuery & { windowDays: number }): Promise<SuggestResult> {
  const p = new URLSearchParams({ ...q, windowDays: String(q.windowDays) });
  return api.post<SuggestResult>(`/reconciliation/suggest?${p.toString()}`);
}

export const useSuggestMatches = () => useReconciliationMutation(suggestMatches);
