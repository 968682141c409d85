import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { DuplicateCheckResponse } from '@loambook/common';
import { apiRequest } from '@/lib/api-client';

export interface DuplicateCheckInput {
  addressLine1?: string;
  postalCode?: string;
  phone?: string;
  email?: string;
  excludeId?: string;
}

export function checkDuplicates(
  input: DuplicateCheckInput,
  signal?: AbortSignal,
): Promise<DuplicateCheckResponse> {
  return apiRequest<DuplicateCheckResponse>('/leads/duplicate-check', {
    method: 'POST',
    body: input,
    signal,
  });
}

export const duplicatesQueryOptions = (input: DuplicateCheckInput) =>
  queryOptions({
    queryKey: ['leads', 'duplicates', input],
    queryFn: ({ signal }) => checkDuplicates(input, signal),
    staleTime: 15_000,
    placeholderData: keepPreviousData,
  });

/** Leads that may be the same homeowner; nothing is asked until there is something worth checking. */
export function useDuplicateCheck(input: DuplicateCheckInput | null) {
  return useQuery({
    ...duplicatesQueryOptions(input ?? {}),
    enabled: input !== null,
  });
}
