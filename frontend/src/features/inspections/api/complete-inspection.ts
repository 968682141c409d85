import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Inspection } from '@loambook/common';
import { api } from '@/lib/api-client';

/** Refused with 422 INSPECTION.FINDINGS_INCOMPLETE (details: findings.<key>) while an item is unanswered. */
export function completeInspection({ id, summary }: { id: string; summary?: string }): Promise<Inspection> {
  return api.post<Inspection>(`/inspections/${encodeURIComponent(id)}/complete`, summary ? { summary } : {});
}

export function useCompleteInspection() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: completeInspection,
    onSuccess: async (inspection) => {
      queryClient.setQueryData(['inspections', 'detail', inspection.id], inspection);
      // The lead moves to "inspected".
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['inspections', 'list', { leadId: inspection.leadId }] }),
        queryClient.invalidateQueries({ queryKey: ['inspections', 'survey', inspection.id] }),
        queryClient.invalidateQueries({ queryKey: ['leads'] }),
      ]);
    },
  });
}
