import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { SettlementPointInput, SettlementResult } from '@loambook/common';
import { apiRequest } from '@/lib/api-client';

/** The settlement screening, computed by the server's calculator from points not yet saved. */
export function previewSettlement(
  points: SettlementPointInput[],
  signal?: AbortSignal,
): Promise<SettlementResult> {
  return apiRequest<SettlementResult>('/calculators/settlement', {
    method: 'POST',
    body: { points },
    signal,
  });
}

export const settlementPreviewQueryOptions = (points: SettlementPointInput[]) =>
  queryOptions({
    queryKey: ['calculators', 'settlement', points],
    queryFn: ({ signal }) => previewSettlement(points, signal),
    staleTime: Infinity,
    placeholderData: keepPreviousData,
  });

export function useSettlementPreview(points: SettlementPointInput[] | null) {
  return useQuery({ ...settlementPreviewQueryOptions(points ?? []), enabled: points !== null });
}
