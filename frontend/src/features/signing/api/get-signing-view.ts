import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SigningView } from '@loambook/common';
import { api } from '@/lib/api-client';

/** What the homeowner sees behind the link (public: the token is the credential). 410 for a dead link. */
export function getSigningView(token: string, signal?: AbortSignal): Promise<SigningView> {
  return api.get<SigningView>(`/signing/${encodeURIComponent(token)}`, { signal });
}

export const signingViewQueryOptions = (token: string) =>
  queryOptions({
    queryKey: ['signing', token],
    queryFn: ({ signal }) => getSigningView(token, signal),
    // The page answers for itself; asking again will not revive an expired or used link.
    retry: false,
    staleTime: 60_000,
  });

export function useSigningView(token: string) {
  return useQuery(signingViewQueryOptions(token));
}
