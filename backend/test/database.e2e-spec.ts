import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeUser, startTestApp, type TestApp } from './support/test-app';

describe('database invariants', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(() => t.close());

  it('never deletes a user row (people are deactivated)', async () => {
    const u = await makeUser(t.db, 'bookkeeper');
    await expect(t.db('users').where({ id: u.id }).delete()).rejects.toThrow(/never deleted/);
  });

  it('keeps e-mails unique whatever their case', async () => {
    const u = await makeUser(t.db, 'bookkeeper');
    await expect(
      t.db('users').insert({ name: 'Copy', email: u.email.toUpperCase(), role: 'bookkeeper' }),
    ).rejects.toThrow(/users_email_lower_unique/);
  });

  it('refuses an unknown role and a float-looking percentage beyond range', async () => {
    await expect(
      t.db('users').insert({ name: 'X', email: 'x.role@loambook.test', role: 'admin' }),
    ).rejects.toThrow(/users_role_check/);
  });
});
