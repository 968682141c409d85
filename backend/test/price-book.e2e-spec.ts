import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '@loambook/common';
import { seed as seedPriceBook } from '../../seeds/02-demo-price-book';
import priceBookData from '../../seeds/data/demo-price-book.json';
import { makeBranch, makeUser, startTestApp, tokenFor, type TestApp } from './support/test-app';
import { makeItem, makeLead } from './support/proposal-fixtures';

describe('price book', () => {
  let t: TestApp;
  let north: string;
  let south: string;
  const tokens: Record<string, string> = {};

  const item = (overrides: Record<string, unknown> = {}) => ({
    code: `PU-${randomUUID().slice(0, 6).toUpperCase()}`,
    description: 'Polyurethane injection material, per lb',
    category: 'soil_stabilisation',
    unit: 'lb',
    unitCost: '5.20',
    unitPrice: '11.50',
    ...overrides,
  });

  const as = (who: string) => {
    const auth = { Authorization: `Bearer ${tokens[who]}` };
    return {
      get: (url: string) => t.http.get(url).set(auth),
      post: (url: string, body: object) => t.http.post(url).set(auth).send(body),
      patch: (url: string, body: object) => t.http.patch(url).set(auth).send(body),
      delete: (url: string) => t.http.delete(url).set(auth),
    };
  };

  beforeAll(async () => {
    t = await startTestApp();
    north = await makeBranch(t.db, { name: 'North' });
    south = await makeBranch(t.db, { name: 'South' });
    const people: [string, Role, string[]][] = [
      ['owner', 'owner', []],
      ['bookkeeper', 'bookkeeper', []],
      ['northManager', 'branch_manager', [north]],
      ['northSales', 'salesperson', [north]],
      ['northCrew', 'crew_lead', [north]],
      ['southManager', 'branch_manager', [south]],
      ['southSales', 'salesperson', [south]],
    ];
    for (const [key, role, branches] of people)
      tokens[key] = await tokenFor(t, await makeUser(t.db, role, branches));
  });
  afterAll(() => t.close());

  it('lets a manager add an item to their branch, and answers the item with decimal strings', async () => {
    const body = item({
      code: 'PIER-STEEL',
      category: 'piers',
      unit: 'each',
      unitCost: '650',
      unitPrice: '1350.00',
    });
    const res = await as('northManager').post(`/api/branches/${north}/price-book`, body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({
      branchId: north,
      code: 'PIER-STEEL',
      category: 'piers',
      unit: 'each',
      unitCost: '650.00',
      unitPrice: '1350.00',
      active: true,
      inUse: false,
    });
    expect(res.body.id).toMatch(/^[0-9a-f-]{36}$/);
  });

  it('refuses a code already used in the same branch (409), but another branch may use it', async () => {
    const body = item({ code: 'DUP-CODE' });
    expect((await as('northManager').post(`/api/branches/${north}/price-book`, body)).status).toBe(201);
    const again = await as('northManager').post(`/api/branches/${north}/price-book`, body);
    expect(again.status).toBe(409);
    expect(again.body.code).toBe('PRICE_BOOK.CODE_TAKEN');
    expect(again.body.details).toEqual([{ field: 'code', message: expect.any(String) }]);
    expect((await as('southManager').post(`/api/branches/${south}/price-book`, body)).status).toBe(201);
  });

  it.each([
    [{ unitPrice: 11.5 }, 'unitPrice'], // never a JS number
    [{ unitCost: '-1' }, 'unitCost'],
    [{ unitCost: '1.234' }, 'unitCost'],
    [{ category: 'roofing' }, 'category'],
    [{ unit: 'gallon' }, 'unit'],
    [{ code: 'lower-case' }, 'code'],
    [{ description: 'x' }, 'description'],
    [{ colour: 'red' }, 'colour'], // unknown fields are refused
  ])('refuses %j (400, field %s)', async (overrides, field) => {
    const res = await as('northManager').post(`/api/branches/${north}/price-book`, item(overrides));
    expect(res.status).toBe(400);
    expect(res.body.code).toBe('VALIDATION.FAILED');
    expect(res.body.details.map((d: { field: string }) => d.field)).toContain(field);
  });

  it('lets the salesperson read but not change their branch’s price book', async () => {
    expect((await as('northSales').get(`/api/branches/${north}/price-book`)).status).toBe(200);
    expect((await as('northSales').post(`/api/branches/${north}/price-book`, item())).status).toBe(403);
    const id = await makeItem(t.db, north, { unitCost: '1', unitPrice: '2' });
    expect((await as('northSales').patch(`/api/price-book/${id}`, { unitPrice: '3' })).status).toBe(403);
  });

  it('keeps branches apart: another branch’s price book and items answer 404', async () => {
    const northItem = await makeItem(t.db, north, { unitCost: '1', unitPrice: '2' });
    expect((await as('southSales').get(`/api/branches/${north}/price-book`)).status).toBe(404);
    expect((await as('southManager').get(`/api/branches/${north}/price-book`)).status).toBe(404);
    const post = await as('southManager').post(`/api/branches/${north}/price-book`, item());
    expect(post.status).toBe(404);
    expect(post.body.code).toBe('BRANCH.NOT_FOUND');
    const patch = await as('southManager').patch(`/api/price-book/${northItem}`, { unitPrice: '9' });
    expect(patch.status).toBe(404);
    expect(patch.body.code).toBe('PRICE_BOOK.ITEM_NOT_FOUND');
    expect((await as('southManager').delete(`/api/price-book/${northItem}`)).status).toBe(404);
    const row = await t.db('price_book_items').where({ id: northItem }).first();
    expect(row.unit_price).toBe('2.00');
    expect((await as('owner').get(`/api/branches/${randomUUID()}/price-book`)).status).toBe(404);
  });

  it('lets the owner and the bookkeeper see any branch; the crew lead none', async () => {
    expect((await as('owner').get(`/api/branches/${south}/price-book`)).status).toBe(200);
    expect((await as('bookkeeper').get(`/api/branches/${north}/price-book`)).status).toBe(200);
    expect((await as('bookkeeper').post(`/api/branches/${north}/price-book`, item())).status).toBe(403);
    expect((await as('northCrew').get(`/api/branches/${north}/price-book`)).status).toBe(403);
    expect((await as('owner').post(`/api/branches/${south}/price-book`, item())).status).toBe(201);
  });

  it('deactivates with PATCH {active:false}: hidden by default, shown with ?includeInactive=true', async () => {
    const created = await as('northManager').post(
      `/api/branches/${north}/price-book`,
      item({ code: 'OLD-ITEM' }),
    );
    const res = await as('northManager').patch(`/api/price-book/${created.body.id}`, { active: false });
    expect(res.status).toBe(200);
    expect(res.body.active).toBe(false);
    const codes = async (q: string) =>
      (await as('northSales').get(`/api/branches/${north}/price-book${q}`)).body.map(
        (i: { code: string }) => i.code,
      );
    expect(await codes('')).not.toContain('OLD-ITEM');
    expect(await codes('?includeInactive=true')).toContain('OLD-ITEM');
    expect((await as('northSales').get(`/api/branches/${north}/price-book?includeInactive=yes`)).status).toBe(
      400,
    );
  });

  it('changes a price; refuses a code change onto a taken code', async () => {
    const a = await as('northManager').post(`/api/branches/${north}/price-book`, item({ code: 'CODE-A' }));
    await as('northManager').post(`/api/branches/${north}/price-book`, item({ code: 'CODE-B' }));
    const res = await as('northManager').patch(`/api/price-book/${a.body.id}`, { unitPrice: '12.25' });
    expect(res.body).toMatchObject({ code: 'CODE-A', unitPrice: '12.25', unitCost: '5.20' });
    const clash = await as('northManager').patch(`/api/price-book/${a.body.id}`, { code: 'CODE-B' });
    expect(clash.status).toBe(409);
    expect(clash.body.code).toBe('PRICE_BOOK.CODE_TAKEN');
  });

  it('deletes an unused item, but never one a proposal line names (409: deactivate it instead)', async () => {
    const unused = await makeItem(t.db, north, { unitCost: '1', unitPrice: '2' });
    expect((await as('northManager').delete(`/api/price-book/${unused}`)).status).toBe(204);
    expect(await t.db('price_book_items').where({ id: unused }).first()).toBeUndefined();

    const used = await makeItem(t.db, north, { unitCost: '1', unitPrice: '2' });
    const lead = await makeLead(t.db, north, null);
    const [user] = await t.db('users').select('id').where({ role: 'owner' }).limit(1);
    const [p] = await t
      .db('proposals')
      .insert({ lead_id: lead, branch_id: north, version: 1, created_by: user.id })
      .returning('id');
    const [o] = await t
      .db('proposal_options')
      .insert({ proposal_id: p.id, branch_id: north, position: 1, title: 'A' })
      .returning('id');
    await t.db('proposal_lines').insert({
      option_id: o.id,
      branch_id: north,
      position: 1,
      price_book_item_id: used,
      code: 'X',
      description: 'x',
      category: 'piers',
      unit: 'each',
      quantity: '1',
      unit_cost: '1',
      unit_price: '2',
    });
    const res = await as('northManager').delete(`/api/price-book/${used}`);
    expect(res.status).toBe(409);
    expect(res.body.code).toBe('PRICE_BOOK.ITEM_IN_USE');
    const listed = (await as('northManager').get(`/api/branches/${north}/price-book`)).body;
    expect(listed.find((i: { id: string }) => i.id === used).inUse).toBe(true);
  });

  it('seeds the demo price books idempotently (inside a transaction that is rolled back)', async () => {
    const codes = Object.keys(priceBookData.branches);
    const expected = Object.values(priceBookData.branches).reduce((n, items) => n + items.length, 0);
    await t.db
      .transaction(async (trx) => {
        for (const code of codes) {
          await trx('branches')
            .insert({
              code,
              name: `Demo ${code}`,
              address_line1: '1 Demo Row',
              city: 'Demo',
              state: 'FL',
              postal_code: '32000',
              timezone: 'America/New_York',
              margin_floor_pct: '35',
              discount_limit_salesperson_pct: '10',
              discount_limit_manager_pct: '20',
              sales_tax_treatment: 'materials_cost',
            })
            .onConflict('code')
            .ignore();
        }
        const count = async () =>
          Number(
            (
              await trx('price_book_items as i')
                .join('branches as b', 'b.id', 'i.branch_id')
                .whereIn('b.code', codes)
                .count({ n: '*' })
            )[0]!.n,
          );
        await seedPriceBook(trx);
        expect(await count()).toBe(expected);
        await seedPriceBook(trx);
        expect(await count()).toBe(expected);
        throw new Error('rollback');
      })
      .catch((e: Error) => {
        if (e.message !== 'rollback') throw e;
      });
    expect(expected).toBeGreaterThanOrEqual(24);
  });
});
