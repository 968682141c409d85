import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeBranch, makeUser, startTestApp, tokenFor, type TestApp } from './support/test-app';

describe('the branch directory (transfer targets)', () => {
  let t: TestApp;
  let north: string;
  let south: string;
  let tokens: Record<'manager' | 'seller' | 'crew' | 'owner', string>;

  beforeAll(async () => {
    t = await startTestApp();
    north = await makeBranch(t.db, { name: 'Directory North' });
    south = await makeBranch(t.db, { name: 'Directory South' });
    tokens = {
      manager: await tokenFor(t, await makeUser(t.db, 'branch_manager', [north])),
      seller: await tokenFor(t, await makeUser(t.db, 'salesperson', [north])),
      crew: await tokenFor(t, await makeUser(t.db, 'crew_lead', [south])),
      owner: await tokenFor(t, await makeUser(t.db, 'owner')),
    };
  });
  afterAll(() => t.close());

  const get = (who: keyof typeof tokens, url: string) =>
    t.http.get(url).set('Authorization', `Bearer ${tokens[who]}`);

  it('names every branch to a manager of one, with nothing but id, code and name', async () => {
    const res = await get('manager', '/api/branches/directory');
    expect(res.status).toBe(200);
    const ids = res.body.map((b: { id: string }) => b.id);
    expect(ids).toEqual(expect.arrayContaining([north, south]));
    const southRow = res.body.find((b: { id: string }) => b.id === south);
    expect(Object.keys(southRow).sort()).toEqual(['code', 'id', 'name']);
    expect(southRow.name).toBe('Directory South');
    // Sorted by code, so the transfer list reads the same for everyone.
    const codes = res.body.map((b: { code: string }) => b.code);
    expect(codes).toEqual([...codes].sort());
  });

  it('answers every signed-in role the same list, and nobody without a token', async () => {
    const manager = (await get('manager', '/api/branches/directory')).body;
    for (const who of ['seller', 'crew', 'owner'] as const) {
      const res = await get(who, '/api/branches/directory');
      expect(res.status).toBe(200);
      expect(res.body).toEqual(manager);
    }
    expect((await t.http.get('/api/branches/directory')).status).toBe(401);
  });

  it('still keeps the other branch’s settings from the manager (404), and lists only their own', async () => {
    expect((await get('manager', `/api/branches/${south}`)).status).toBe(404);
    const own = await get('manager', '/api/branches');
    expect(own.body.map((b: { id: string }) => b.id)).toEqual([north]);
  });

  it('lets the manager transfer a lead to a branch named only by the directory', async () => {
    const lead = await t.http.post('/api/leads').set('Authorization', `Bearer ${tokens.manager}`).send({
      branchId: north,
      homeownerName: 'Dara Directory',
      phonePrimary: '555-0163',
      preferredContact: 'phone',
      addressLine1: '7 Transfer Lane',
      city: 'Testerton',
      state: 'FL',
      postalCode: '32001',
    });
    expect(lead.status).toBe(201);
    const target = (await get('manager', '/api/branches/directory')).body.find(
      (b: { id: string }) => b.id === south,
    );
    const moved = await t.http
      .post(`/api/leads/${lead.body.lead.id}/transfer`)
      .set('Authorization', `Bearer ${tokens.manager}`)
      .send({ branchId: target.id });
    expect(moved.status).toBe(200);
    expect(moved.body.branchCode).toBe(target.code);
  });
});
