import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PasswordTokenInfo } from '@loambook/common';
import { api } from '@/lib/api-client';

export function getPasswordLink(token: string, signal?: AbortSignal): Promise<PasswordTokenInfo> {
  return api.get<PasswordTokenInfo>(`/auth/password-links/${encodeURIComponent(token)}`, { signal });
}

export const passwordLinkQueryOptions = (token: string) =>
  queryOptions({
    queryKey: ['auth', 'password-link', token],
    queryFn: ({ signal }) => getPasswordLink(token, signal),
    staleTime: Infinity,
    retry: false,
  });

export function usePasswordLink(token: string) {
  return useQuery({ ...passwordLinkQueryOptions(token), enabled: token !== '' });
}
