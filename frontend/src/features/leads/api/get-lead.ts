import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LeadDetail } from '@loambook/common';
import { api } from '@/lib/api-client';

export function getLead(id: string, signal?: AbortSignal): Promise<LeadDetail> {
  return api.get<LeadDetail>(`/leads/${encodeURIComponent(id)}`, { signal });
}

export const leadQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ['leads', 'detail', id],
    queryFn: ({ signal }) => getLead(id, signal),
  });

export function useLead(id: string) {
  return useQuery(leadQueryOptions(id));
}
