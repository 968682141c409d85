import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { JobDetail } from '@loambook/common';

/** Query keys of field jobs, general → specific. */
export const jobKeys = {
  all: ['jobs'] as const,
  lists: ['jobs', 'list'] as const,
  detail: (id: string) => ['jobs', 'detail', id] as const,
  calendar: ['jobs', 'calendar'] as const,
  atRisk: ['jobs', 'at-risk'] as const,
  today: ['jobs', 'today'] as const,
  log: (id: string) => ['jobs', 'log', id] as const,
  actuals: (id: string) => ['jobs', 'actuals', id] as const,
  comparison: (id: string) => ['jobs', 'survey-comparison', id] as const,
  warranty: (id: string) => ['jobs', 'warranty', id] as const,
  summary: ['jobs', 'actuals-summary'] as const,
  crews: ['crews'] as const,
};

/** A change to a job answers with the whole job: it goes into the cache, and the lists and boards refresh. */
export async function jobChanged(queryClient: QueryClient, job: JobDetail): Promise<void> {
  queryClient.setQueryData(jobKeys.detail(job.id), job);
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: jobKeys.lists }),
    queryClient.invalidateQueries({ queryKey: jobKeys.calendar }),
    queryClient.invalidateQueries({ queryKey: jobKeys.atRisk }),
    queryClient.invalidateQueries({ queryKey: jobKeys.today }),
    queryClient.invalidateQueries({ queryKey: jobKeys.actuals(job.id) }),
    queryClient.invalidateQueries({ queryKey: jobKeys.comparison(job.id) }),
  ]);
}

export function useJobChanged() {
  const queryClient = useQueryClient();
  return (job: JobDetail) => jobChanged(queryClient, job);
}

export const jobPath = (id: string, rest = '') => `/jobs/${encodeURIComponent(id)}${rest}`;
