import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Branch } from '@loambook/common';
import { api } from '@/lib/api-client';

/** A branch as other branches see it: its id, code and name. */
export type BranchDirectoryEntry = Pick<Branch, 'id' | 'code' | 'name'>;

/** Every branch, named only: for choosing where a lead goes (GET /branches lists only one's own). */
export function getBranchDirectory(signal?: AbortSignal): Promise<BranchDirectoryEntry[]> {
  return api.get<BranchDirectoryEntry[]>('/branches/directory', { signal });
}

export const branchDirectoryQueryOptions = () =>
  queryOptions({
    queryKey: ['branches', 'directory'],
    queryFn: ({ signal }) => getBranchDirectory(signal),
    staleTime: 5 * 60_000,
  });

export function useBranchDirectory(options: { enabled?: boolean } = {}) {
  return useQuery({ ...branchDirectoryQueryOptions(), enabled: options.enabled ?? true });
}
