import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PayoutBreakdownView } from '@loambook/common';
import { api } from '@/lib/api-client';

export function getPayoutBreakdown(payoutId: string, signal?: AbortSignal): Promise<PayoutBreakdownView> {
  return api.get<PayoutBreakdownView>(`/payouts/${encodeURIComponent(payoutId)}/breakdown`, { signal });
}

export const payoutBreakdownQueryOptions = (payoutId: string) =>
  queryOptions({
    queryKey: ['reconciliation', 'payout-breakdown', payoutId],
    queryFn: ({ signal }) => getPayoutBreakdown(payoutId, signal),
  });

export function usePayoutBreakdown(payoutId: string) {
  return useQuery(payoutBreakdownQueryOptions(payoutId));
}
