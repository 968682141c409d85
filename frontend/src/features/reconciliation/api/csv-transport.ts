import type { ApiErrorBody } from '@loambook/common';
import { ApiError } from '@/lib/api-client';
import { sessionStore } from '@/features/auth/session-store';

/*
 * The one request the JSON client does not make: a CSV file sent as multipart with its fields, with upload
 * progress (XMLHttpRequest: fetch reports none). Failures come back as ApiError, like every other request.
 */

export interface UploadProgress {
  loaded: number;
  total: number;
}

function errorFrom(status: number, text: string, fallback: string): ApiError {
  try {
    const body = JSON.parse(text) as Partial<ApiErrorBody>;
    if (typeof body.code === 'string' && typeof body.message === 'string') {
      return new ApiError(status, {
        code: body.code,
        message: body.message,
        details: body.details ?? null,
        requestId: body.requestId,
      });
    }
  } catch {
    // not the API's error shape: the fallback below
  }
  return new ApiError(status, { code: `HTTP.${status}`, message: fallback, details: null });
}

export function postCsv<T>(
  path: string,
  file: File,
  fields: Record<string, string | null | undefined>,
  onProgress?: (p: UploadProgress) => void,
): Promise<T> {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields))
    if (v !== undefined && v !== null && v !== '') form.append(k, v);
  form.append('file', file);
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api${path}`);
    const token = sessionStore.get()?.accessToken;
    if (token) xhr.setRequestHeader('Authorization', `Bearer ${token}`);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress?.({ loaded: e.loaded, total: e.total });
    };
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) {
        try {
          resolve(JSON.parse(xhr.responseText) as T);
        } catch {
          reject(errorFrom(xhr.status, '', 'The server’s answer could not be read.'));
        }
        return;
      }
      reject(
        errorFrom(
          xhr.status,
          xhr.responseText,
          xhr.status === 413 ? 'The file is too large to upload.' : `The upload failed (HTTP ${xhr.status}).`,
        ),
      );
    };
    xhr.onerror = () =>
      reject(
        new ApiError(0, {
          code: 'NETWORK.UNREACHABLE',
          message: 'Loambook could not be reached. Check your connection and try again.',
          details: null,
        }),
      );
    xhr.send(form);
  });
}
