import type { ApiErrorBody } from '@loambook/common';
import { ApiError } from '@/lib/api-client';
import { sessionStore } from '@/features/auth/session-store';

/*
 * The two photo requests the JSON client does not make: a multipart upload with progress (XMLHttpRequest,
 * since fetch reports no upload progress) and image bytes fetched with the bearer token (an <img src>
 * cannot send the header, so the bytes come as a Blob shown through an object URL).
 */

function bearer(): Record<string, string> {
  const token = sessionStore.get()?.accessToken;
  return token ? { Authorization: `Bearer ${token}` } : {};
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
    // not JSON: use the fallback below
  }
  return new ApiError(status, { code: `HTTP.${status}`, message: fallback, details: null });
}

export function fetchPhotoBlob(url: string, signal?: AbortSignal): Promise<Blob> {
  return fetch(url, { headers: bearer(), signal }).then(async (res) => {
    if (!res.ok) throw errorFrom(res.status, await res.text(), 'The photo could not be loaded.');
    return res.blob();
  });
}

export interface UploadProgress {
  loaded: number;
  total: number;
}

export function uploadMultipart<T>(
  url: string,
  form: FormData,
  onProgress?: (p: UploadProgress) => void,
): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    for (const [k, v] of Object.entries(bearer())) xhr.setRequestHeader(k, v);
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
          xhr.status === 413
            ? 'The photo is too large to upload.'
            : `The upload failed (HTTP ${xhr.status}).`,
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
