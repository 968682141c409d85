import type { LockPeriodRequest, ReconciledPeriod } from '@loambook/common';
import { api } from '@/lib/api-client';
import { useReconciliationMutation } from './use-reconciliation-mutation';

export function lockPeriod(body: LockPeriodRequest): Promise<ReconciledPeriod> {
  return api.post<ReconciledPeriod>('/reconciliation/lock', body);
}

export const useLockPeriod = () => useReconciliationMutation(lockPeriod);
