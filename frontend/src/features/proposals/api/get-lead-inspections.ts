import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Inspection } from '@loambook/common';
import { api } from '@/lib/api-client';

/** The lead's inspections: the proposal names the one whose findings it carries. */
export function getLeadInspections(leadId: string, signal?: AbortSignal): Promise<Inspection[]> {
  return api.get<Inspection[]>(`/leads/${encodeURIComponent(leadId)}/inspections`, { signal });
}

export const leadInspectionsQueryOptions = (leadId: string) =>
  queryOptions({
    queryKey: ['inspections', 'list', { leadId }],
    queryFn: ({ signal }) => getLeadInspections(leadId, signal),
  });

export function useLeadInspections(leadId: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...leadInspectionsQueryOptions(leadId), enabled: options.enabled ?? true });
}
