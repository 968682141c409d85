import { queryOptions } from '@tanstack/react-query';
import type { CancellationDeadlineResult, DepositRulesResult } from '@loambook/common';
import { api } from '@/lib/api-client';

/** POST /api/calculators/cancellation-deadline: the last day to cancel a contract signed on `signedOn`. */
export function getCancellationDeadline(signedOn: string): Promise<CancellationDeadlineResult> {
  return api.post<CancellationDeadlineResult>('/calculators/cancellation-deadline', { signedOn });
}

/** POST /api/calculators/deposit-rules: the notices a contract at this price, in this state, must carry. */
export function getDepositRules(state: string, contractPrice: string): Promise<DepositRulesResult> {
  return api.post<DepositRulesResult>('/calculators/deposit-rules', { state, contractPrice, deposit: '0' });
}

export const cancellationDeadlineQueryOptions = (signedOn: string) =>
  queryOptions({
    queryKey: ['calculators', 'cancellation-deadline', { signedOn }],
    queryFn: () => getCancellationDeadline(signedOn),
    staleTime: Infinity,
  });

export const depositRulesQueryOptions = (state: string, contractPrice: string) =>
  queryOptions({
    queryKey: ['calculators', 'deposit-rules', { state, contractPrice }],
    queryFn: () => getDepositRules(state, contractPrice),
    staleTime: Infinity,
  });
