import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '@loambook/common';
import {
  branchInput,
  makeBranch,
  makeUser,
  startTestApp,
  tokenFor,
  type TestApp,
  type TestUser,
} from './support/test-app';

describe('admin routes, role by role', () => {
  let t: TestApp;
  let north: string;
  let south: string;
  let unused: string;
  const tokens = {} as Record<Role, string>;
  const people = {} as Record<Role, TestUser>;
  let northSales: TestUser;

  beforeAll(async () => {
    t = await startTestApp();
    north = await makeBranch(t.db, { name: 'North' });
    south = await makeBranch(t.db, { name: 'South' });
    unused = await makeBranch(t.db, { name: 'Unused' });
    const roles: [Role, string[]][] = [
      ['owner', []],
      ['branch_manager', [north]],
      ['salesperson', [north]],
      ['bookkeeper', []],
      ['crew_lead', [north]],
    ];
    for (const [role, branches] of roles) {
      people[role] = await makeUser(t.db, role, branches);
      tokens[role] = await tokenFor(t, people[role]);
    }
    northSales = await makeUser(t.db, 'salesperson', [north]);
  });
  afterAll(() => t.close());

  const as = (role: Role) => ({
    get: (url: string) => t.http.get(url).set('Authorization', `Bearer ${tokens[role]}`),
    post: (url: string, body: object) =>
      t.http.post(url).set('Authorization', `Bearer ${tokens[role]}`).send(body),
    patch: (url: string, body: object) =>
      t.http.patch(url).set('Authorization', `Bearer ${tokens[role]}`).send(body),
    delete: (url: string) => t.http.delete(url).set('Authorization', `Bearer ${tokens[role]}`),
  });

  // role × route: the status each role gets. Owner everything; manager reads own branches and manages
  // the sales staff of them; bookkeeper reads branches; salesperson and crew lead read their own.
  const matrix: [string, Record<Role, number>][] = [
    [
      'GET /api/branches',
      { owner: 200, branch_manager: 200, salesperson: 200, bookkeeper: 200, crew_lead: 200 },
    ],
    [
      'POST /api/branches',
      { owner: 201, branch_manager: 403, salesperson: 403, bookkeeper: 403, crew_lead: 403 },
    ],
    [
      'PATCH /api/branches/:north',
      { owner: 200, branch_manager: 403, salesperson: 403, bookkeeper: 403, crew_lead: 403 },
    ],
    [
      'DELETE /api/branches/:unused',
      { owner: 204, branch_manager: 403, salesperson: 403, bookkeeper: 403, crew_lead: 403 },
    ],
    [
      'GET /api/users',
      { owner: 200, branch_manager: 200, salesperson: 200, bookkeeper: 200, crew_lead: 200 },
    ],
    [
      'POST /api/users',
      { owner: 201, branch_manager: 201, salesperson: 403, bookkeeper: 403, crew_lead: 403 },
    ],
    [
      'PATCH /api/users/:northSales',
      { owner: 200, branch_manager: 200, salesperson: 403, bookkeeper: 403, crew_lead: 403 },
    ],
  ];

  const order: Role[] = ['salesperson', 'bookkeeper', 'crew_lead', 'branch_manager', 'owner'];
  for (const [route, expected] of matrix) {
    it.each(order)(`${route} as %s`, async (role) => {
      const [method, pattern] = route.split(' ') as [string, string];
      const url = pattern
        .replace(':northSales', northSales.id)
        .replace(':north', north)
        .replace(':unused', unused);
      const r = as(role);
      const res =
        method === 'GET'
          ? await r.get(url)
          : method === 'POST'
            ? await r.post(
                url,
                url.endsWith('users')
                  ? {
                      name: 'New Person',
                      email: `new.${role}.${Date.now()}@loambook.test`,
                      role: 'salesperson',
                      branchIds: [north],
                    }
                  : branchInput(),
              )
            : method === 'PATCH'
              ? await r.patch(
                  url,
                  url.includes('users') ? { name: `Renamed by ${role}` } : { name: `North ${role}` },
                )
              : await r.delete(url);
      expect(res.status, JSON.stringify(res.body)).toBe(expected[role]);
    });
  }

  it('lists branches by scope: manager and salesperson see only their own', async () => {
    const ids = (res: { body: { id: string }[] }) => res.body.map((b) => b.id);
    expect(ids(await as('branch_manager').get('/api/branches'))).toEqual([north]);
    expect(ids(await as('owner').get('/api/branches'))).toEqual(expect.arrayContaining([north, south]));
    expect(ids(await as('bookkeeper').get('/api/branches'))).toEqual(expect.arrayContaining([north, south]));
  });

  it('answers 404, not 403, for a branch or a user of another branch', async () => {
    const southSales = await makeUser(t.db, 'salesperson', [south]);
    expect((await as('branch_manager').get(`/api/branches/${south}`)).status).toBe(404);
    const read = await as('branch_manager').get(`/api/users/${southSales.id}`);
    expect(read.status).toBe(404);
    expect(read.body.code).toBe('USER.NOT_FOUND');
    const change = await as('branch_manager').patch(`/api/users/${southSales.id}`, { name: 'Hijacked' });
    expect(change.status).toBe(404);
    const row = await t.db('users').where({ id: southSales.id }).first();
    expect(row.name).toBe('Test salesperson');
  });

  it('a manager lists only the people of their own branches', async () => {
    const southSales = await makeUser(t.db, 'salesperson', [south]);
    const res = await as('branch_manager').get('/api/users');
    const ids = res.body.map((u: { id: string }) => u.id);
    expect(ids).toContain(northSales.id);
    expect(ids).not.toContain(southSales.id);
    expect(res.body.every((u: { branchIds: string[] }) => u.branchIds.includes(north))).toBe(true);
  });

  it('a manager cannot invite a bookkeeper or another manager, nor into another branch', async () => {
    const base = { name: 'Someone', branchIds: [north] };
    const bk = await as('branch_manager').post('/api/users', {
      ...base,
      email: 'bk.x@loambook.test',
      role: 'bookkeeper',
    });
    expect(bk.status).toBe(403);
    const mgr = await as('branch_manager').post('/api/users', {
      ...base,
      email: 'mg.x@loambook.test',
      role: 'branch_manager',
    });
    expect(mgr.status).toBe(403);
    const other = await as('branch_manager').post('/api/users', {
      ...base,
      email: 'other.branch@loambook.test',
      role: 'salesperson',
      branchIds: [south],
    });
    expect(other.status).toBe(400);
    expect(other.body.details).toEqual([{ field: 'branchIds', message: 'Unknown branch.' }]);
    expect(
      await t.db('users').whereRaw('lower(email) = ?', ['other.branch@loambook.test']).first(),
    ).toBeUndefined();
  });

  it('a manager cannot promote a salesperson to manager', async () => {
    const res = await as('branch_manager').patch(`/api/users/${northSales.id}`, { role: 'branch_manager' });
    expect(res.status).toBe(403);
  });

  it('a manager editing branches keeps the person’s memberships outside the manager’s reach', async () => {
    const both = await makeUser(t.db, 'salesperson', [north, south]);
    const res = await as('branch_manager').patch(`/api/users/${both.id}`, { branchIds: [north] });
    expect(res.status).toBe(200);
    expect([...res.body.branchIds].sort()).toEqual([north, south].sort());
  });

  it('refuses to delete a branch in use, to deactivate oneself, and to lose the last owner', async () => {
    const del = await as('owner').delete(`/api/branches/${north}`);
    expect(del.status).toBe(409);
    expect(del.body.code).toBe('BRANCH.IN_USE');
    const self = await as('owner').patch(`/api/users/${people.owner.id}`, { active: false });
    expect(self.status).toBe(409);
    expect(self.body.code).toBe('USER.DEACTIVATE_SELF');
  });

  it('refuses a duplicate branch code and a duplicate e-mail in another case', async () => {
    const input = branchInput();
    expect((await as('owner').post('/api/branches', input)).status).toBe(201);
    const again = await as('owner').post('/api/branches', { ...input, name: 'Copy' });
    expect(again.status).toBe(409);
    expect(again.body.code).toBe('BRANCH.CODE_TAKEN');
    const dup = await as('owner').post('/api/users', {
      name: 'Copy',
      email: northSales.email.toUpperCase(),
      role: 'salesperson',
      branchIds: [north],
    });
    expect(dup.status).toBe(409);
    expect(dup.body.code).toBe('USER.EMAIL_TAKEN');
  });

  it('refuses a manager discount limit below the salesperson’s', async () => {
    const res = await as('owner').post(
      '/api/branches',
      branchInput({ discountAuthority: { salesperson: '20', branch_manager: '10' } }),
    );
    expect(res.status).toBe(400);
    expect(res.body.details[0].field).toBe('discountAuthority');
  });
});
