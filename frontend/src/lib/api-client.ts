import type { ApiErrorBody, FieldError } from '@loambook/common';

/**
 * The one way the screens talk to the API. It adds the bearer token, sends and reads JSON, and turns every
 * failure into an ApiError. It never redirects and never shows anything: components decide that.
 */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: ApiErrorBody['details'];
  readonly requestId: string;

  constructor(status: number, body: Omit<ApiErrorBody, 'requestId'> & { requestId?: string }) {
    super(body.message);
    this.name = 'ApiError';
    this.status = status;
    this.code = body.code;
    this.details = body.details;
    this.requestId = body.requestId ?? '';
  }

  /** The per-field faults of a validation failure or a conflict, or [] when there are none. */
  get fieldErrors(): FieldError[] {
    if (!Array.isArray(this.details)) return [];
    return this.details.filter(
      (d): d is FieldError =>
        typeof d === 'object' && d !== null && typeof d.field === 'string' && typeof d.message === 'string',
    );
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

type TokenGetter = () => string | null;
type UnauthorizedHandler = (error: ApiError) => void;

let getToken: TokenGetter = () => null;
let onUnauthorized: UnauthorizedHandler | null = null;

/** The auth provider tells the client where the current token is. */
export function setTokenGetter(getter: TokenGetter): void {
  getToken = getter;
}

/**
 * Called when an authenticated request answers 401: the session has ended on the server. Returns a function
 * that removes the handler again.
 */
export function setUnauthorizedHandler(handler: UnauthorizedHandler | null): () => void {
  onUnauthorized = handler;
  return () => {
    if (onUnauthorized === handler) onUnauthorized = null;
  };
}

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  body?: unknown;
  query?: Record<string, string | null | undefined>;
  signal?: AbortSignal;
}

const API_BASE = '/api';

function looksLikeErrorBody(value: unknown): value is ApiErrorBody {
  return (
    typeof value === 'object' &&
    value !== null &&
    typeof (value as ApiErrorBody).code === 'string' &&
    typeof (value as ApiErrorBody).message === 'string'
  );
}

async function readJson(response: Response): Promise<unknown> {
  const text = await response.text();
  if (!text) return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return undefined;
  }
}

function fallbackError(status: number): Omit<ApiErrorBody, 'requestId'> {
  if (status === 0) {
    return {
      code: 'NETWORK.UNREACHABLE',
      message: 'Loambook could not be reached. Check your connection and try again.',
      details: null,
    };
  }
  if (status >= 500) {
    return {
      code: 'INTERNAL',
      message: 'Something went wrong on our side. Try again in a moment.',
      details: null,
    };
  }
  return { code: `HTTP.${status}`, message: `The request failed (HTTP ${status}).`, details: null };
}

export async function apiRequest<T>(path: string, options: RequestOptions = {}): Promise<T> {
  const { method = 'GET', body, query, signal } = options;
  const token = getToken();
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  if (token) headers.Authorization = `Bearer ${token}`;

  let url = `${API_BASE}${path}`;
  if (query) {
    const params = new URLSearchParams();
    for (const [key, value] of Object.entries(query)) {
      if (value !== undefined && value !== null && value !== '') params.set(key, value);
    }
    const qs = params.toString();
    if (qs) url += `?${qs}`;
  }

  let response: Response;
  try {
    response = await fetch(url, {
      method,
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
      signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(0, fallbackError(0));
  }

  const data = await readJson(response);
  if (response.ok) return data as T;

  const error = new ApiError(
    response.status,
    looksLikeErrorBody(data)
      ? {
          code: data.code,
          message: data.message,
          details: data.details ?? null,
          requestId: data.requestId ?? response.headers.get('x-request-id') ?? '',
        }
      : { ...fallbackError(response.status), requestId: response.headers.get('x-request-id') ?? '' },
  );
  // A 401 on a request that carried a token means the session is over; a 401 on sign-in does not.
  if (response.status === 401 && token && onUnauthorized) onUnauthorized(error);
  throw error;
}

export const api = {
  get: <T>(path: string, options?: Omit<RequestOptions, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...options, method: 'GET' }),
  post: <T>(path: string, body?: unknown) => apiRequest<T>(path, { method: 'POST', body: body ?? {} }),
  patch: <T>(path: string, body: unknown) => apiRequest<T>(path, { method: 'PATCH', body }),
  delete: <T = void>(path: string) => apiRequest<T>(path, { method: 'DELETE' }),
};
