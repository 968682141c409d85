import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PriceBookItem } from '@loambook/common';
import { api } from '@/lib/api-client';

export interface PriceBookFilters {
  branchId: string;
  /** Deactivated items too (the admin list); the proposal builder offers only active ones. */
  includeInactive: boolean;
}

/** A branch's price book, as the server sorts it. */
export function getPriceBook(
  { branchId, includeInactive }: PriceBookFilters,
  signal?: AbortSignal,
): Promise<PriceBookItem[]> {
  return api.get<PriceBookItem[]>(`/branches/${encodeURIComponent(branchId)}/price-book`, {
    query: { includeInactive: includeInactive ? 'true' : null },
    signal,
  });
}

export const priceBookQueryOptions = (filters: PriceBookFilters) =>
  queryOptions({
    queryKey: ['price-book', 'list', filters],
    queryFn: ({ signal }) => getPriceBook(filters, signal),
  });

export function usePriceBook(filters: PriceBookFilters | null) {
  return useQuery({
    ...priceBookQueryOptions(filters ?? { branchId: '', includeInactive: false }),
    enabled: filters !== null && filters.branchId !== '',
  });
}
