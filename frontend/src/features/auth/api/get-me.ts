import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeResponse } from '@loambook/common';
import { api } from '@/lib/api-client';

export function getMe(signal?: AbortSignal): Promise<MeResponse> {
  return api.get<MeResponse>('/auth/me', { signal });
}

/** Keyed by the token so that a new sign-in never reads the previous person's answer. */
export const meQueryOptions = (token: string) =>
  queryOptions({
    queryKey: ['auth', 'me', token],
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 5 * 60_000,
  });

export function useMe(token: string | null) {
  return useQuery({ ...meQueryOptions(token ?? ''), enabled: token !== null });
}
