import { api } from '@/lib/api-client';
import { useReconciliationMutation } from './use-reconciliation-mutation';

export function undoMatch(id: string): Promise<void> {
  return api.delete(`/reconciliation/matches/${encodeURIComponent(id)}`);
}

export const useUndoMatch = () => useReconciliationMutation(undoMatch);
