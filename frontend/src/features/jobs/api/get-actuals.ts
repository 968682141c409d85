import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ActualsSummaryRow, JobActuals } from '@loambook/common';
import { api } from '@/lib/api-client';
import { jobKeys, jobPath } from './job-cache';

export function getActuals(id: string, signal?: AbortSignal): Promise<JobActuals> {
  return api.get<JobActuals>(jobPath(id, '/actuals'), { signal });
}

export const actualsQueryOptions = (id: string) =>
  queryOptions({ queryKey: jobKeys.actuals(id), queryFn: ({ signal }) => getActuals(id, signal) });

export function useActuals(id: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...actualsQueryOptions(id), enabled: options.enabled ?? true });
}

export interface ActualsSummaryQuery {
  branchId: string | null;
  from: string;
  to: string;
  by: 'salesperson' | 'branch';
}

export function getActualsSummary(
  q: ActualsSummaryQuery,
  signal?: AbortSignal,
): Promise<ActualsSummaryRow[]> {
  return api.get<ActualsSummaryRow[]>('/jobs/actuals/summary', { query: { ...q }, signal });
}

export function useActualsSummary(q: ActualsSummaryQuery) {
  return useQuery({
    queryKey: [...jobKeys.summary, q],
    queryFn: ({ signal }) => getActualsSummary(q, signal),
    placeholderData: keepPreviousData,
  });
}
