import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { JobListResponse, JobStatus } from '@loambook/common';
import { api } from '@/lib/api-client';
import { jobKeys } from './job-cache';

export interface JobsQuery {
  branchId: string | null;
  status: JobStatus | null;
  crewId: string | null;
  salespersonId: string | null;
  q: string;
  page: number;
  pageSize: number;
}

export function getJobs(query: JobsQuery, signal?: AbortSignal): Promise<JobListResponse> {
  return api.get<JobListResponse>('/jobs', {
    query: {
      branchId: query.branchId,
      status: query.status,
      crewId: query.crewId,
      salespersonId: query.salespersonId,
      q: query.q.trim(),
      page: String(query.page),
      pageSize: String(query.pageSize),
    },
    signal,
  });
}

export const jobsQueryOptions = (query: JobsQuery) =>
  queryOptions({
    queryKey: [...jobKeys.lists, query],
    queryFn: ({ signal }) => getJobs(query, signal),
    placeholderData: keepPreviousData,
  });

export function useJobs(query: JobsQuery) {
  return useQuery(jobsQueryOptions(query));
}
