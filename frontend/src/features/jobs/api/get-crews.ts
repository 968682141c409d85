import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Crew } from '@loambook/common';
import { api } from '@/lib/api-client';
import { jobKeys } from './job-cache';

export function getCrews(branchId: string | null, signal?: AbortSignal): Promise<Crew[]> {
  return api.get<Crew[]>('/crews', { query: { branchId }, signal });
}

export const crewsQueryOptions = (branchId: string | null) =>
  queryOptions({
    queryKey: [...jobKeys.crews, 'list', { branchId }],
    queryFn: ({ signal }) => getCrews(branchId, signal),
  });

export function useCrews(branchId: string | null, options: { enabled?: boolean } = {}) {
  return useQuery({ ...crewsQueryOptions(branchId), enabled: options.enabled ?? true });
}
