import { ApiError } from '@/lib/api-client';
import { sessionStore } from '@/features/auth/session-store';

/**
 * A ledger CSV behind the bearer token: fetched (a plain link cannot carry the Authorization header), then
 * saved under the name the server gives. Failures come back as ApiError, like every other request.
 */
export async function fetchCsv(
  path: string,
  query: Record<string, string | null | undefined>,
): Promise<{ blob: Blob; filename: string }> {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) if (v) params.set(k, v);
  params.set('format', 'csv');
  const token = sessionStore.get()?.accessToken;
  const headers: Record<string, string> = { Accept: 'text/csv' };
  if (token) headers.Authorization = `Bearer ${token}`;
  let response: Response;
  try {
    response = await fetch(`/api${path}?${params.toString()}`, { headers });
  } catch {
    throw new ApiError(0, {
      code: 'NETWORK.UNREACHABLE',
      message: 'Loambook could not be reached. Check your connection and try again.',
      details: null,
    });
  }
  if (!response.ok) {
    let body: { code?: unknown; message?: unknown; requestId?: unknown } = {};
    try {
      body = (await response.json()) as typeof body;
    } catch {
      // Not the API's error shape.
    }
    throw new ApiError(response.status, {
      code: typeof body.code === 'string' ? body.code : `HTTP.${response.status}`,
      message: typeof body.message === 'string' ? body.message : 'The CSV could not be made. Try again.',
      details: null,
      requestId: typeof body.requestId === 'string' ? body.requestId : '',
    });
  }
  const disposition = response.headers.get('content-disposition') ?? '';
  const filename = /filename="([^"]+)"/.exec(disposition)?.[1] ?? 'ledger.csv';
  return { blob: await response.blob(), filename };
}

export async function downloadCsv(
  path: string,
  query: Record<string, string | null | undefined>,
): Promise<string> {
  const { blob, filename } = await fetchCsv(path, query);
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = filename;
  document.body.appendChild(a);
  a.click();
  a.remove();
  window.setTimeout(() => URL.revokeObjectURL(url), 60_000);
  return filename;
}
