import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { JwtService } from '@nestjs/jwt';
import { makeBranch, makeUser, PASSWORD, startTestApp, tokenFor, type TestApp } from './support/test-app';

describe('sign-in', () => {
  let t: TestApp;
  let branchId: string;

  beforeAll(async () => {
    t = await startTestApp();
    branchId = await makeBranch(t.db);
  });
  afterAll(() => t.close());

  it('signs in with e-mail in any case and returns the token, the user and their rules', async () => {
    const user = await makeUser(t.db, 'salesperson', [branchId]);
    const res = await t.http
      .post('/api/auth/login')
      .send({ email: user.email.toUpperCase(), password: PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toEqual({
      id: user.id,
      name: 'Test salesperson',
      email: user.email,
      role: 'salesperson',
      branchIds: [branchId],
    });
    expect(res.body.accessToken).toMatch(/^[\w-]+\.[\w-]+\.[\w-]+$/);
    expect(res.body.rules).toContainEqual({
      action: ['read', 'update'],
      subject: 'Lead',
      conditions: { branchId: { $in: [branchId] }, salespersonId: user.id },
    });
    // Default lifetime 8 h.
    const hours = (Date.parse(res.body.expiresAt) - Date.now()) / 3_600_000;
    expect(hours).toBeGreaterThan(7.9);
    expect(hours).toBeLessThanOrEqual(8);
  });

  it('gives a wrong password and an unknown e-mail the very same 401', async () => {
    const user = await makeUser(t.db, 'owner');
    const wrong = await t.http
      .post('/api/auth/login')
      .send({ email: user.email, password: 'not the password' });
    const unknown = await t.http
      .post('/api/auth/login')
      .send({ email: 'nobody@loambook.test', password: PASSWORD });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    const strip = ({ requestId: _r, ...rest }: Record<string, unknown>) => rest;
    expect(strip(wrong.body)).toEqual(strip(unknown.body));
    expect(wrong.body.code).toBe('AUTH.INVALID_CREDENTIALS');
  });

  it('refuses an inactive user with the same 401, even with the right password', async () => {
    const user = await makeUser(t.db, 'salesperson', [branchId], { active: false });
    const res = await t.http.post('/api/auth/login').send({ email: user.email, password: PASSWORD });
    expect(res.status).toBe(401);
    expect(res.body.code).toBe('AUTH.INVALID_CREDENTIALS');
  });

  it('refuses an invited person who has not set a password yet', async () => {
    const user = await makeUser(t.db, 'crew_lead', [branchId], { password: null });
    const res = await t.http.post('/api/auth/login').send({ email: user.email, password: PASSWORD });
    expect(res.status).toBe(401);
  });

  it('GET /auth/me returns the same user and rules without a new token', async () => {
    const user = await makeUser(t.db, 'branch_manager', [branchId]);
    const login = await t.http.post('/api/auth/login').send({ email: user.email, password: PASSWORD });
    const me = await t.http.get('/api/auth/me').set('Authorization', `Bearer ${login.body.accessToken}`);
    expect(me.status).toBe(200);
    expect(me.body).toEqual({ user: login.body.user, rules: login.body.rules });
    expect(me.body.accessToken).toBeUndefined();
  });

  it('stops accepting a token once its user is deactivated', async () => {
    const owner = await makeUser(t.db, 'owner');
    const sales = await makeUser(t.db, 'salesperson', [branchId]);
    const ownerToken = await tokenFor(t, owner);
    const salesToken = await tokenFor(t, sales);
    expect((await t.http.get('/api/auth/me').set('Authorization', `Bearer ${salesToken}`)).status).toBe(200);
    const off = await t.http
      .patch(`/api/users/${sales.id}`)
      .set('Authorization', `Bearer ${ownerToken}`)
      .send({ active: false });
    expect(off.status).toBe(200);
    expect(off.body.active).toBe(false);
    const after = await t.http.get('/api/auth/me').set('Authorization', `Bearer ${salesToken}`);
    expect(after.status).toBe(401);
    expect(after.body.code).toBe('AUTH.REQUIRED');
  });

  it('refuses expired, forged and malformed tokens', async () => {
    const user = await makeUser(t.db, 'owner');
    const jwt = t.app.get(JwtService);
    const expired = jwt.sign({ sub: user.id, tv: 0, exp: Math.floor(Date.now() / 1000) - 60 });
    const forged = new JwtService({ secret: 'some-other-secret-entirely' }).sign({ sub: user.id, tv: 0 });
    for (const token of [expired, forged, 'not-a-token']) {
      const res = await t.http.get('/api/auth/me').set('Authorization', `Bearer ${token}`);
      expect(res.status).toBe(401);
    }
    const good = jwt.sign({ sub: user.id, tv: 0 });
    expect((await t.http.get('/api/auth/me').set('Authorization', `Bearer ${good}`)).status).toBe(200);
  });
});

describe('sign-in throttling', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp({ LOGIN_THROTTLE_LIMIT: '3' });
  });
  afterAll(() => t.close());

  it('answers 429 after repeated failures for the same e-mail, and not for another one', async () => {
    const user = await makeUser(t.db, 'owner');
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) {
      statuses.push(
        (await t.http.post('/api/auth/login').send({ email: user.email, password: `wrong-${i}` })).status,
      );
    }
    expect(statuses).toEqual([401, 401, 401, 429]);
    const blocked = await t.http.post('/api/auth/login').send({ email: user.email, password: PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.code).toBe('AUTH.TOO_MANY_ATTEMPTS');
    const other = await makeUser(t.db, 'owner');
    expect(
      (await t.http.post('/api/auth/login').send({ email: other.email, password: PASSWORD })).status,
    ).toBe(200);
  });
});
