import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { branchInput, makeUser, startTestApp, tokenFor, type TestApp } from './support/test-app';

describe('request validation', () => {
  let t: TestApp;
  let token: string;

  beforeAll(async () => {
    t = await startTestApp();
    token = await tokenFor(t, await makeUser(t.db, 'owner'));
  });
  afterAll(() => t.close());

  const post = (url: string) => t.http.post(url).set('Authorization', `Bearer ${token}`);

  it('answers malformed JSON with 400 in the common error shape', async () => {
    const res = await post('/api/branches').set('Content-Type', 'application/json').send('{"code": "AB",');
    expect(res.status).toBe(400);
    expect(res.body).toEqual({
      code: 'REQUEST.MALFORMED_JSON',
      message: 'The request body is not valid JSON.',
      details: null,
      requestId: expect.any(String),
    });
  });

  it('refuses unknown fields, naming them', async () => {
    const res = await post('/api/branches').send({ ...branchInput(), isAdmin: true });
    expect(res.status).toBe(400);
    expect(res.body.code).toBe('VALIDATION.FAILED');
    expect(res.body.details).toContainEqual({
      field: 'isAdmin',
      message: 'isAdmin is not a field this request takes.',
    });
  });

  it('lists every missing field, nested ones included', async () => {
    const res = await post('/api/branches').send({ discountAuthority: {} });
    expect(res.status).toBe(400);
    const fields = new Set(res.body.details.map((d: { field: string }) => d.field));
    for (const f of [
      'code',
      'name',
      'addressLine1',
      'city',
      'state',
      'postalCode',
      'timezone',
      'marginFloorPct',
      'salesTaxTreatment',
      'salesTaxRatePct',
      'discountAuthority.salesperson',
      'discountAuthority.branch_manager',
    ]) {
      expect(fields, f).toContain(f);
    }
  });

  it('refuses over-long strings and numbers where decimal strings belong', async () => {
    const res = await post('/api/branches').send(branchInput({ name: 'x'.repeat(81), marginFloorPct: 35 }));
    expect(res.status).toBe(400);
    const fields = res.body.details.map((d: { field: string }) => d.field);
    expect(fields).toEqual(expect.arrayContaining(['name', 'marginFloorPct']));
  });

  it.each([
    `O'Brien & Sons "Foundations"`,
    `Robert'); DROP TABLE branches;--`,
    `100% <b>bold</b> \\ back\\slash`,
  ])('stores %j verbatim', async (name) => {
    const res = await post('/api/branches').send(branchInput({ name }));
    expect(res.status).toBe(201);
    expect(res.body.name).toBe(name);
    const row = await t.db('branches').where({ id: res.body.id }).first();
    expect(row.name).toBe(name);
    const person = await post('/api/users').send({
      name,
      email: `quote.${Date.now()}@loambook.test`,
      role: 'bookkeeper',
      branchIds: [],
    });
    expect(person.status).toBe(201);
    expect(person.body.name).toBe(name);
  });

  it('never sends a stack trace', async () => {
    const res = await post('/api/branches').send({ code: { $gt: '' } });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.(ts|js):\d+/);
    expect(Object.keys(res.body).sort()).toEqual(['code', 'details', 'message', 'requestId']);
  });

  it('answers an unknown API route with 404 in the same shape', async () => {
    const res = await t.http.get('/api/no-such-thing').set('Authorization', `Bearer ${token}`);
    expect(res.status).toBe(404);
    expect(res.body.code).toBe('ROUTE.NOT_FOUND');
  });
});
