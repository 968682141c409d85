import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '@loambook/common';
import { ProposalsService } from '../src/proposals/proposals.service';
import {
  makeBranch,
  makeUser,
  startTestApp,
  tokenFor,
  type TestApp,
  type TestUser,
} from './support/test-app';
import { makeInspection, makeItem, makeLead, setBranchSettings } from './support/proposal-fixtures';

describe('proposals, pricing and the approval queue', () => {
  let t: TestApp;
  let north: string;
  let coast: string;
  let south: string;
  const people: Record<string, TestUser> = {};
  const tokens: Record<string, string> = {};
  // North's price book (invented prices): polyurethane per lb, point setup, mobilisation, and a thin item.
  const items: Record<string, string> = {};

  const as = (who: string) => {
    const auth = { Authorization: `Bearer ${tokens[who]}` };
    return {
      get: (url: string) => t.http.get(url).set(auth),
      post: (url: string, body: object = {}) => t.http.post(url).set(auth).send(body),
      put: (url: string, body: object) => t.http.put(url).set(auth).send(body),
      patch: (url: string, body: object) => t.http.patch(url).set(auth).send(body),
    };
  };

  /** The hand-checked option: 12 injection points × 20 lb (common practice, REFERENCE-VALUES.md) = 240 lb. */
  const injectionOption = (discount = { kind: 'percent', value: '5' }, ids = items) => ({
    title: 'Stabilise the east wall',
    description: '12 injection points along 55 ft of wall',
    discount,
    lines: [
      { priceBookItemId: ids.lb, quantity: '240', quantitySource: 'injection-plan' },
      { priceBookItemId: ids.point, quantity: '12', quantitySource: 'injection-plan' },
      { priceBookItemId: ids.mobilise, quantity: '1' },
    ],
  });

  const newLead = (salesperson = 'northSales', branch?: string) =>
    makeLead(t.db, branch ?? north, people[salesperson]!.id);

  const draft = async (who: string, leadId: string, options: object[]) => {
    const res = await as(who).post(`/api/leads/${leadId}/proposals`, { options });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body;
  };

  beforeAll(async () => {
    t = await startTestApp();
    north = await makeBranch(t.db, { name: 'North' });
    coast = await makeBranch(t.db, { name: 'Coast' });
    south = await makeBranch(t.db, { name: 'South' });
    // North: floor 35%, salesperson 10%, manager 20%, sales tax 7% charged on the invoice.
    await setBranchSettings(t.db, north, {
      marginFloorPct: '35',
      salespersonPct: '10',
      managerPct: '20',
      salesTaxTreatment: 'invoice',
      salesTaxRatePct: '7',
    });
    // Coast: the contractor pays 6% on the cost of its materials (Fla. Admin. Code 12A-1.051, memory).
    await setBranchSettings(t.db, coast, { salesTaxTreatment: 'materials_cost', salesTaxRatePct: '6' });
    const roster: [string, Role, string[]][] = [
      ['owner', 'owner', []],
      ['bookkeeper', 'bookkeeper', []],
      ['northManager', 'branch_manager', [north]],
      ['northSales', 'salesperson', [north]],
      ['northSales2', 'salesperson', [north]],
      ['coastSales', 'salesperson', [coast]],
      ['southManager', 'branch_manager', [south]],
      ['southSales', 'salesperson', [south]],
    ];
    for (const [key, role, branches] of roster) {
      people[key] = await makeUser(t.db, role, branches, { name: key });
      tokens[key] = await tokenFor(t, people[key]!);
    }
    items.lb = await makeItem(t.db, north, {
      code: 'PU-LB',
      description: 'Polyurethane material, per lb',
      unit: 'lb',
      unitCost: '5.20',
      unitPrice: '11.50',
    });
    items.point = await makeItem(t.db, north, {
      code: 'PU-POINT',
      unit: 'point',
      unitCost: '18',
      unitPrice: '45',
    });
    items.mobilise = await makeItem(t.db, north, {
      code: 'MOBILISE',
      category: 'mobilisation',
      unit: 'lump_sum',
      unitCost: '300',
      unitPrice: '600',
    });
    // Cost 80, price 100: a 20% margin, below North's 35% floor.
    items.thin = await makeItem(t.db, north, {
      code: 'THIN',
      category: 'piers',
      unitCost: '80',
      unitPrice: '100',
    });
  });
  afterAll(() => t.close());

  describe('pricing', () => {
    it('prices the hand-checked option, copies the items into the lines, and notes it on the timeline', async () => {
      const lead = await newLead();
      const inspection = await makeInspection(t.db, lead, north);
      const res = await as('northSales').post(`/api/leads/${lead}/proposals`, {
        inspectionId: inspection,
        notes: 'Homeowner prefers work in the mornings.',
        options: [injectionOption()],
      });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const p = res.body;
      expect(p).toMatchObject({
        leadId: lead,
        branchId: north,
        inspectionId: inspection,
        version: 1,
        previousId: null,
        status: 'draft',
        salespersonId: people.northSales!.id,
        tax: { treatment: 'invoice', ratePct: '7' },
        editable: true,
        readOnly: false,
        canSubmit: true,
      });
      // By hand: cost 240×5.20 + 12×18 + 300 = 1248 + 216 + 300 = 1764.00; list 240×11.50 + 12×45 + 600
      // = 2760 + 540 + 600 = 3900.00; 5% off = 195.00; net 3705.00; tax 7% of 3705 = 259.35 → 3964.35;
      // profit 3705 − 1764 = 1941.00; margin 1941/3705 = 52.39%; markup 1941/1764 = 110.03%.
      expect(p.options[0].totals).toEqual({
        costTotal: '1764.00',
        listTotal: '3900.00',
        discountTotal: '195.00',
        discountPct: '5.00',
        netTotal: '3705.00',
        materialsCostTotal: '1464.00',
        taxTotal: '259.35',
        taxBorneBy: 'homeowner',
        customerTotal: '3964.35',
        grossProfit: '1941.00',
        grossMarginPct: '52.39',
        markupPct: '110.03',
      });
      expect(p.options[0].approval).toEqual({ needsApproval: false, approver: 'none', reasons: [] });
      // Branch default 8% of net (a placeholder rate until commission plans exist): 3705 × 0.08 = 296.40.
      expect(p.options[0].commission).toEqual({ ratePct: '8', basis: 'net', amount: '296.40' });
      expect(p.options[0].lines[0]).toMatchObject({
        position: 1,
        priceBookItemId: items.lb,
        code: 'PU-LB',
        description: 'Polyurethane material, per lb',
        category: 'soil_stabilisation',
        unit: 'lb',
        quantity: '240',
        unitCost: '5.20',
        unitPrice: '11.50',
        quantitySource: 'injection-plan',
        lineCost: '1248.00',
        lineList: '2760.00',
      });
      expect(p.versions).toEqual([
        { id: p.id, version: 1, status: 'draft', createdAt: p.createdAt, sentAt: null },
      ]);
      const stored = await t.db('proposal_options').where({ proposal_id: p.id }).first();
      expect([stored.net_total, stored.customer_total, stored.gross_margin_pct]).toEqual([
        '3705.00',
        '3964.35',
        '52.39',
      ]);
      const activity = await t.db('lead_activities').where({ lead_id: lead, kind: 'proposal' }).first();
      expect(activity.data).toMatchObject({ event: 'created', proposalId: p.id, version: 1 });

      const list = await as('northSales').get(`/api/leads/${lead}/proposals`);
      expect(list.status).toBe(200);
      expect(list.body).toEqual([
        expect.objectContaining({
          id: p.id,
          version: 1,
          status: 'draft',
          options: [
            {
              id: p.options[0].id,
              position: 1,
              title: 'Stabilise the east wall',
              netTotal: '3705.00',
              customerTotal: '3964.35',
              grossMarginPct: '52.39',
            },
          ],
        }),
      ]);
    });

    it('lets the contractor bear tax on materials in a materials-cost branch', async () => {
      const ids = {
        lb: await makeItem(t.db, coast, { unit: 'lb', unitCost: '5.20', unitPrice: '11.50' }),
        point: await makeItem(t.db, coast, { unit: 'point', unitCost: '18', unitPrice: '45' }),
        mobilise: await makeItem(t.db, coast, {
          category: 'mobilisation',
          unit: 'lump_sum',
          unitCost: '300',
          unitPrice: '600',
        }),
      };
      const p = await draft('coastSales', await newLead('coastSales', coast), [
        injectionOption(undefined, ids),
      ]);
      // By hand: materials (the two soil-stabilisation lines) 1248 + 216 = 1464.00; 6% = 87.84, borne by the
      // contractor; the homeowner pays the net 3705.00; profit 3705 − 1764 − 87.84 = 1853.16 → 50.02%.
      expect(p.tax).toEqual({ treatment: 'materials_cost', ratePct: '6' });
      expect(p.options[0].totals).toMatchObject({
        taxTotal: '87.84',
        taxBorneBy: 'contractor',
        customerTotal: '3705.00',
        grossProfit: '1853.16',
        grossMarginPct: '50.02',
      });
    });

    it('keeps a proposal as it was when the price book changes', async () => {
      const lb = await makeItem(t.db, north, { unit: 'lb', unitCost: '5.20', unitPrice: '11.50' });
      const p = await draft('northSales', await newLead(), [injectionOption(undefined, { ...items, lb })]);
      const patch = await as('northManager').patch(`/api/price-book/${lb}`, {
        unitPrice: '13.00',
        unitCost: '6.00',
        description: 'Renamed',
      });
      expect(patch.status).toBe(200);
      const after = (await as('northSales').get(`/api/proposals/${p.id}`)).body;
      expect(after.options[0].totals).toEqual(p.options[0].totals);
      expect(after.options[0].lines[0]).toMatchObject({ unitPrice: '11.50', unitCost: '5.20' });
      expect(after.options[0].lines[0].description).not.toBe('Renamed');

      // An edit keeps the price quoted for an item already on the proposal…
      const kept = await as('northSales').put(`/api/proposals/${p.id}`, {
        options: [injectionOption(undefined, { ...items, lb })],
      });
      expect(kept.status).toBe(200);
      expect(kept.body.options[0].totals.listTotal).toBe('3900.00');
      // …unless asked to take today's prices: 240 × 13.00 = 3120 + 540 + 600 = 4260.00.
      const refreshed = await as('northSales').put(`/api/proposals/${p.id}`, {
        refreshPrices: true,
        options: [injectionOption(undefined, { ...items, lb })],
      });
      expect(refreshed.body.options[0].totals.listTotal).toBe('4260.00');
      expect(refreshed.body.options[0].lines[0].description).toBe('Renamed');
    });

    it.each([
      [
        'an item of another branch',
        async () => ({ lb: await makeItem(t.db, south, { unitCost: '1', unitPrice: '2' }) }),
      ],
      [
        'a deactivated item',
        async () => ({ lb: await makeItem(t.db, north, { unitCost: '1', unitPrice: '2', active: false }) }),
      ],
    ])('refuses %s (400, by field)', async (_label, make) => {
      const res = await as('northSales').post(`/api/leads/${await newLead()}/proposals`, {
        options: [injectionOption(undefined, { ...items, ...(await make()) })],
      });
      expect(res.status).toBe(400);
      expect(res.body.code).toBe('VALIDATION.FAILED');
      expect(res.body.details.map((d: { field: string }) => d.field)).toEqual([
        'options.0.lines.0.priceBookItemId',
      ]);
    });

    it('refuses a discount larger than the list price (422) and malformed figures (400)', async () => {
      const lead = await newLead();
      const tooMuch = await as('northSales').post(`/api/leads/${lead}/proposals`, {
        options: [injectionOption({ kind: 'amount', value: '3900.01' })],
      });
      expect(tooMuch.status).toBe(422);
      expect(tooMuch.body.code).toBe('PROPOSAL.DISCOUNT_EXCEEDS_LIST');
      expect(tooMuch.body.details[0].field).toBe('options.0.discount.value');
      const overHundred = await as('northSales').post(`/api/leads/${lead}/proposals`, {
        options: [injectionOption({ kind: 'percent', value: '101' })],
      });
      expect(overHundred.status).toBe(422);
      const numeric = await as('northSales').post(`/api/leads/${lead}/proposals`, {
        options: [{ ...injectionOption(), lines: [{ priceBookItemId: items.lb, quantity: 240 }] }],
      });
      expect(numeric.status).toBe(400);
      expect(numeric.body.details.map((d: { field: string }) => d.field)).toContain(
        'options.0.lines.0.quantity',
      );
      const zero = await as('northSales').post(`/api/leads/${lead}/proposals`, {
        options: [{ ...injectionOption(), lines: [{ priceBookItemId: items.lb, quantity: '0.000' }] }],
      });
      expect(zero.status).toBe(400);
      const empty = await as('northSales').post(`/api/leads/${lead}/proposals`, { options: [] });
      expect(empty.status).toBe(400);
      const otherInspection = await makeInspection(t.db, await newLead(), north);
      const wrong = await as('northSales').post(`/api/leads/${lead}/proposals`, {
        inspectionId: otherInspection,
        options: [injectionOption()],
      });
      expect(wrong.status).toBe(400);
      expect(wrong.body.details).toEqual([{ field: 'inspectionId', message: expect.any(String) }]);
      expect(await t.db('proposals').where({ lead_id: lead }).first()).toBeUndefined();
    });

    it('has one line of versions per lead: a second proposal is refused while the first is open', async () => {
      const lead = await newLead();
      const p = await draft('northSales', lead, [injectionOption()]);
      const again = await as('northSales').post(`/api/leads/${lead}/proposals`, {
        options: [injectionOption()],
      });
      expect(again.status).toBe(409);
      expect(again.body).toMatchObject({ code: 'PROPOSAL.EXISTS', details: { proposalId: p.id } });
    });
  });

  describe('approval matrix over HTTP', () => {
    it('salesperson within floor and authority → approved at once, no request', async () => {
      const p = await draft('northSales', await newLead(), [
        injectionOption({ kind: 'percent', value: '10' }),
      ]);
      const res = await as('northSales').post(`/api/proposals/${p.id}/submit`);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.status).toBe('approved');
      expect(res.body.approvalRequest).toBeNull();
      expect(await t.db('approval_requests').where({ proposal_id: p.id }).first()).toBeUndefined();
      const again = await as('northSales').post(`/api/proposals/${p.id}/submit`);
      expect(again.status).toBe(409);
      expect(again.body.code).toBe('PROPOSAL.NOT_DRAFT');
    });

    it('salesperson beyond their authority → pending, manager e-mailed, manager approves, salesperson e-mailed', async () => {
      const lead = await newLead();
      const p = await draft('northSales', lead, [injectionOption({ kind: 'percent', value: '15' })]);
      expect(p.options[0].approval).toEqual({
        needsApproval: true,
        approver: 'branch_manager',
        reasons: ['DISCOUNT_BEYOND_AUTHORITY'],
      });
      const submitted = await as('northSales').post(`/api/proposals/${p.id}/submit`);
      expect(submitted.body.status).toBe('pending_approval');
      expect(submitted.body.approvalRequest).toMatchObject({
        status: 'pending',
        approver: 'branch_manager',
        reasons: ['DISCOUNT_BEYOND_AUTHORITY'],
        requestedBy: { id: people.northSales!.id, name: 'northSales' },
        canDecide: false,
      });
      const mail = await t.mail.lastTo(people.northManager!.email);
      expect(mail.subject).toContain('Approval needed');
      // 15% of 3900 = 585.00 off; net 3315.00
      expect(mail.text).toContain('$3,315.00');

      // The queue: the manager sees it with the figures; the other branch's manager does not.
      const queue = await as('northManager').get('/api/approvals?status=pending');
      expect(queue.status).toBe(200);
      const entry = queue.body.find((r: { proposalId: string }) => r.proposalId === p.id);
      expect(entry).toMatchObject({
        canDecide: true,
        approver: 'branch_manager',
        branchId: north,
        branchName: 'North',
        leadId: lead,
        proposalVersion: 1,
        figures: {
          submitterRole: 'salesperson',
          marginFloorPct: '35',
          discountAuthority: { salesperson: '10', branch_manager: '20' },
          options: [
            expect.objectContaining({
              costTotal: '1764.00',
              listTotal: '3900.00',
              discountTotal: '585.00',
              discountPct: '15.00',
              netTotal: '3315.00',
              grossMarginPct: '46.79', // (3315 − 1764) / 3315 = 46.787…%
            }),
          ],
        },
      });
      const southQueue = await as('southManager').get('/api/approvals');
      expect(southQueue.body.map((r: { id: string }) => r.id)).not.toContain(entry.id);
      expect((await as('southManager').post(`/api/approvals/${entry.id}/approve`)).status).toBe(404);
      expect((await as('northSales').get('/api/approvals')).status).toBe(403);
      expect((await as('northSales').post(`/api/approvals/${entry.id}/approve`)).status).toBe(403);
      const edit = await as('northSales').put(`/api/proposals/${p.id}`, { options: [injectionOption()] });
      expect(edit.status).toBe(409);
      expect(edit.body.code).toBe('PROPOSAL.AWAITING_APPROVAL');

      const approved = await as('northManager').post(`/api/approvals/${entry.id}/approve`, {
        note: 'Fine this once.',
      });
      expect(approved.status, JSON.stringify(approved.body)).toBe(200);
      expect(approved.body).toMatchObject({
        status: 'approved',
        decidedBy: { id: people.northManager!.id, name: 'northManager' },
        decisionNote: 'Fine this once.',
        canDecide: false,
      });
      expect((await as('northSales').get(`/api/proposals/${p.id}`)).body.status).toBe('approved');
      const told = await t.mail.lastTo(people.northSales!.email);
      expect(told.subject).toContain('Proposal approved');
      expect(told.text).toContain('Fine this once.');
      const activity = await t
        .db('lead_activities')
        .where({ lead_id: lead, kind: 'approval' })
        .orderBy('created_at');
      expect(activity.map((a: { data: { event: string } }) => a.data.event)).toEqual([
        'requested',
        'approved',
      ]);

      const twice = await as('northManager').post(`/api/approvals/${entry.id}/approve`);
      expect(twice.status).toBe(409);
      expect(twice.body.code).toBe('APPROVAL.ALREADY_DECIDED');
      const decided = await as('northManager').get('/api/approvals?status=approved');
      expect(decided.body.map((r: { id: string }) => r.id)).toContain(entry.id);
    });

    it('salesperson below the margin floor → the branch manager approves', async () => {
      const p = await draft('northSales', await newLead(), [
        {
          title: 'Thin',
          discount: { kind: 'none', value: '0' },
          lines: [{ priceBookItemId: items.thin, quantity: '2' }],
        },
      ]);
      const res = await as('northSales').post(`/api/proposals/${p.id}/submit`);
      expect(res.body.approvalRequest).toMatchObject({
        approver: 'branch_manager',
        reasons: ['MARGIN_BELOW_FLOOR'],
      });
    });

    it('beyond the manager’s authority → the manager is refused (403), the owner approves', async () => {
      const p = await draft('northSales', await newLead(), [
        injectionOption({ kind: 'percent', value: '25' }),
      ]);
      const submitted = await as('northSales').post(`/api/proposals/${p.id}/submit`);
      const requestId = submitted.body.approvalRequest.id;
      expect(submitted.body.approvalRequest.approver).toBe('owner');
      expect((await t.mail.lastTo(people.owner!.email)).subject).toContain('Approval needed');

      const managerQueue = await as('northManager').get('/api/approvals');
      expect(managerQueue.body.find((r: { id: string }) => r.id === requestId).canDecide).toBe(false);
      const refused = await as('northManager').post(`/api/approvals/${requestId}/approve`);
      expect(refused.status).toBe(403);
      expect(refused.body.code).toBe('APPROVAL.BEYOND_AUTHORITY');
      expect(
        (await as('northManager').post(`/api/approvals/${requestId}/refuse`, { note: 'No' })).status,
      ).toBe(403);

      const ownerQueue = await as('owner').get('/api/approvals');
      expect(ownerQueue.body.find((r: { id: string }) => r.id === requestId).canDecide).toBe(true);
      const ok = await as('owner').post(`/api/approvals/${requestId}/approve`);
      expect(ok.status).toBe(200);
      expect((await as('northSales').get(`/api/proposals/${p.id}`)).body.status).toBe('approved');
    });

    it('a manager’s own proposal below the floor goes to the owner; within their authority it needs nobody', async () => {
      const own = await draft('northManager', await newLead(), [
        {
          title: 'Thin',
          discount: { kind: 'none', value: '0' },
          lines: [{ priceBookItemId: items.thin, quantity: '1' }],
        },
      ]);
      const res = await as('northManager').post(`/api/proposals/${own.id}/submit`);
      expect(res.body.approvalRequest).toMatchObject({ approver: 'owner', reasons: ['MARGIN_BELOW_FLOOR'] });
      const within = await draft('northManager', await newLead(), [
        injectionOption({ kind: 'percent', value: '15' }),
      ]);
      expect((await as('northManager').post(`/api/proposals/${within.id}/submit`)).body.status).toBe(
        'approved',
      );
      const ownerOwn = await draft('owner', await newLead(), [
        injectionOption({ kind: 'percent', value: '40' }),
      ]);
      expect((await as('owner').post(`/api/proposals/${ownerOwn.id}/submit`)).body.status).toBe('approved');
    });

    it('refusing needs a note; the salesperson reads it, and can edit the proposal again', async () => {
      const p = await draft('northSales', await newLead(), [
        injectionOption({ kind: 'percent', value: '12' }),
      ]);
      const requestId = (await as('northSales').post(`/api/proposals/${p.id}/submit`)).body.approvalRequest
        .id;
      for (const body of [{}, { note: '   ' }]) {
        const res = await as('northManager').post(`/api/approvals/${requestId}/refuse`, body);
        expect(res.status).toBe(400);
        expect(res.body.details.map((d: { field: string }) => d.field)).toContain('note');
      }
      const res = await as('northManager').post(`/api/approvals/${requestId}/refuse`, {
        note: 'Keep it within 10%.',
      });
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ status: 'refused', decisionNote: 'Keep it within 10%.' });
      const told = await t.mail.lastTo(people.northSales!.email);
      expect(told.subject).toContain('Proposal refused');
      expect(told.text).toContain('Keep it within 10%.');
      const after = (await as('northSales').get(`/api/proposals/${p.id}`)).body;
      expect(after).toMatchObject({ status: 'refused', editable: true, canSubmit: false });
      const edited = await as('northSales').put(`/api/proposals/${p.id}`, {
        options: [injectionOption({ kind: 'percent', value: '10' })],
      });
      expect(edited.body).toMatchObject({ id: p.id, version: 1, status: 'draft', canSubmit: true });
      expect((await as('northSales').post(`/api/proposals/${p.id}/submit`)).body.status).toBe('approved');
    });
  });

  describe('versions', () => {
    it('sends only an approved version; editing a sent one makes version 2 and leaves version 1 read-only', async () => {
      const lead = await newLead();
      const v1 = await draft('northSales', lead, [injectionOption()]);
      const service = t.app.get(ProposalsService);
      await expect(t.db.transaction((trx) => service.markSent(v1.id, trx))).rejects.toMatchObject({
        code: 'PROPOSAL.NOT_APPROVED',
      });
      await as('northSales').post(`/api/proposals/${v1.id}/submit`);
      const sent = await t.db.transaction((trx) => service.markSent(v1.id, trx));
      expect(sent.status).toBe('sent');
      expect(sent.sentAt).not.toBeNull();
      expect((await as('northSales').get(`/api/proposals/${v1.id}`)).body).toMatchObject({
        status: 'sent',
        editable: true,
        readOnly: false,
      });

      const res = await as('northSales').put(`/api/proposals/${v1.id}`, {
        notes: 'Second visit: add the north corner.',
        options: [injectionOption(), { ...injectionOption(), title: 'East wall and north corner' }],
      });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      const v2 = res.body;
      expect(v2).toMatchObject({
        version: 2,
        previousId: v1.id,
        status: 'draft',
        notes: 'Second visit: add the north corner.',
      });
      expect(v2.id).not.toBe(v1.id);
      expect(v2.options).toHaveLength(2);
      expect(v2.versions.map((v: { version: number; status: string }) => [v.version, v.status])).toEqual([
        [2, 'draft'],
        [1, 'superseded'],
      ]);

      const old = (await as('northSales').get(`/api/proposals/${v1.id}`)).body;
      expect(old).toMatchObject({ status: 'superseded', readOnly: true, editable: false, canSubmit: false });
      expect(old.options).toHaveLength(1);
      expect(old.options[0].totals).toEqual(v1.options[0].totals);
      const refused = await as('northSales').put(`/api/proposals/${v1.id}`, { options: [injectionOption()] });
      expect(refused.status).toBe(409);
      expect(refused.body.code).toBe('PROPOSAL.READ_ONLY');
      expect((await as('northSales').post(`/api/proposals/${v1.id}/submit`)).status).toBe(409);

      // The database backs it: the old version's options cannot change.
      await expect(
        t.db('proposal_options').where({ proposal_id: v1.id }).update({ title: 'Rewritten' }),
      ).rejects.toThrow(/cannot change/);
      const events = await t
        .db('lead_activities')
        .where({ lead_id: lead, kind: 'proposal' })
        .orderBy('created_at');
      expect(events.map((a: { data: { event: string } }) => a.data.event)).toEqual([
        'created',
        'new_version',
      ]);
      const list = (await as('northSales').get(`/api/leads/${lead}/proposals`)).body;
      expect(list.map((p: { version: number }) => p.version)).toEqual([2, 1]);
    });
  });

  describe('who sees what', () => {
    let lead: string;
    let proposal: { id: string };

    beforeAll(async () => {
      lead = await newLead();
      proposal = await draft('northSales', lead, [injectionOption()]);
    });

    it.each([
      ['northSales', 200],
      ['northManager', 200],
      ['owner', 200],
      ['bookkeeper', 200],
      ['northSales2', 404], // another salesperson's lead in the same branch
      ['southManager', 404],
      ['southSales', 404],
    ])('GET a North proposal as %s → %i', async (who, status) => {
      expect((await as(who).get(`/api/proposals/${proposal.id}`)).status).toBe(status);
      expect((await as(who).get(`/api/leads/${lead}/proposals`)).status).toBe(status);
    });

    it('lets the bookkeeper read but not edit; shows who may edit', async () => {
      const view = (await as('bookkeeper').get(`/api/proposals/${proposal.id}`)).body;
      expect(view).toMatchObject({ editable: false, canSubmit: false });
      expect(
        (await as('bookkeeper').put(`/api/proposals/${proposal.id}`, { options: [injectionOption()] }))
          .status,
      ).toBe(403);
      expect((await as('bookkeeper').post(`/api/proposals/${proposal.id}/submit`)).status).toBe(403);
    });

    it('answers 404 to another branch editing, submitting or proposing on the lead', async () => {
      expect(
        (await as('southManager').put(`/api/proposals/${proposal.id}`, { options: [injectionOption()] }))
          .status,
      ).toBe(404);
      expect((await as('southManager').post(`/api/proposals/${proposal.id}/submit`)).status).toBe(404);
      const other = await newLead();
      expect(
        (await as('southSales').post(`/api/leads/${other}/proposals`, { options: [injectionOption()] }))
          .status,
      ).toBe(404);
      expect(
        (await as('northSales2').post(`/api/leads/${other}/proposals`, { options: [injectionOption()] }))
          .status,
      ).toBe(404);
    });
  });
});
