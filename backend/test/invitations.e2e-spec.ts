import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeBranch, makeUser, PUBLIC_URL, startTestApp, tokenFor, type TestApp } from './support/test-app';

const NEW_PASSWORD = 'soil moves slowly';

describe('invitations', () => {
  let t: TestApp;
  let ownerToken: string;
  let branchId: string;

  beforeAll(async () => {
    t = await startTestApp();
    branchId = await makeBranch(t.db);
    ownerToken = await tokenFor(t, await makeUser(t.db, 'owner', [], { name: 'Olive Owner' }));
  });
  afterAll(() => t.close());

  async function invite(email: string) {
    const res = await t.http
      .post('/api/users')
      .set('Authorization', `Bearer ${ownerToken}`)
      .send({ name: 'Sam Seller', email, role: 'salesperson', branchIds: [branchId] });
    expect(res.status).toBe(201);
    const mail = await t.mail.lastTo(email);
    const link = mail.text.match(/https?:\/\/\S+set-password\?token=([\w-]+)/);
    expect(link, mail.text).not.toBeNull();
    return { user: res.body, mail, token: decodeURIComponent(link![1]!) };
  }

  it('e-mails a link that sets the password once and signs the person in', async () => {
    const { user, mail, token } = await invite('sam.seller@loambook.test');
    expect(user.invitationPending).toBe(true);
    expect(mail.subject).toBe('Your Loambook invitation');
    expect(mail.text).toContain('Olive Owner has invited you to Loambook as salesperson');
    expect(mail.text).toContain(`${PUBLIC_URL}/set-password?token=`);

    const info = await t.http.get(`/api/auth/password-links/${token}`);
    expect(info.status).toBe(200);
    expect(info.body).toMatchObject({
      email: 'sam.seller@loambook.test',
      name: 'Sam Seller',
      purpose: 'invite',
    });

    const short = await t.http.post('/api/auth/password').send({ token, password: 'too short' });
    expect(short.status).toBe(400);
    expect(short.body.details).toEqual([
      { field: 'password', message: expect.stringMatching(/at least 12/) },
    ]);

    const set = await t.http.post('/api/auth/password').send({ token, password: NEW_PASSWORD });
    expect(set.status).toBe(200);
    expect(set.body.user.email).toBe('sam.seller@loambook.test');
    expect(
      (await t.http.get('/api/auth/me').set('Authorization', `Bearer ${set.body.accessToken}`)).status,
    ).toBe(200);

    const again = await t.http.post('/api/auth/password').send({ token, password: 'another long password' });
    expect(again.status).toBe(410);
    expect(again.body.code).toBe('AUTH.LINK_USED');
    const login = await t.http
      .post('/api/auth/login')
      .send({ email: 'sam.seller@loambook.test', password: NEW_PASSWORD });
    expect(login.status).toBe(200);
  });

  it('refuses an expired link and changes nothing', async () => {
    const { user, token } = await invite('late.larry@loambook.test');
    await t
      .db('password_tokens')
      .where({ user_id: user.id })
      .update({ expires_at: new Date(Date.now() - 1000) });
    const info = await t.http.get(`/api/auth/password-links/${token}`);
    expect(info.status).toBe(410);
    expect(info.body.code).toBe('AUTH.LINK_EXPIRED');
    const set = await t.http.post('/api/auth/password').send({ token, password: NEW_PASSWORD });
    expect(set.status).toBe(410);
    const row = await t.db('users').where({ id: user.id }).first();
    expect(row.password_hash).toBeNull();
  });

  it('a resent invitation replaces the earlier link', async () => {
    const { user, token: first } = await invite('twice.tina@loambook.test');
    const resend = await t.http
      .post(`/api/users/${user.id}/invitation`)
      .set('Authorization', `Bearer ${ownerToken}`);
    expect(resend.status).toBe(201);
    const mail = await t.mail.lastTo('twice.tina@loambook.test');
    const second = decodeURIComponent(mail.text.match(/token=([\w-]+)/)![1]!);
    expect(second).not.toBe(first);
    expect((await t.http.get(`/api/auth/password-links/${first}`)).status).toBe(410);
    expect((await t.http.get(`/api/auth/password-links/${second}`)).status).toBe(200);
  });

  it('does not create the person when the mail server refuses', async () => {
    await t.mail.close();
    const res = await t.http
      .post('/api/users')
      .set('Authorization', `Bearer ${ownerToken}`)
      .send({ name: 'No Mail', email: 'no.mail@loambook.test', role: 'salesperson', branchIds: [branchId] });
    expect(res.status).toBe(500);
    expect(await t.db('users').where({ email: 'no.mail@loambook.test' }).first()).toBeUndefined();
  });
});
