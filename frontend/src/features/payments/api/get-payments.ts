import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { PaymentKind, PaymentList, PaymentMethod } from '@loambook/common';
import { api } from '@/lib/api-client';

export const PAYMENT_PAGE_SIZES = [10, 25, 50, 100] as const;
export type PaymentPageSize = (typeof PAYMENT_PAGE_SIZES)[number];

/** The bookkeeper's list; every filter is applied by the server. Dates are YYYY-MM-DD or ''. */
export interface PaymentsQuery {
  branchId: string | null;
  from: string;
  to: string;
  method: PaymentMethod | '';
  kind: PaymentKind | '';
  page: number;
  pageSize: PaymentPageSize;
}

export function getPayments(q: PaymentsQuery, signal?: AbortSignal): Promise<PaymentList> {
  return api.get<PaymentList>('/payments', {
    query: {
      branchId: q.branchId,
      from: q.from,
      to: q.to,
      method: q.method,
      kind: q.kind,
      page: String(q.page),
      pageSize: String(q.pageSize),
    },
    signal,
  });
}

export const paymentsQueryOptions = (q: PaymentsQuery) =>
  queryOptions({
    queryKey: ['payments', 'list', q],
    queryFn: ({ signal }) => getPayments(q, signal),
    placeholderData: keepPreviousData,
  });

export function usePayments(q: PaymentsQuery) {
  return useQuery(paymentsQueryOptions(q));
}
