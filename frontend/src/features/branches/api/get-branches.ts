import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Branch } from '@loambook/common';
import { api } from '@/lib/api-client';

/** The branches the signed-in person may see (the server scopes the list). */
export function getBranches(signal?: AbortSignal): Promise<Branch[]> {
  return api.get<Branch[]>('/branches', { signal });
}

export const branchesQueryOptions = () =>
  queryOptions({
    queryKey: ['branches', 'list'],
    queryFn: ({ signal }) => getBranches(signal),
    staleTime: 60_000,
  });

export function useBranches(options: { enabled?: boolean } = {}) {
  return useQuery({ ...branchesQueryOptions(), enabled: options.enabled ?? true });
}
