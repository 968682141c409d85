import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InspectionPhoto } from '@loambook/common';
import { api } from '@/lib/api-client';

/** A new caption, or null to remove it. */
export function updatePhotoCaption({
  photo,
  caption,
}: {
  photo: InspectionPhoto;
  caption: string | null;
}): Promise<InspectionPhoto> {
  return api.patch<InspectionPhoto>(`/photos/${encodeURIComponent(photo.id)}`, { caption });
}

export function useUpdatePhotoCaption() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updatePhotoCaption,
    onSuccess: async (updated) => {
      queryClient.setQueryData<InspectionPhoto[]>(['inspections', 'photos', updated.inspectionId], (list) =>
        list?.map((p) => (p.id === updated.id ? updated : p)),
      );
      await queryClient.invalidateQueries({ queryKey: ['inspections', 'photos', updated.inspectionId] });
    },
  });
}
