import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApiDocument } from '../src/app.factory';
import { startTestApp, type TestApp } from './support/test-app';

/** The only routes that answer without a token. Adding one here is a decision, reviewed like code. */
const PUBLIC_ROUTES = new Set([
  'GET /api/health',
  'POST /api/auth/login',
  'GET /api/auth/password-links/{token}',
  'POST /api/auth/password',
  // The homeowner's signing page: the unguessable link is the credential (src/signing/signing.controller.ts).
  'GET /api/signing/{token}',
  'GET /api/signing/{token}/pdf',
  'POST /api/signing/{token}/sign',
  'POST /api/signing/{token}/cancel',
  // The card processor's webhook: the signature over the raw body is the credential (src/payments).
  'POST /api/payments/webhook',
  // The homeowner's page after paying asks whether the payment is in, by the checkout session id.
  'GET /api/payments/checkout/{sessionId}',
]);

describe('every route needs a token except the public ones', () => {
  let t: TestApp;
  let routes: { method: string; path: string }[];

  beforeAll(async () => {
    t = await startTestApp();
    const doc = openApiDocument(t.app);
    routes = Object.entries(doc.paths).flatMap(([path, item]) =>
      ['get', 'post', 'put', 'patch', 'delete']
        .filter((m) => (item as Record<string, unknown>)[m])
        .map((method) => ({ method, path })),
    );
  });
  afterAll(() => t.close());

  it('finds the routes (guards against an empty enumeration)', () => {
    expect(routes.length).toBeGreaterThanOrEqual(14);
    for (const r of PUBLIC_ROUTES) {
      expect(routes.map((x) => `${x.method.toUpperCase()} ${x.path}`)).toContain(r);
    }
  });

  it('answers 401 on every non-public route called without a token', async () => {
    const failures: string[] = [];
    for (const { method, path } of routes) {
      const key = `${method.toUpperCase()} ${path}`;
      if (PUBLIC_ROUTES.has(key)) continue;
      const url = path.replace(/\{[^}]+\}/g, randomUUID());
      const call = (t.http as unknown as Record<string, (u: string) => import('supertest').Test>)[method]!;
      const res = await call(url).send({});
      if (res.status !== 401 || res.body.code !== 'AUTH.REQUIRED') failures.push(`${key} → ${res.status}`);
    }
    expect(failures).toEqual([]);
  });

  it('answers the public routes without a token', async () => {
    expect((await t.http.get('/api/health')).body).toEqual({ status: 'ok', db: 'up' });
    expect((await t.http.post('/api/auth/login').send({ email: 'a@b.test', password: 'x' })).status).toBe(
      401,
    );
    expect((await t.http.get('/api/auth/password-links/' + 'x'.repeat(40))).status).toBe(410);
    expect((await t.http.get('/api/signing/' + 'x'.repeat(43))).body.code).toBe('SIGNING.LINK_UNKNOWN');
  });

  it('serves the OpenAPI document and its UI', async () => {
    const json = await t.http.get('/api/docs/openapi.json');
    expect(json.status).toBe(200);
    expect(json.body.paths['/api/auth/login']).toBeDefined();
    expect((await t.http.get('/api/docs')).status).toBe(200);
  });

  it('sends security headers and a request id', async () => {
    const res = await t.http.get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
    expect(res.headers['access-control-allow-origin']).toBeUndefined();
  });
});
