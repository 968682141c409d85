import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InspectionPhoto } from '@loambook/common';
import { uploadMultipart, type UploadProgress } from './photo-transport';

export function uploadPhoto({
  inspectionId,
  file,
  caption,
  onProgress,
}: {
  inspectionId: string;
  file: File;
  caption: string;
  onProgress?: (p: UploadProgress) => void;
}): Promise<InspectionPhoto> {
  const form = new FormData();
  if (caption.trim()) form.append('caption', caption.trim());
  form.append('file', file);
  return uploadMultipart<InspectionPhoto>(
    `/api/inspections/${encodeURIComponent(inspectionId)}/photos`,
    form,
    onProgress,
  );
}

export function useUploadPhoto() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadPhoto,
    onSuccess: async (photo) => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['inspections', 'photos', photo.inspectionId] }),
        queryClient.invalidateQueries({ queryKey: ['inspections', 'detail', photo.inspectionId] }),
      ]);
    },
  });
}
