import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Inspection, UpdateInspectionRequest } from '@loambook/common';
import { api } from '@/lib/api-client';

export function updateInspection({
  id,
  patch,
}: {
  id: string;
  patch: UpdateInspectionRequest;
}): Promise<Inspection> {
  return api.patch<Inspection>(`/inspections/${encodeURIComponent(id)}`, patch);
}

export function useUpdateInspection() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateInspection,
    onSuccess: async (inspection) => {
      queryClient.setQueryData(['inspections', 'detail', inspection.id], inspection);
      await queryClient.invalidateQueries({
        queryKey: ['inspections', 'list', { leadId: inspection.leadId }],
      });
    },
  });
}
