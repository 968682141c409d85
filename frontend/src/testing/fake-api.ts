import { vi } from 'vitest';

export interface FakeRequest {
  method: string;
  path: string;
  query: URLSearchParams;
  body: unknown;
  headers: Record<string, string>;
}

export interface FakeResponse {
  status?: number;
  body?: unknown;
}

type Handler = (req: FakeRequest) => FakeResponse | Promise<FakeResponse>;

/**
 * A stand-in for the API behind `fetch`: routes are "METHOD /api/path" (path without the query string).
 * Anything not routed answers 404 in the API's error shape, so a test notices a call it did not expect.
 */
export function fakeApi(routes: Record<string, Handler | FakeResponse>) {
  const calls: FakeRequest[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = new URL(String(input), 'http://localhost');
    const method = (init.method ?? 'GET').toUpperCase();
    const req: FakeRequest = {
      method,
      path: url.pathname,
      query: url.searchParams,
      body: typeof init.body === 'string' ? (JSON.parse(init.body) as unknown) : undefined,
      headers: (init.headers ?? {}) as Record<string, string>,
    };
    calls.push(req);
    const route = routes[`${method} ${url.pathname}`];
    const answer: FakeResponse = route
      ? typeof route === 'function'
        ? await route(req)
        : route
      : {
          status: 404,
          body: { code: 'ROUTE.NOT_FOUND', message: 'Nothing here.', details: null, requestId: 't' },
        };
    const status = answer.status ?? 200;
    return new Response(answer.body === undefined || status === 204 ? null : JSON.stringify(answer.body), {
      status,
      headers: { 'Content-Type': 'application/json' },
    });
  });
  vi.stubGlobal('fetch', fetchMock);
  return { fetchMock, calls };
}

export const errorBody = (code: string, message: string, details: unknown = null) => ({
  code,
  message,
  details,
  requestId: 'req-test-1',
});
