import { queryOptions, useQuery } from '@tanstack/react-query';
import type { JobDetail } from '@loambook/common';
import { api } from '@/lib/api-client';
import { jobKeys, jobPath } from './job-cache';

export function getJob(id: string, signal?: AbortSignal): Promise<JobDetail> {
  return api.get<JobDetail>(jobPath(id), { signal });
}

export const jobQueryOptions = (id: string) =>
  queryOptions({ queryKey: jobKeys.detail(id), queryFn: ({ signal }) => getJob(id, signal) });

export function useJob(id: string) {
  return useQuery(jobQueryOptions(id));
}
