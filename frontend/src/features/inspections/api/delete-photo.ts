import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InspectionPhoto } from '@loambook/common';
import { api } from '@/lib/api-client';

/** 204; refused (409) once the inspection is completed. */
export function deletePhoto(photo: InspectionPhoto): Promise<void> {
  return api.delete(`/photos/${encodeURIComponent(photo.id)}`);
}

export function useDeletePhoto() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deletePhoto,
    onSuccess: async (_r, photo) => {
      queryClient.setQueryData<InspectionPhoto[]>(['inspections', 'photos', photo.inspectionId], (list) =>
        list?.filter((p) => p.id !== photo.id),
      );
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['inspections', 'photos', photo.inspectionId] }),
        queryClient.invalidateQueries({ queryKey: ['inspections', 'detail', photo.inspectionId] }),
      ]);
    },
  });
}
