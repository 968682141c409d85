import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SIGNING_THROTTLE } from '../src/signing/signing-throttle';
import { startTestApp, type TestApp } from './support/test-app';

/** The homeowner's public signing routes are rate limited per address and route (429 past the limit). */
describe('signing routes rate limit', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(() => t.close());

  // The app trusts X-Forwarded-For from loopback (trust proxy 'loopback'), so each test is its own client.
  const from = (ip: string) => ({
    view: (token: string) => t.http.get(`/api/signing/${token}`).set('X-Forwarded-For', ip),
    cancel: (token: string) =>
      t.http.post(`/api/signing/${token}/cancel`).set('X-Forwarded-For', ip).send({ confirm: true }),
  });

  it(`answers ${SIGNING_THROTTLE.limit} requests a minute from one address, then 429`, async () => {
    const client = from('203.0.113.10');
    const statuses: number[] = [];
    for (let i = 0; i < SIGNING_THROTTLE.limit; i++)
      statuses.push((await client.view('x'.repeat(43))).status);
    // Unknown links: 410 every time, never 429 up to the limit.
    expect(new Set(statuses)).toEqual(new Set([410]));
    const over = await client.view('y'.repeat(43));
    expect(over.status).toBe(429);
    expect(over.body.code).toBe('AUTH.TOO_MANY_ATTEMPTS');
    expect(Number(over.headers['retry-after-signing'])).toBeGreaterThan(0);
  });

  it('counts each route and each address apart', async () => {
    const busy = from('203.0.113.20');
    for (let i = 0; i <= SIGNING_THROTTLE.limit; i++) await busy.view('x'.repeat(43));
    expect((await busy.view('x'.repeat(43))).status).toBe(429);
    // The same address may still cancel (another route), and a neighbour may still open a link.
    expect((await busy.cancel('x'.repeat(43))).status).toBe(410);
    expect((await from('203.0.113.21').view('x'.repeat(43))).status).toBe(410);
  });

  it('leaves the staff routes and sign-in alone', async () => {
    const busy = from('203.0.113.30');
    for (let i = 0; i <= SIGNING_THROTTLE.limit; i++) await busy.view('x'.repeat(43));
    const me = await t.http.get('/api/auth/me').set('X-Forwarded-For', '203.0.113.30');
    expect(me.status).toBe(401);
    const login = await t.http
      .post('/api/auth/login')
      .set('X-Forwarded-For', '203.0.113.30')
      .send({ email: 'nobody@example.test', password: 'not the password' });
    expect(login.status).toBe(401);
  });
});
