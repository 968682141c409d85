import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { CalendarResponse } from '@loambook/common';
import { api } from '@/lib/api-client';
import { jobKeys } from './job-cache';

export interface CalendarQuery {
  branchId: string;
  from: string;
  to: string;
}

export function getCalendar(query: CalendarQuery, signal?: AbortSignal): Promise<CalendarResponse> {
  return api.get<CalendarResponse>('/jobs/calendar', { query: { ...query }, signal });
}

export const calendarQueryOptions = (query: CalendarQuery) =>
  queryOptions({
    queryKey: [...jobKeys.calendar, query],
    queryFn: ({ signal }) => getCalendar(query, signal),
    placeholderData: keepPreviousData,
  });

export function useCalendar(query: CalendarQuery | null) {
  return useQuery({
    ...calendarQueryOptions(query ?? { branchId: '', from: '', to: '' }),
    enabled: query !== null,
  });
}
