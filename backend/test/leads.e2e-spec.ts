import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  makeBranch,
  makeUser,
  startTestApp,
  tokenFor,
  type TestApp,
  type TestUser,
} from './support/test-app';

describe('leads and the pipeline', () => {
  let t: TestApp;
  let north: string;
  let south: string;
  let seller: TestUser;
  let other: TestUser;
  let tokens: Record<
    'seller' | 'other' | 'manager' | 'southManager' | 'owner' | 'bookkeeper' | 'crew',
    string
  >;

  beforeAll(async () => {
    t = await startTestApp();
    north = await makeBranch(t.db, { name: 'North' });
    south = await makeBranch(t.db, { name: 'South' });
    seller = await makeUser(t.db, 'salesperson', [north], { name: 'Sela Seller' });
    other = await makeUser(t.db, 'salesperson', [north], { name: 'Otis Other' });
    tokens = {
      seller: await tokenFor(t, seller),
      other: await tokenFor(t, other),
      manager: await tokenFor(t, await makeUser(t.db, 'branch_manager', [north])),
      southManager: await tokenFor(t, await makeUser(t.db, 'branch_manager', [south])),
      owner: await tokenFor(t, await makeUser(t.db, 'owner')),
      bookkeeper: await tokenFor(t, await makeUser(t.db, 'bookkeeper')),
      crew: await tokenFor(t, await makeUser(t.db, 'crew_lead', [north])),
    };
  });
  afterAll(() => t.close());

  const as = (who: keyof typeof tokens) => ({
    get: (url: string) => t.http.get(url).set('Authorization', `Bearer ${tokens[who]}`),
    post: (url: string, body: object) =>
      t.http.post(url).set('Authorization', `Bearer ${tokens[who]}`).send(body),
    patch: (url: string, body: object) =>
      t.http.patch(url).set('Authorization', `Bearer ${tokens[who]}`).send(body),
  });

  // Other test files share the database: an area code and a house number of this run keep the
  // duplicate checks here from matching their leads.
  const run = 200 + Math.floor(Math.random() * 700);
  let n = 0;
  const leadInput = (over: Record<string, unknown> = {}) => ({
    branchId: north,
    homeownerName: `Homeowner ${++n}`,
    phonePrimary: `(${run}) 555-01${String(n % 100).padStart(2, '0')}`,
    email: `home${n}.${Date.now()}@example.com`,
    preferredContact: 'phone',
    addressLine1: `${run}${n} Sinkhole Lane`,
    city: 'Testerton',
    state: 'FL',
    postalCode: '32001',
    foundationType: 'slab',
    source: 'Referral',
    ...over,
  });

  /** A lead entered through the API by the holder of `token` (a user made in the test itself). */
  async function postLead(token: string, over: Record<string, unknown>) {
    const res = await t.http.post('/api/leads').set('Authorization', `Bearer ${token}`).send(leadInput(over));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.lead as { id: string };
  }

  async function createLead(who: keyof typeof tokens = 'seller', over: Record<string, unknown> = {}) {
    const res = await as(who).post('/api/leads', leadInput(over));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body;
  }

  it('a salesperson enters a lead for themselves; the timeline records it', async () => {
    const { lead, possibleDuplicates } = await createLead();
    expect(lead.salespersonId).toBe(seller.id);
    expect(lead.stage).toBe('new');
    expect(lead.value).toBe('0.00');
    expect(lead.activities[0]).toMatchObject({
      kind: 'note',
      body: 'Lead entered.',
      actorName: 'Sela Seller',
    });
    expect(possibleDuplicates).toEqual({ matches: [], otherBranchMatches: 0 });
  });

  it('flags a possible duplicate by address, phone or e-mail', async () => {
    const { lead: first } = await createLead('seller', {
      addressLine1: '7 Marl Court',
      phonePrimary: '(555) 010-7777',
    });
    const { possibleDuplicates } = await createLead('seller', {
      addressLine1: '7 marl ct.'.replace('ct.', 'Court'),
      phonePrimary: '555.010.7777',
    });
    expect(possibleDuplicates.matches).toEqual([
      expect.objectContaining({ id: first.id, reasons: ['address', 'phone'] }),
    ]);
    // Another salesperson's lead is not shown to them, only counted.
    const check = await as('other').post('/api/leads/duplicate-check', { phone: '5550107777' });
    expect(check.body).toEqual({ matches: [], otherBranchMatches: 2 });
    const mgr = await as('manager').post('/api/leads/duplicate-check', { phone: '5550107777' });
    expect(mgr.body.matches).toHaveLength(2);
  });

  it('needs a phone or an e-mail, and validates the property', async () => {
    const res = await as('seller').post('/api/leads', leadInput({ phonePrimary: null, email: null }));
    expect(res.status).toBe(400);
    expect(res.body.details[0].field).toBe('phonePrimary');
    const bad = await as('seller').post(
      '/api/leads',
      leadInput({ postalCode: '123', foundationType: 'mud', yearBuilt: 1500 }),
    );
    expect(bad.status).toBe(400);
    expect(bad.body.details.map((d: { field: string }) => d.field)).toEqual(
      expect.arrayContaining(['postalCode', 'foundationType', 'yearBuilt']),
    );
  });

  it('isolates branches and salespeople: 404 outside, 403 for a role that may never', async () => {
    const { lead } = await createLead();
    expect((await as('other').get(`/api/leads/${lead.id}`)).status).toBe(404);
    expect((await as('southManager').get(`/api/leads/${lead.id}`)).status).toBe(404);
    expect((await as('manager').get(`/api/leads/${lead.id}`)).status).toBe(200);
    expect((await as('bookkeeper').get(`/api/leads/${lead.id}`)).status).toBe(200);
    expect((await as('bookkeeper').patch(`/api/leads/${lead.id}`, { notes: 'x' })).status).toBe(403);
    expect((await as('crew').get(`/api/leads/${lead.id}`)).status).toBe(403);
    expect((await as('seller').post('/api/leads', leadInput({ branchId: south }))).status).toBe(403);
  });

  it('refuses moves whose precondition is missing with 409 and a code', async () => {
    const { lead } = await createLead();
    const jump = await as('seller').post(`/api/leads/${lead.id}/stage`, { to: 'inspected' });
    expect(jump.status).toBe(409);
    expect(jump.body.code).toBe('LEAD.INVALID_TRANSITION');
    const book = await as('seller').post(`/api/leads/${lead.id}/stage`, { to: 'inspection_booked' });
    expect(book.status).toBe(409);
    expect(book.body.code).toBe('LEAD.NO_INSPECTION_BOOKED');
    const lost = await as('seller').post(`/api/leads/${lead.id}/stage`, { to: 'lost' });
    expect(lost.body.code).toBe('LEAD.LOST_REASON_REQUIRED');
    const ok = await as('seller').post(`/api/leads/${lead.id}/stage`, {
      to: 'lost',
      reason: 'Went with a cheaper quote',
    });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ stage: 'lost', lostReason: 'Went with a cheaper quote' });
    expect(ok.body.activities[0]).toMatchObject({ kind: 'stage_change', data: { from: 'new', to: 'lost' } });
  });

  it('lists the pipeline with paging, filters, search and per-stage totals', async () => {
    const branch = await makeBranch(t.db, { name: 'Pipeline' });
    const mgr = await tokenFor(t, await makeUser(t.db, 'branch_manager', [branch]));
    const sp = await makeUser(t.db, 'salesperson', [branch]);
    for (let i = 0; i < 7; i++) {
      await postLead(mgr, {
        branchId: branch,
        salespersonId: sp.id,
        homeownerName: i === 3 ? 'Quillon Vasquez' : `Pipe ${i}`,
      });
    }
    await t.db('leads').where({ branch_id: branch }).update({ value: '1000.50' });
    await t
      .db('leads')
      .where({ branch_id: branch, homeowner_name: 'Pipe 0' })
      .update({ stage: 'inspected', value: '9999.99' });
    const get = (qs: string) =>
      t.http.get(`/api/leads?branchId=${branch}&${qs}`).set('Authorization', `Bearer ${mgr}`);

    const page1 = await get('pageSize=10&sort=value&order=desc');
    expect(page1.status).toBe(200);
    expect(page1.body.total).toBe(7);
    expect(page1.body.items[0].homeownerName).toBe('Pipe 0');
    expect(page1.body.stages).toEqual(
      expect.arrayContaining([
        { stage: 'new', count: 6, value: '6003.00' },
        { stage: 'inspected', count: 1, value: '9999.99' },
      ]),
    );
    const paged = await get('pageSize=10&page=1&stage=new');
    expect(paged.body.items).toHaveLength(6);
    expect(paged.body.stages).toHaveLength(2); // totals ignore the stage filter
    expect(
      (await get('q=quillon')).body.items.map((l: { homeownerName: string }) => l.homeownerName),
    ).toEqual(['Quillon Vasquez']);
    expect((await get('minValue=5000')).body.total).toBe(1);
    expect((await get('minAgeDays=1')).body.total).toBe(0);
    expect((await get('pageSize=7')).status).toBe(400);
  });

  it('each pipeline filter and sort gives what a plain reading of the same leads gives', async () => {
    const branch = await makeBranch(t.db, { name: 'Filters' });
    const mgr = await tokenFor(t, await makeUser(t.db, 'branch_manager', [branch]));
    const sp1 = await makeUser(t.db, 'salesperson', [branch]);
    const sp2 = await makeUser(t.db, 'salesperson', [branch]);
    const stages = ['new', 'inspected', 'proposal_sent', 'lost'] as const;
    for (let i = 0; i < 12; i++) {
      const lead = await postLead(mgr, {
        branchId: branch,
        salespersonId: i % 3 === 0 ? sp2.id : sp1.id,
        homeownerName: `Filter ${String.fromCharCode(65 + i)} ${i % 4 === 0 ? 'Oakhollow' : 'Pell'}`,
        phonePrimary: `555-01${String(10 + i)}`,
      });
      await t
        .db('leads')
        .where({ id: lead.id })
        .update({
          stage: stages[i % 4],
          lost_reason: stages[i % 4] === 'lost' ? 'No answer' : null,
          value: `${(i * 1250.25).toFixed(2)}`,
          created_at: t.db.raw(`now() - make_interval(days => ?)`, [i * 3]),
          stage_changed_at: t.db.raw(`now() - make_interval(days => ?, hours => ?)`, [i, i]),
        });
    }
    // The reference: the branch's leads as stored, filtered and sorted here in plain code.
    type Stored = {
      id: string;
      name: string;
      stage: string;
      value: string;
      sp: string;
      ageDays: number;
      phone: string;
      stageAt: Date;
    };
    const stored: Stored[] = (
      await t.db.raw(
        `select id, homeowner_name as name, stage, value::text as value, salesperson_id as sp, phone_primary as phone,
                floor(extract(epoch from now() - created_at) / 86400)::int as "ageDays", stage_changed_at as "stageAt"
         from leads where branch_id = ?`,
        [branch],
      )
    ).rows;
    // Money as whole cents in BigInt (both sides write two decimals), never a float.
    const cents = (v: string) => BigInt(v.replace('.', ''));
    // [query, the stage filter, every other filter]: per-stage totals leave the stage filter out.
    const cases: [string, string[] | null, (l: Stored) => boolean][] = [
      ['', null, () => true],
      ['stage=inspected,lost', ['inspected', 'lost'], () => true],
      [`salespersonId=${sp2.id}`, null, (l) => l.sp === sp2.id],
      ['minAgeDays=10', null, (l) => l.ageDays >= 10],
      ['maxAgeDays=10', null, (l) => l.ageDays <= 10],
      ['minValue=5000&maxValue=10001', null, (l) => cents(l.value) >= 500000n && cents(l.value) <= 1000100n],
      ['q=oakhollow', null, (l) => l.name.includes('Oakhollow')],
      ['q=555-0115', null, (l) => l.phone === '555-0115'],
      [
        `q=pell&stage=new&salespersonId=${sp1.id}`,
        ['new'],
        (l) => l.name.includes('Pell') && l.sp === sp1.id,
      ],
    ];
    for (const [qs, stageFilter, keep] of cases) {
      const res = await t.http
        .get(`/api/leads?branchId=${branch}&pageSize=100&sort=value&order=desc&${qs}`)
        .set('Authorization', `Bearer ${mgr}`);
      expect(res.status, qs).toBe(200);
      const expected = stored
        .filter((l) => keep(l) && (!stageFilter || stageFilter.includes(l.stage)))
        .sort((x, y) => (cents(y.value) > cents(x.value) ? 1 : cents(y.value) < cents(x.value) ? -1 : 0));
      expect(
        res.body.items.map((l: { id: string }) => l.id),
        qs,
      ).toEqual(expected.map((l) => l.id));
      expect(res.body.total, qs).toBe(expected.length);
      const totals = new Map<string, { stage: string; count: number; value: bigint }>();
      for (const l of stored.filter(keep)) {
        const s = totals.get(l.stage) ?? { stage: l.stage, count: 0, value: 0n };
        totals.set(l.stage, { stage: l.stage, count: s.count + 1, value: s.value + cents(l.value) });
      }
      expect(
        res.body.stages
          .map((s: { stage: string; count: number; value: string }) => ({ ...s, value: cents(s.value) }))
          .sort((x: { stage: string }, y: { stage: string }) => x.stage.localeCompare(y.stage)),
        qs,
      ).toEqual([...totals.values()].sort((x, y) => x.stage.localeCompare(y.stage)));
    }
    // Sorting by days in stage, both ways, pages of 10.
    const byStage = [...stored].sort((a, b) => a.stageAt.getTime() - b.stageAt.getTime());
    const asc = await t.http
      .get(`/api/leads?branchId=${branch}&pageSize=10&page=2&sort=daysInStage&order=asc`)
      .set('Authorization', `Bearer ${mgr}`);
    expect(asc.body.items.map((l: { id: string }) => l.id)).toEqual(byStage.slice(10).map((l) => l.id));
    const desc = await t.http
      .get(`/api/leads?branchId=${branch}&pageSize=10&sort=daysInStage&order=desc`)
      .set('Authorization', `Bearer ${mgr}`);
    expect(desc.body.items.map((l: { id: string }) => l.id)).toEqual(
      [...byStage]
        .reverse()
        .slice(0, 10)
        .map((l) => l.id),
    );
  });

  it('a salesperson’s pipeline holds only their own leads', async () => {
    await createLead('other');
    const res = await as('seller').get(`/api/leads?pageSize=100`);
    expect(res.body.items.length).toBeGreaterThan(0);
    expect(res.body.items.every((l: { salespersonId: string }) => l.salespersonId === seller.id)).toBe(true);
  });

  it('a manager transfers a lead; both managers see its history, only the new branch may change it', async () => {
    const { lead } = await createLead();
    const res = await as('manager').post(`/api/leads/${lead.id}/transfer`, {
      branchId: south,
      note: 'Closer to their office',
    });
    expect(res.status).toBe(200);
    expect(res.body.branchId).toBe(south);
    expect(res.body.salespersonId).toBeNull();
    expect(res.body.transfers).toHaveLength(1);
    const southView = await as('southManager').get(`/api/leads/${lead.id}`);
    expect(southView.status).toBe(200);
    expect(southView.body.readOnly).toBe(false);
    expect(southView.body.activities.some((a: { kind: string }) => a.kind === 'transfer')).toBe(true);
    const northView = await as('manager').get(`/api/leads/${lead.id}`);
    expect(northView.status).toBe(200);
    expect(northView.body.readOnly).toBe(true);
    expect((await as('manager').patch(`/api/leads/${lead.id}`, { notes: 'still mine?' })).status).toBe(403);
    expect((await as('seller').get(`/api/leads/${lead.id}`)).status).toBe(404);
    const out = await as('manager').get('/api/leads/transferred-out');
    expect(out.body.map((l: { id: string }) => l.id)).toContain(lead.id);
    expect((await as('seller').post(`/api/leads/${lead.id}/transfer`, { branchId: north })).status).toBe(404);
  });

  it('logs calls and notes on the timeline; a salesperson cannot reassign', async () => {
    const { lead } = await createLead();
    const res = await as('seller').post(`/api/leads/${lead.id}/activities`, {
      kind: 'call',
      body: 'Left a voicemail',
    });
    expect(res.status).toBe(201);
    expect(res.body.activities[0]).toMatchObject({ kind: 'call', body: 'Left a voicemail' });
    const reassign = await as('seller').patch(`/api/leads/${lead.id}`, { salespersonId: other.id });
    expect(reassign.status).toBe(403);
    const mgr = await as('manager').patch(`/api/leads/${lead.id}`, { salespersonId: other.id });
    expect(mgr.status).toBe(200);
    expect(mgr.body.salespersonName).toBe('Otis Other');
  });

  it('keeps lead_stage_totals equal to the leads themselves after every kind of change', async () => {
    const { lead } = await createLead();
    await t.db('leads').where({ id: lead.id }).update({ value: '123.45', stage: 'inspected' });
    await t.db('leads').where({ id: lead.id }).update({ salesperson_id: other.id });
    await t.db('leads').where({ id: lead.id }).update({ branch_id: south, salesperson_id: null });
    const actual = await t.db.raw(`
      select branch_id, coalesce(salesperson_id, '00000000-0000-0000-0000-000000000000') as sp, stage,
             count(*)::bigint as n, sum(value) as v
      from leads group by 1, 2, 3 order by 1, 2, 3`);
    const kept = await t.db.raw(`
      select branch_id, salesperson_key as sp, stage, lead_count as n, value_total as v
      from lead_stage_totals where lead_count <> 0 or value_total <> 0 order by 1, 2, 3`);
    expect(kept.rows).toEqual(actual.rows);
    expect(actual.rows.length).toBeGreaterThan(3);
  });

  it('refuses a transfer once a proposal has gone out, and moves inspections with the lead before that', async () => {
    const { lead } = await createLead();
    await t.db('inspections').insert({ lead_id: lead.id, branch_id: north, scheduled_at: new Date() });
    const moved = await as('manager').post(`/api/leads/${lead.id}/transfer`, { branchId: south });
    expect(moved.status).toBe(200);
    const insp = await t.db('inspections').where({ lead_id: lead.id }).first();
    expect(insp.branch_id).toBe(south);

    const { lead: late } = await createLead();
    await t.db('leads').where({ id: late.id }).update({ stage: 'proposal_sent' });
    const refused = await as('manager').post(`/api/leads/${late.id}/transfer`, { branchId: south });
    expect(refused.status).toBe(409);
    expect(refused.body.code).toBe('LEAD.TRANSFER_TOO_LATE');
  });
});
