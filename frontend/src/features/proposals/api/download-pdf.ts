import { ApiError } from '@/lib/api-client';
import { sessionStore } from '@/features/auth/session-store';

/**
 * A PDF behind the bearer token (a proposal, a contract): fetched as a blob, because a plain link cannot
 * carry the Authorization header. Failures come back as ApiError, like every other request.
 */
export async function fetchPdf(path: string): Promise<Blob> {
  const token = sessionStore.get()?.accessToken;
  const headers: Record<string, string> = { Accept: 'application/pdf' };
  if (token) headers.Authorization = `Bearer ${token}`;
  let response: Response;
  try {
    response = await fetch(`/api${path}`, { headers });
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
      // Not the API's error shape: say what failed in general terms.
    }
    throw new ApiError(response.status, {
      code: typeof body.code === 'string' ? body.code : `HTTP.${response.status}`,
      message: typeof body.message === 'string' ? body.message : 'The PDF could not be made. Try again.',
      details: null,
      requestId: typeof body.requestId === 'string' ? body.requestId : '',
    });
  }
  return response.blob();
}

/**
 * Opens the PDF in a new tab. The tab is opened at once (inside the click, so no pop-up blocker stops it)
 * and pointed at the file when it has arrived; where no tab can be opened the file is downloaded instead.
 */
export async function openPdf(path: string, filename: string): Promise<void> {
  const tab = window.open('', '_blank');
  let blob: Blob;
  try {
    blob = await fetchPdf(path);
  } catch (error) {
    tab?.close();
    throw error;
  }
  const url = URL.createObjectURL(blob);
  if (tab) {
    tab.location.href = url;
  } else {
    const a = document.createElement('a');
    a.href = url;
    a.download = filename;
    document.body.appendChild(a);
    a.click();
    a.remove();
  }
  // The tab has read the file by then; the URL is released so the blob does not stay in memory.
  window.setTimeout(() => URL.revokeObjectURL(url), 60_000);
}
