import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Inspection } from '@loambook/common';
import { api } from '@/lib/api-client';

export function getInspection(id: string, signal?: AbortSignal): Promise<Inspection> {
  return api.get<Inspection>(`/inspections/${encodeURIComponent(id)}`, { signal });
}

export const inspectionQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ['inspections', 'detail', id],
    queryFn: ({ signal }) => getInspection(id, signal),
  });

export function useInspection(id: string) {
  return useQuery(inspectionQueryOptions(id));
}
