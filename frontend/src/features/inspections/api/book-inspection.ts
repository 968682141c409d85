import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BookInspectionRequest, Inspection } from '@loambook/common';
import { api } from '@/lib/api-client';

export function bookInspection({
  leadId,
  request,
}: {
  leadId: string;
  request: BookInspectionRequest;
}): Promise<Inspection> {
  return api.post<Inspection>(`/leads/${encodeURIComponent(leadId)}/inspections`, request);
}

export function useBookInspection() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: bookInspection,
    onSuccess: async (inspection) => {
      queryClient.setQueryData(['inspections', 'detail', inspection.id], inspection);
      // Booking moves a new lead to "inspection booked" and writes its timeline.
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['inspections', 'list', { leadId: inspection.leadId }] }),
        queryClient.invalidateQueries({ queryKey: ['leads'] }),
      ]);
    },
  });
}
