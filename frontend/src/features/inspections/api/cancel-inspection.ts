import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Inspection } from '@loambook/common';
import { api } from '@/lib/api-client';

/** Only a booked inspection; the lead goes back to "new" when nothing else is booked for it. */
export function cancelInspection({ id, reason }: { id: string; reason?: string }): Promise<Inspection> {
  return api.post<Inspection>(`/inspections/${encodeURIComponent(id)}/cancel`, reason ? { reason } : {});
}

export function useCancelInspection() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: cancelInspection,
    onSuccess: async (inspection) => {
      queryClient.setQueryData(['inspections', 'detail', inspection.id], inspection);
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['inspections', 'list', { leadId: inspection.leadId }] }),
        queryClient.invalidateQueries({ queryKey: ['leads'] }),
      ]);
    },
  });
}
