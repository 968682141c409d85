import { queryOptions, useQuery } from '@tanstack/react-query';
import type { JobSummary } from '@loambook/common';
import { api } from '@/lib/api-client';
import { jobKeys } from './job-cache';

export function getToday(signal?: AbortSignal): Promise<JobSummary[]> {
  return api.get<JobSummary[]>('/jobs/today', { signal });
}

export const todayQueryOptions = () =>
  queryOptions({ queryKey: jobKeys.today, queryFn: ({ signal }) => getToday(signal) });

export function useToday() {
  return useQuery(todayQueryOptions());
}
