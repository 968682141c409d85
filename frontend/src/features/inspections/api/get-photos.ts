import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InspectionPhoto } from '@loambook/common';
import { api } from '@/lib/api-client';
import { fetchPhotoBlob } from './photo-transport';

export function getPhotos(inspectionId: string, signal?: AbortSignal): Promise<InspectionPhoto[]> {
  return api.get<InspectionPhoto[]>(`/inspections/${encodeURIComponent(inspectionId)}/photos`, { signal });
}

export const photosQueryOptions = (inspectionId: string) =>
  queryOptions({
    queryKey: ['inspections', 'photos', inspectionId],
    queryFn: ({ signal }) => getPhotos(inspectionId, signal),
  });

export function usePhotos(inspectionId: string) {
  return useQuery(photosQueryOptions(inspectionId));
}

/** A photo's bytes (the thumbnail or the original), kept while they are on screen and a little after. */
export const photoBlobQueryOptions = (url: string) =>
  queryOptions({
    queryKey: ['inspections', 'photo-blob', url],
    queryFn: ({ signal }) => fetchPhotoBlob(url, signal),
    staleTime: Infinity,
    gcTime: 5 * 60_000,
  });

export function usePhotoBlob(url: string | null) {
  return useQuery({ ...photoBlobQueryOptions(url ?? ''), enabled: url !== null });
}
