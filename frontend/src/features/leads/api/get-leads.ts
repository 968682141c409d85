import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { LeadStage, PipelineResponse } from '@loambook/common';
import { api } from '@/lib/api-client';

export type PipelineSort = 'age' | 'daysInStage' | 'value' | 'homeowner' | 'stage';
export const PAGE_SIZES = [10, 25, 50, 100] as const;
export type PageSize = (typeof PAGE_SIZES)[number];

/** What the pipeline asks the server for; every filter is applied there, on the whole list. */
export interface PipelineQuery {
  branchId: string | null;
  stages: LeadStage[];
  salespersonId: string | null;
  minAgeDays: string;
  maxAgeDays: string;
  minValue: string;
  maxValue: string;
  q: string;
  approvalPending: boolean;
  sort: PipelineSort;
  order: 'asc' | 'desc';
  page: number;
  pageSize: PageSize;
}

export function getLeads(query: PipelineQuery, signal?: AbortSignal): Promise<PipelineResponse> {
  return api.get<PipelineResponse>('/leads', {
    query: {
      branchId: query.branchId,
      stage: query.stages.length ? query.stages.join(',') : null,
      salespersonId: query.salespersonId,
      minAgeDays: query.minAgeDays,
      maxAgeDays: query.maxAgeDays,
      minValue: query.minValue,
      maxValue: query.maxValue,
      q: query.q.trim(),
      // Only the "waiting" side is a filter in the screen; off means "whatever".
      approvalPending: query.approvalPending ? 'true' : null,
      sort: query.sort,
      order: query.order,
      page: String(query.page),
      pageSize: String(query.pageSize),
    },
    signal,
  });
}

export const leadsQueryOptions = (query: PipelineQuery) =>
  queryOptions({
    queryKey: ['leads', 'list', query],
    queryFn: ({ signal }) => getLeads(query, signal),
    // Paging or filtering keeps the last page on screen until the next one arrives.
    placeholderData: keepPreviousData,
  });

export function useLeads(query: PipelineQuery) {
  return useQuery(leadsQueryOptions(query));
}
