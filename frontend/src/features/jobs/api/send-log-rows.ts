import type { DayNote, DayNoteInput, InstallEntry, InstallEntryInput, JobPhoto } from '@loambook/common';
import { api } from '@/lib/api-client';
import { uploadMultipart } from '@/features/inspections/api/photo-transport';
import { jobPath } from './job-cache';

/** One install-log row; the server answers 201 for a new row and 200 with the row it already has. */
export function postInstallEntry(jobId: string, input: InstallEntryInput): Promise<InstallEntry> {
  return api.post<InstallEntry>(jobPath(jobId, '/log/entries'), input);
}

export function postDayNote(jobId: string, input: DayNoteInput): Promise<DayNote> {
  return api.post<DayNote>(jobPath(jobId, '/log/day-notes'), input);
}

/** A photo; with its client id, a resend after a lost answer gets 200 and the photo already stored. */
export function uploadJobPhoto(
  jobId: string,
  photo: {
    file: Blob;
    fileName: string;
    caption: string | null;
    installEntryId: string | null;
    clientPhotoId?: string | null;
  },
): Promise<JobPhoto> {
  const form = new FormData();
  if (photo.caption?.trim()) form.append('caption', photo.caption.trim());
  if (photo.installEntryId) form.append('installEntryId', photo.installEntryId);
  if (photo.clientPhotoId) form.append('clientPhotoId', photo.clientPhotoId);
  form.append('file', photo.file, photo.fileName);
  return uploadMultipart<JobPhoto>(`/api${jobPath(jobId, '/photos')}`, form);
}
