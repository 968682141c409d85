import type { CreateMatchRequest, MatchView } from '@loambook/common';
import { api } from '@/lib/api-client';
import { useReconciliationMutation } from './use-reconciliation-mutation';

export function createMatch(body: CreateMatchRequest): Promise<MatchView> {
  return api.post<MatchView>('/reconciliation/matches', body);
}

export const useCreateMatch = () => useReconciliationMutation(createMatch);
