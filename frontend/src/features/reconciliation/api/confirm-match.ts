import type { MatchView } from '@loambook/common';
import { api } from '@/lib/api-client';
import { useReconciliationMutation } from './use-reconciliation-mutation';

export function confirmMatch(id: string): Promise<MatchView> {
  return api.post<MatchView>(`/reconciliation/matches/${encodeURIComponent(id)}/confirm`);
}

export const useConfirmMatch = () => useReconciliationMutation(confirmMatch);
