import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CheckoutStatus } from '@loambook/common';
import { api } from '@/lib/api-client';

/** Public: whether the payment behind a checkout session has been recorded (the thank-you page). */
export function getCheckoutStatus(sessionId: string, signal?: AbortSignal): Promise<CheckoutStatus> {
  return api.get<CheckoutStatus>(`/payments/checkout/${encodeURIComponent(sessionId)}`, { signal });
}

/** Asks again every few seconds while the payment is still being recorded (the processor's webhook is on its way). */
export const checkoutStatusQueryOptions = (sessionId: string) =>
  queryOptions({
    queryKey: ['payments', 'checkout', sessionId],
    queryFn: ({ signal }) => getCheckoutStatus(sessionId, signal),
    retry: false,
    refetchInterval: (query) => (query.state.data?.status === 'processing' ? 3000 : false),
  });

export function useCheckoutStatus(sessionId: string) {
  return useQuery({ ...checkoutStatusQueryOptions(sessionId), enabled: sessionId !== '' });
}
