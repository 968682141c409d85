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

export function uploadJobPhoto(
  jobId: string,
  photo: { file: Blob; fileName: string; caption: string | null; installEntryId: string | null },
): Promise<JobPhoto> {
  const form = new FormData();
  if (photo.caption?.trim()) form.append('caption', photo.caption.trim());
  if (photo.installEntryId) form.append('installEntryId', photo.installEntryId);
  form.append('file', photo.file, photo.fileName);
  return uploadMultipart<JobPhoto>(`/api${jobPath(jobId, '/photos')}`, form);
}
