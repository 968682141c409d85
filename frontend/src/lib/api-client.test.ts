import { afterEach, describe, expect, it, vi } from 'vitest';
import { ApiError, apiRequest, setTokenGetter, setUnauthorizedHandler } from './api-client';
import { errorBody, fakeApi } from '@/testing/fake-api';

afterEach(() => {
  setTokenGetter(() => null);
  setUnauthorizedHandler(null);
});

describe('api client', () => {
  it('turns an error body into an ApiError with status, code, message, details and request id', async () => {
    fakeApi({
      'POST /api/branches': {
        status: 409,
        body: errorBody('BRANCH.CODE_TAKEN', 'Another branch already uses this code.', [
          { field: 'code', message: 'Another branch already uses this code.' },
        ]),
      },
    });
    const error = await apiRequest('/branches', { method: 'POST', body: { code: 'MRW' } }).catch(
      (e: unknown) => e,
    );
    expect(error).toBeInstanceOf(ApiError);
    const apiError = error as ApiError;
    expect(apiError.status).toBe(409);
    expect(apiError.code).toBe('BRANCH.CODE_TAKEN');
    expect(apiError.message).toBe('Another branch already uses this code.');
    expect(apiError.requestId).toBe('req-test-1');
    expect(apiError.fieldErrors).toEqual([
      { field: 'code', message: 'Another branch already uses this code.' },
    ]);
  });

  it('gives a readable error when the body is not the API error shape', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => new Response('<html>Bad gateway</html>', { status: 502 })),
    );
    const error = (await apiRequest('/health').catch((e: unknown) => e)) as ApiError;
    expect(error.status).toBe(502);
    expect(error.code).toBe('INTERNAL');
    expect(error.fieldErrors).toEqual([]);
  });

  it('sends the bearer token and JSON, and reads the JSON answer', async () => {
    setTokenGetter(() => 'abc.def');
    const { calls } = fakeApi({ 'GET /api/users': { body: [{ id: 'u1' }] } });
    const users = await apiRequest<{ id: string }[]>('/users', { query: { branchId: 'b1', other: null } });
    expect(users).toEqual([{ id: 'u1' }]);
    expect(calls[0]?.headers.Authorization).toBe('Bearer abc.def');
    expect(calls[0]?.query.get('branchId')).toBe('b1');
    expect(calls[0]?.query.has('other')).toBe(false);
  });

  it('calls onUnauthorized when an authenticated request answers 401', async () => {
    setTokenGetter(() => 'expired-token');
    const onUnauthorized = vi.fn();
    setUnauthorizedHandler(onUnauthorized);
    fakeApi({ 'GET /api/auth/me': { status: 401, body: errorBody('AUTH.REQUIRED', 'Please sign in.') } });
    await expect(apiRequest('/auth/me')).rejects.toMatchObject({ status: 401, code: 'AUTH.REQUIRED' });
    expect(onUnauthorized).toHaveBeenCalledTimes(1);
    expect(onUnauthorized.mock.calls[0]?.[0]).toBeInstanceOf(ApiError);
  });

  it('does not call onUnauthorized for a failed sign-in (no token was sent)', async () => {
    const onUnauthorized = vi.fn();
    setUnauthorizedHandler(onUnauthorized);
    fakeApi({
      'POST /api/auth/login': {
        status: 401,
        body: errorBody(
          'AUTH.INVALID_CREDENTIALS',
          'That e-mail and password do not match an active account.',
        ),
      },
    });
    await expect(apiRequest('/auth/login', { method: 'POST', body: {} })).rejects.toMatchObject({
      code: 'AUTH.INVALID_CREDENTIALS',
    });
    expect(onUnauthorized).not.toHaveBeenCalled();
  });

  it('reports an unreachable server as a network error', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))),
    );
    await expect(apiRequest('/health')).rejects.toMatchObject({ status: 0, code: 'NETWORK.UNREACHABLE' });
  });
});
