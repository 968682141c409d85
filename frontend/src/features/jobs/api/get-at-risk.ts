import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AtRiskJob } from '@loambook/common';
import { api } from '@/lib/api-client';
import { jobKeys } from './job-cache';

export function getAtRisk(branchId: string | null, signal?: AbortSignal): Promise<AtRiskJob[]> {
  return api.get<AtRiskJob[]>('/jobs/at-risk', { query: { branchId }, signal });
}

export const atRiskQueryOptions = (branchId: string | null) =>
  queryOptions({
    queryKey: [...jobKeys.atRisk, { branchId }],
    queryFn: ({ signal }) => getAtRisk(branchId, signal),
  });

export function useAtRisk(branchId: string | null, options: { enabled?: boolean } = {}) {
  return useQuery({ ...atRiskQueryOptions(branchId), enabled: options.enabled ?? true });
}
