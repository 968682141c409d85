import { queryOptions, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Branch } from '@loambook/common';
import { api } from '@/lib/api-client';
import { branchesQueryOptions } from './get-branches';

export function getBranch(id: string, signal?: AbortSignal): Promise<Branch> {
  return api.get<Branch>(`/branches/${encodeURIComponent(id)}`, { signal });
}

export const branchQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ['branches', 'detail', id],
    queryFn: ({ signal }) => getBranch(id, signal),
  });

export function useBranch(id: string) {
  const queryClient = useQueryClient();
  return useQuery({
    ...branchQueryOptions(id),
    // Opened from the list: show that row at once while the fresh copy loads.
    placeholderData: () =>
      queryClient.getQueryData(branchesQueryOptions().queryKey)?.find((b) => b.id === id),
  });
}
