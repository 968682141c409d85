import { createHash } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import type { Response } from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { cancellationDeadline, type Role } from '@loambook/common';
import { Clock } from '../src/signing/clock';
import { StorageService } from '../src/storage/storage.service';
import {
  makeBranch,
  makeUser,
  PUBLIC_URL,
  startTestApp,
  tokenFor,
  type TestApp,
  type TestUser,
} from './support/test-app';
import { makeItem, setBranchSettings } from './support/proposal-fixtures';
import { makeLead } from './support/selling-fixtures';
import {
  blankSignature,
  inkSignature,
  jpegAsPng,
  makeCompletedInspection,
  whiteSignature,
} from './support/signing-fixtures';

const BUCKET = 'loambook-signing-test';
// 22:30 EDT on Thursday 2026-07-02 (02:30 UTC on Friday 07-03): a contract signed now is dated 2 July in
// the branch's zone, not 3 July as in UTC. Last day to cancel: Wed 2026-07-08 (REFERENCE-VALUES.md worked
// example: Fri 07-03 observed Independence Day, Sat 07-04 the holiday, Sun skipped; 16 CFR 429.1(a)).
const TEST_NOW = '2026-07-03T02:30:00Z';
const SIGNED_ON = '2026-07-02';
const LAST_DAY = '2026-07-08';
const ALL_NOTICES = ['FTC_429', 'FL_713_015', 'FL_489_1425'];

/** Collects a binary response body as a Buffer, whatever its content type. */
function binary(res: Response, done: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => done(null, Buffer.concat(chunks)));
}

/** Pages of a PDF: page objects are dictionaries, never inside compressed streams. */
const pageCount = (pdf: Buffer) => (pdf.toString('latin1').match(/\/Type \/Page\b/g) ?? []).length;

describe('sending proposals and signing contracts', () => {
  let t: TestApp;
  let s3: S3rver;
  let s3Dir: string;
  let gulf: string;
  let other: string;
  const people: Record<string, TestUser> = {};
  const tokens: Record<string, string> = {};
  const items: Record<string, string> = {};
  let ink: string;

  const as = (who: string) => {
    const auth = { Authorization: `Bearer ${tokens[who]}` };
    return {
      get: (url: string) => t.http.get(url).set(auth),
      getPdf: (url: string) => t.http.get(url).set(auth).buffer(true).parse(binary),
      post: (url: string, body: object = {}) => t.http.post(url).set(auth).send(body),
    };
  };

  /** Three options, by hand (North Gulf charges 7% sales tax on the invoice):
   *  1. 240 lb × 11.50 + 12 points × 45 + mobilisation 600 = 3900.00; tax 273.00 → 4173.00
   *  2. 8 piers × 1500 + mobilisation 600 = 12600.00; 5% off = 630.00 → net 11970.00; tax 837.90 → 12807.90
   *  3. 10 points × 45 + mobilisation 600 = 1050.00; tax 73.50 → 1123.50 (not over $2,500: federal notice only) */
  const OPTIONS = () => [
    {
      title: 'Stabilise the east wall',
      discount: { kind: 'none', value: '0' },
      lines: [
        { priceBookItemId: items.lb, quantity: '240', quantitySource: 'injection-plan' },
        { priceBookItemId: items.point, quantity: '12', quantitySource: 'injection-plan' },
        { priceBookItemId: items.mobilise, quantity: '1' },
      ],
    },
    {
      title: 'Steel push piers along the east wall',
      description: '8 piers to load-bearing strata',
      discount: { kind: 'percent', value: '5' },
      lines: [
        { priceBookItemId: items.pier, quantity: '8', quantitySource: 'pier-plan' },
        { priceBookItemId: items.mobilise, quantity: '1' },
      ],
    },
    {
      title: 'Void fill at the NE corner',
      discount: { kind: 'none', value: '0' },
      lines: [
        { priceBookItemId: items.point, quantity: '10' },
        { priceBookItemId: items.mobilise, quantity: '1' },
      ],
    },
  ];

  interface Made {
    leadId: string;
    proposalId: string;
    optionIds: string[];
    email: string;
    homeowner: string;
  }

  /** A lead at "inspected" with a completed inspection and an approved proposal of three options. */
  const approvedProposal = async (seller = 'seller', branch = gulf): Promise<Made> => {
    const homeowner = `Dana Example ${Math.random().toString(36).slice(2, 7)}`;
    const leadId = await makeLead(t.db, {
      branchId: branch,
      salespersonId: people[seller]!.id,
      stage: 'inspected',
      homeownerName: homeowner,
    });
    const inspectionId = await makeCompletedInspection(t.db, leadId, branch);
    const created = await as(seller).post(`/api/leads/${leadId}/proposals`, {
      inspectionId,
      options: OPTIONS(),
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const submitted = await as(seller).post(`/api/proposals/${created.body.id}/submit`);
    expect(submitted.body.status, JSON.stringify(submitted.body)).toBe('approved');
    const { email } = await t.db('leads').where({ id: leadId }).first('email');
    return {
      leadId,
      proposalId: created.body.id,
      optionIds: created.body.options.map((o: { id: string }) => o.id),
      email,
      homeowner,
    };
  };

  /** Sends the proposal and returns the token from the e-mail. */
  const sendIt = async (m: Made, body: object = {}, who = 'seller') => {
    const before = t.mail.inbox.length;
    const res = await as(who).post(`/api/proposals/${m.proposalId}/send`, body);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // The e-mail is sent before the answer (inside the transaction), so it is already caught.
    expect(t.mail.inbox.length).toBeGreaterThan(before);
    const mail = await t.mail.lastTo(m.email);
    const token = /\/sign\/([A-Za-z0-9_-]+)/.exec(mail.text)![1]!;
    return { res, mail, token };
  };

  const signBody = async (m: Made, option = 1, overrides: object = {}) => ({
    optionId: m.optionIds[option],
    signerName: m.homeowner,
    signaturePng: ink,
    acknowledgedNotices: ALL_NOTICES,
    ...overrides,
  });

  const clock = () => t.app.get(Clock);
  const leadRow = (id: string) => t.db('leads').where({ id }).first('stage', 'value');

  beforeAll(async () => {
    s3Dir = await mkdtemp(path.join(tmpdir(), 'loambook-s3-'));
    s3 = new S3rver({
      port: 0,
      address: '127.0.0.1',
      silent: true,
      directory: s3Dir,
      configureBuckets: [{ name: BUCKET }],
    });
    const { port } = await s3.run();
    t = await startTestApp({
      S3_ENDPOINT: `http://127.0.0.1:${port}`,
      S3_BUCKET: BUCKET,
      NODE_ENV: 'test',
      TEST_NOW,
    });
    gulf = await makeBranch(t.db, { name: 'North Gulf', timezone: 'America/New_York', state: 'FL' });
    other = await makeBranch(t.db, { name: 'Panhandle', timezone: 'America/Chicago', state: 'FL' });
    await t.db('branches').where({ id: gulf }).update({ phone: '555-0142' });
    await setBranchSettings(t.db, gulf, {
      marginFloorPct: '35',
      salespersonPct: '10',
      managerPct: '20',
      salesTaxTreatment: 'invoice',
      salesTaxRatePct: '7',
    });
    const roster: [string, Role, string[]][] = [
      ['owner', 'owner', []],
      ['bookkeeper', 'bookkeeper', []],
      ['manager', 'branch_manager', [gulf]],
      ['seller', 'salesperson', [gulf]],
      ['seller2', 'salesperson', [gulf]],
      ['otherManager', 'branch_manager', [other]],
    ];
    for (const [key, role, branches] of roster) {
      people[key] = await makeUser(t.db, role, branches, { name: `Test ${key}` });
      tokens[key] = await tokenFor(t, people[key]!);
    }
    items.lb = await makeItem(t.db, gulf, {
      code: 'PU-LB',
      description: 'Polyurethane, per lb',
      unit: 'lb',
      unitCost: '5.20',
      unitPrice: '11.50',
    });
    items.point = await makeItem(t.db, gulf, {
      code: 'PU-POINT',
      description: 'Injection point',
      unit: 'point',
      unitCost: '18',
      unitPrice: '45',
    });
    items.mobilise = await makeItem(t.db, gulf, {
      code: 'MOBILISE',
      description: 'Mobilisation',
      category: 'mobilisation',
      unit: 'lump_sum',
      unitCost: '300',
      unitPrice: '600',
    });
    items.pier = await makeItem(t.db, gulf, {
      code: 'PIER-STEEL',
      description: 'Steel push pier',
      category: 'piers',
      unit: 'each',
      unitCost: '600',
      unitPrice: '1500',
    });
    ink = await inkSignature();
  });
  afterEach(() => vi.restoreAllMocks());
  afterAll(async () => {
    await t?.close();
    await s3?.close();
    await rm(s3Dir, { recursive: true, force: true });
  });

  describe('sending', () => {
    it('refuses a proposal that is not approved (409) and changes nothing', async () => {
      const leadId = await makeLead(t.db, {
        branchId: gulf,
        salespersonId: people.seller!.id,
        stage: 'inspected',
      });
      const draft = await as('seller').post(`/api/leads/${leadId}/proposals`, { options: OPTIONS() });
      const res = await as('seller').post(`/api/proposals/${draft.body.id}/send`);
      expect(res.status).toBe(409);
      expect(res.body.code).toBe('PROPOSAL.NOT_APPROVED');
      expect(await t.db('signing_links').where({ proposal_id: draft.body.id })).toHaveLength(0);
      expect((await leadRow(leadId)).stage).toBe('inspected');
    });

    it('e-mails the link and the PDF, keeps only the hash, moves the lead and sets its value', async () => {
      const m = await approvedProposal();
      const { res, mail, token } = await sendIt(m, { depositAmount: '1000' });
      expect(res.body.proposal.status).toBe('sent');
      expect(res.body.signingLink).toMatchObject({ sentTo: m.email, depositAmount: '1000.00' });
      // SIGNING_LINK_TTL_DAYS default 14, from the (test) clock.
      expect(res.body.signingLink.expiresAt).toBe('2026-07-17T02:30:00.000Z');

      expect(mail.subject).toBe('Your foundation repair proposal from North Gulf');
      expect(mail.text).toContain(`${PUBLIC_URL}/sign/${token}`);
      expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
      const [pdf] = mail.attachments;
      expect(pdf!.contentType).toBe('application/pdf');
      expect(pdf!.content.subarray(0, 5).toString()).toBe('%PDF-');
      // The homeowner's name is in the document's metadata (the page text is in embedded-font glyph codes).
      expect(pdf!.content.toString('latin1')).toContain(`Proposal for ${m.homeowner}`);
      expect(pageCount(pdf!.content)).toBeGreaterThanOrEqual(3);

      const links = await t.db('signing_links').where({ proposal_id: m.proposalId });
      expect(links).toHaveLength(1);
      expect(links[0].token_hash).toBe(createHash('sha256').update(token).digest('hex'));
      expect(JSON.stringify(links)).not.toContain(token);

      const lead = await leadRow(m.leadId);
      expect(lead.stage).toBe('proposal_sent');
      expect(lead.value).toBe('12807.90'); // the highest option's total (option 2, by hand above)
      const kinds = (await t.db('lead_activities').where({ lead_id: m.leadId })).map((a) => a.kind);
      expect(kinds).toEqual(expect.arrayContaining(['email', 'proposal', 'stage_change']));
    });

    it('refuses a deposit above the lowest option, a lead without e-mail, and another branch (404)', async () => {
      const m = await approvedProposal();
      const deposit = await as('seller').post(`/api/proposals/${m.proposalId}/send`, {
        depositAmount: '1200',
      });
      expect(deposit.status).toBe(400);
      expect(deposit.body.details).toEqual([expect.objectContaining({ field: 'depositAmount' })]);
      await t.db('leads').where({ id: m.leadId }).update({ email: null });
      const noEmail = await as('seller').post(`/api/proposals/${m.proposalId}/send`);
      expect(noEmail.status).toBe(422);
      expect(noEmail.body.code).toBe('SIGNING.NO_EMAIL');
      expect((await as('otherManager').post(`/api/proposals/${m.proposalId}/send`)).status).toBe(404);
      expect((await as('bookkeeper').post(`/api/proposals/${m.proposalId}/send`)).status).toBe(403);
      // Nothing was sent: the proposal is still approved, with no link.
      expect((await t.db('proposals').where({ id: m.proposalId }).first()).status).toBe('approved');
      // An override address works without one on the lead.
      const override = await as('seller').post(`/api/proposals/${m.proposalId}/send`, {
        email: 'dana.override@example.com',
      });
      expect(override.status).toBe(200);
      expect((await t.mail.lastTo('dana.override@example.com')).attachments).toHaveLength(1);
    });

    it('sending again revokes the earlier unused link', async () => {
      const m = await approvedProposal();
      const first = await sendIt(m);
      const second = await sendIt(m);
      expect(second.res.body.revokedLinkCount).toBe(1);
      const old = await t.http.get(`/api/signing/${first.token}`);
      expect(old.status).toBe(410);
      expect(old.body.code).toBe('SIGNING.LINK_REVOKED');
      expect((await t.http.get(`/api/signing/${second.token}`)).status).toBe(200);
    });

    it('serves the proposal PDF to those who may read the proposal', async () => {
      const m = await approvedProposal();
      const res = await as('seller').getPdf(`/api/proposals/${m.proposalId}/pdf`);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('application/pdf');
      expect((res.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
      expect((await as('otherManager').get(`/api/proposals/${m.proposalId}/pdf`)).status).toBe(404);
      expect((await as('seller2').get(`/api/proposals/${m.proposalId}/pdf`)).status).toBe(404);
    });
  });

  describe('the homeowner’s page and signing', () => {
    let m: Made;
    let token: string;

    beforeAll(async () => {
      m = await approvedProposal();
      ({ token } = await sendIt(m, { depositAmount: '1000.00' }));
    });

    it('shows the branch, findings, options without costs, cautions, notices and the cancellation preview', async () => {
      const res = await t.http.get(`/api/signing/${token}`);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      const v = res.body;
      expect(v.status).toBe('awaiting_signature');
      expect(v.branch).toMatchObject({ name: 'North Gulf', phone: '555-0142', timezone: 'America/New_York' });
      expect(v.homeowner.name).toBe(m.homeowner);
      expect(v.findings.inspectedOn).toBe('2026-06-30');
      expect(v.findings.items.find((i: { key: string }) => i.key === 'interiorCracks').lines).toEqual([
        'Living room, NE corner: 0.125 in wide, diagonal',
      ]);
      // 1 in over 25 ft = 1/300 (REFERENCE-VALUES.md), with its screening caution.
      expect(v.findings.survey).toMatchObject({
        maxDifferentialIn: '1',
        worstRatio: '1/300',
        band: { code: 'beyond-1/300' },
      });
      expect(v.findings.survey.caution).toContain('not an engineering determination');
      expect(v.options.map((o: { customerTotal: string }) => o.customerTotal)).toEqual([
        '4173.00',
        '12807.90',
        '1123.50',
      ]);
      expect(v.options[1]).toMatchObject({
        listTotal: '12600.00',
        discountTotal: '630.00',
        netTotal: '11970.00',
        tax: { treatment: 'invoice', ratePct: '7', chargedToHomeowner: '837.90' },
        deposit: { amount: '1000.00', largeInitialPayment: false },
      });
      // The homeowner never sees costs or margins.
      expect(JSON.stringify(v)).not.toMatch(/unitCost|costTotal|grossProfit|grossMargin|markup/);
      expect(v.cautions.map((c: { code: string }) => c.code)).toEqual([
        'CALL_811',
        'ISOCYANATES',
        'LIFTING',
        'ENGINEER',
      ]);
      expect(v.notices.map((n: { code: string }) => n.code)).toEqual(ALL_NOTICES);
      expect(v.notices.every((n: { ackRequired: boolean }) => n.ackRequired)).toBe(true);
      expect(v.options[2].requiredNotices).toEqual(['FTC_429']); // $1,123.50 is not over $2,500 (F.S. 713.015)
      expect(v.options[2].deposit.largeInitialPayment).toBe(true); // 1000 of 1123.50 > 10% (F.S. 489.126(2)(a))
      expect(v.cancellation).toMatchObject({
        today: SIGNED_ON,
        lastDayToCancelIfSignedToday: LAST_DAY,
        lastDayWeekday: 'Wednesday',
      });
      expect(v.cancellation.statement).toContain('third business day');
      expect(v.contract).toBeNull();
      const pdf = await t.http.get(v.pdfPath).buffer(true).parse(binary);
      expect(pdf.status).toBe(200);
      expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
    });

    it('refuses a notice not acknowledged (400) and changes nothing', async () => {
      const res = await t.http
        .post(`/api/signing/${token}/sign`)
        .send(await signBody(m, 1, { acknowledgedNotices: ['FTC_429'] }));
      expect(res.status).toBe(400);
      expect(res.body.code).toBe('SIGNING.NOTICE_NOT_ACKNOWLEDGED');
      expect(res.body.details[0].field).toBe('acknowledgedNotices');
      expect(await t.db('contracts').where({ proposal_id: m.proposalId })).toHaveLength(0);
    });

    it.each([
      ['blank (transparent)', blankSignature],
      ['blank (white)', whiteSignature],
      ['a JPEG', jpegAsPng],
      ['not a data URL', async () => 'iVBORw0KGgo='],
      [
        'not a PNG at all',
        async () => `data:image/png;base64,${Buffer.from('hello, not an image').toString('base64')}`,
      ],
    ])('refuses a signature that is %s (400)', async (_label, make) => {
      const res = await t.http
        .post(`/api/signing/${token}/sign`)
        .send(await signBody(m, 1, { signaturePng: await make() }));
      expect(res.status, JSON.stringify(res.body)).toBe(400);
      expect(res.body.details[0].field).toBe('signaturePng');
      expect(await t.db('contracts').where({ proposal_id: m.proposalId })).toHaveLength(0);
    });

    it('refuses a signature over 500 KB (400)', async () => {
      const big = Buffer.alloc(510 * 1024, 7);
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]).copy(big);
      const res = await t.http
        .post(`/api/signing/${token}/sign`)
        .send(await signBody(m, 1, { signaturePng: `data:image/png;base64,${big.toString('base64')}` }));
      expect(res.status).toBe(400);
      expect(res.body.details[0].field).toBe('signaturePng');
    });

    it('signs option 2: the contract with its 16 CFR 429 deadline, the lead at "contract signed", the PDF stored and e-mailed', async () => {
      const res = await t.http
        .post(`/api/signing/${token}/sign`)
        .set('User-Agent', 'LoambookTest/1.0 (tablet)')
        .send(await signBody(m, 1));
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body.status).toBe('signed');
      const c = res.body.contract;
      expect(c).toMatchObject({
        status: 'signed',
        optionId: m.optionIds[1],
        price: '12807.90',
        tax: '837.90',
        depositAmount: '1000.00',
        signedByName: m.homeowner,
        signedOn: SIGNED_ON,
        // The same date computed by the rule itself (16 CFR 429.1(a), common/src/deadlines).
        lastDayToCancel: cancellationDeadline({ signedOn: SIGNED_ON }).lastDayToCancel,
        signedInPerson: false,
        canCancel: true,
        cancellableUntil: '2026-07-09T04:00:00.000Z', // midnight EDT at the end of 07-08
      });
      expect(c.lastDayToCancel).toBe(LAST_DAY);
      expect(c.notices.map((n: { code: string }) => n.code)).toEqual(ALL_NOTICES);

      const row = await t.db('contracts').where({ id: c.id }).first();
      expect(row.signed_ip).toMatch(/127\.0\.0\.1/);
      expect(row.signed_user_agent).toBe('LoambookTest/1.0 (tablet)');
      expect(row.signed_at.toISOString()).toBe('2026-07-03T02:30:00.000Z');
      expect(row.cancellation_statement).toContain('You, the buyer, may cancel this transaction');
      expect(row.signature_png.subarray(1, 4).toString()).toBe('PNG');
      expect(row.pdf_key).toBe(`branches/${gulf}/contracts/${c.id}.pdf`);
      const stored = await t.app.get(StorageService).getBuffer(row.pdf_key);
      expect(stored.subarray(0, 5).toString()).toBe('%PDF-');

      const lead = await leadRow(m.leadId);
      expect(lead).toEqual({ stage: 'contract_signed', value: '12807.90' });
      expect((await t.db('proposals').where({ id: m.proposalId }).first()).status).toBe('signed');
      expect(
        (await t.db('signing_links').where({ proposal_id: m.proposalId }).first()).used_at,
      ).not.toBeNull();

      const mail = await t.mail.lastTo(m.email);
      expect(mail.subject).toBe('Your signed contract with North Gulf');
      expect(mail.text).toContain('Wednesday, 2026-07-08');
      expect(mail.attachments[0]!.content.equals(stored)).toBe(true);
      // The proposal's pages for one option, the acceptance, and two notice-of-cancellation forms.
      expect(pageCount(stored)).toBeGreaterThanOrEqual(4);
      expect(stored.toString('latin1')).toContain(`Contract with ${m.homeowner}`);
    });

    it('refuses signing twice (409) and still shows the page, now with the contract', async () => {
      const again = await t.http.post(`/api/signing/${token}/sign`).send(await signBody(m, 0));
      expect(again.status).toBe(409);
      expect(again.body.code).toBe('CONTRACT.ALREADY_SIGNED');
      const page = await t.http.get(`/api/signing/${token}`);
      expect(page.status).toBe(200);
      expect(page.body.status).toBe('signed');
      expect(page.body.contract).toMatchObject({
        status: 'signed',
        optionId: m.optionIds[1],
        canCancel: true,
      });
      const pdf = await t.http.get(`/api/signing/${token}/pdf`).buffer(true).parse(binary);
      expect(pageCount(pdf.body as Buffer)).toBeGreaterThanOrEqual(4);
    });

    it('lets the staff read it, download its PDF and find it from the lead; another branch gets 404', async () => {
      const { id } = await t.db('contracts').where({ proposal_id: m.proposalId }).first('id');
      const seen = await as('seller').get(`/api/contracts/${id}`);
      expect(seen.status).toBe(200);
      expect(seen.body).toMatchObject({
        id,
        status: 'signed',
        leadId: m.leadId,
        proposalVersion: 1,
        option: { position: 2, title: 'Steel push piers along the east wall' },
        windowOpen: true,
        pdfStored: true,
        canCancel: true,
        cancellation: null,
      });
      expect((await as('seller').get(`/api/leads/${m.leadId}/contract`)).body.id).toBe(id);
      const pdf = await as('bookkeeper').getPdf(`/api/contracts/${id}/pdf`);
      expect(pdf.status).toBe(200);
      expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
      expect((await as('bookkeeper').get(`/api/contracts/${id}`)).body.canCancel).toBe(false);
      expect((await as('otherManager').get(`/api/contracts/${id}`)).status).toBe(404);
      expect((await as('otherManager').get(`/api/contracts/${id}/pdf`)).status).toBe(404);
      expect((await as('seller2').get(`/api/leads/${m.leadId}/contract`)).status).toBe(404);
    });

    it('keeps the signed terms frozen in the database', async () => {
      const { id } = await t.db('contracts').where({ proposal_id: m.proposalId }).first('id');
      await expect(t.db('contracts').where({ id }).update({ deposit_amount: '0' })).rejects.toThrow(
        /cannot change/,
      );
      await expect(t.db('contracts').where({ id }).update({ signed_on: '2026-07-03' })).rejects.toThrow(
        /cannot change/,
      );
    });
  });

  describe('links that no longer work', () => {
    it('answers 410 for an expired link and changes nothing', async () => {
      const m = await approvedProposal();
      const { token } = await sendIt(m);
      await t
        .db('signing_links')
        .where({ proposal_id: m.proposalId })
        .update({ expires_at: '2026-07-01T00:00:00Z' });
      const page = await t.http.get(`/api/signing/${token}`);
      expect(page.status).toBe(410);
      expect(page.body.code).toBe('SIGNING.LINK_EXPIRED');
      const sign = await t.http.post(`/api/signing/${token}/sign`).send(await signBody(m, 0));
      expect(sign.status).toBe(410);
      expect(sign.body.code).toBe('SIGNING.LINK_EXPIRED');
      expect((await t.http.get(`/api/signing/${token}/pdf`)).status).toBe(410);
      expect(await t.db('contracts').where({ proposal_id: m.proposalId })).toHaveLength(0);
      expect((await t.db('signing_links').where({ proposal_id: m.proposalId }).first()).used_at).toBeNull();
      expect((await leadRow(m.leadId)).stage).toBe('proposal_sent');
    });

    it('answers 410 for an unknown token', async () => {
      for (const token of ['A'.repeat(43), 'short', 'x'.repeat(43)]) {
        const res = await t.http.get(`/api/signing/${token}`);
        expect(res.status).toBe(410);
        expect(res.body.code).toBe('SIGNING.LINK_UNKNOWN');
      }
      const sign = await t.http.post(`/api/signing/${'B'.repeat(43)}/cancel`).send({ confirm: true });
      expect(sign.status).toBe(410);
    });
  });

  describe('cancelling', () => {
    const signed = async () => {
      const m = await approvedProposal();
      const { token } = await sendIt(m);
      const res = await t.http.post(`/api/signing/${token}/sign`).send(await signBody(m, 0));
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      return { m, token, contractId: res.body.contract.id as string };
    };

    it('needs confirm: true', async () => {
      const { token } = await signed();
      const res = await t.http.post(`/api/signing/${token}/cancel`).send({ confirm: false });
      expect(res.status).toBe(400);
    });

    it('cancels at 23:30 on the last day (branch time): the contract, the lead, the e-mails, the refund note', async () => {
      const { m, token, contractId } = await signed();
      // 23:30 EDT on Wed 2026-07-08 = 03:30 UTC on 07-09: still inside the window.
      vi.spyOn(clock(), 'now').mockReturnValue(new Date('2026-07-09T03:30:00Z'));
      const res = await t.http.post(`/api/signing/${token}/cancel`).send({ confirm: true });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body).toMatchObject({
        status: 'cancelled',
        contractId,
        cancelledAt: '2026-07-09T03:30:00.000Z',
      });
      const row = await t.db('contracts').where({ id: contractId }).first();
      expect(row.cancelled_by_kind).toBe('homeowner');
      expect((await leadRow(m.leadId)).stage).toBe('cancelled');
      const note = await t.db('lead_activities').where({ lead_id: m.leadId, kind: 'cancellation' }).first();
      expect(note.body).toContain('10 business days');
      expect(note.data).toMatchObject({ refundDue: true, byKind: 'homeowner' });
      expect((await t.mail.lastTo(m.email)).subject).toBe('Your contract with North Gulf is cancelled');
      expect((await t.mail.lastTo(people.seller!.email)).subject).toBe(`Contract cancelled: ${m.homeowner}`);
      // The link now says the contract was cancelled; cancelling again changes nothing.
      const page = await t.http.get(`/api/signing/${token}`);
      expect(page.status).toBe(410);
      expect(page.body.code).toBe('SIGNING.CONTRACT_CANCELLED');
      expect((await t.http.post(`/api/signing/${token}/cancel`).send({ confirm: true })).status).toBe(410);
      const staff = await as('seller').get(`/api/contracts/${contractId}`);
      expect(staff.body).toMatchObject({
        status: 'cancelled',
        canCancel: false,
        cancellation: { byKind: 'homeowner', afterWindow: false },
      });
    });

    it('refuses after the window (409) and lets only a manager record a late cancellation, with the reason', async () => {
      const { m, token, contractId } = await signed();
      // Midnight EDT at the end of 07-08: the window has closed.
      vi.spyOn(clock(), 'now').mockReturnValue(new Date('2026-07-09T04:00:00Z'));
      const late = await t.http.post(`/api/signing/${token}/cancel`).send({ confirm: true });
      expect(late.status).toBe(409);
      expect(late.body.code).toBe('CONTRACT.WINDOW_CLOSED');
      expect((await t.db('contracts').where({ id: contractId }).first()).cancelled_at).toBeNull();
      expect((await leadRow(m.leadId)).stage).toBe('contract_signed');

      const bySeller = await as('seller').post(`/api/contracts/${contractId}/cancel`, {
        note: 'Phoned on Thursday',
      });
      expect(bySeller.status).toBe(409);
      expect(bySeller.body.code).toBe('CONTRACT.WINDOW_CLOSED');
      expect(
        (await as('otherManager').post(`/api/contracts/${contractId}/cancel`, { note: 'x' })).status,
      ).toBe(404);
      expect((await as('manager').post(`/api/contracts/${contractId}/cancel`, {})).status).toBe(400);

      const byManager = await as('manager').post(`/api/contracts/${contractId}/cancel`, {
        note: 'Cancellation form postmarked 2026-07-08, received 2026-07-10.',
      });
      expect(byManager.status, JSON.stringify(byManager.body)).toBe(200);
      expect(byManager.body).toMatchObject({
        status: 'cancelled',
        cancellation: { byKind: 'staff', by: { id: people.manager!.id }, afterWindow: true },
      });
      expect((await leadRow(m.leadId)).stage).toBe('cancelled');
      const note = await t.db('lead_activities').where({ lead_id: m.leadId, kind: 'cancellation' }).first();
      expect(note.body).toContain('AFTER the cancellation window closed');
      expect(note.body).toContain('postmarked 2026-07-08');
      const twice = await as('manager').post(`/api/contracts/${contractId}/cancel`, { note: 'again' });
      expect(twice.body.code).toBe('CONTRACT.ALREADY_CANCELLED');
    });

    it('lets the salesperson record a cancellation inside the window', async () => {
      const { m, contractId } = await signed();
      const res = await as('seller').post(`/api/contracts/${contractId}/cancel`, {
        note: 'Homeowner phoned to cancel.',
      });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.cancellation).toMatchObject({
        byKind: 'staff',
        afterWindow: false,
        note: 'Homeowner phoned to cancel.',
      });
      expect((await leadRow(m.leadId)).stage).toBe('cancelled');
      expect((await t.mail.lastTo(m.email)).subject).toBe('Your contract with North Gulf is cancelled');
    });
  });

  describe('signing in person', () => {
    it('works for the salesperson on an approved proposal: the same contract, and a link for the homeowner', async () => {
      const m = await approvedProposal();
      const body = { ...(await signBody(m, 0)), depositAmount: '500' };
      const res = await as('seller').post(`/api/proposals/${m.proposalId}/sign-in-person`, body);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({
        status: 'signed',
        signedInPerson: true,
        price: '4173.00',
        depositAmount: '500.00',
        signedOn: SIGNED_ON,
        lastDayToCancel: LAST_DAY,
        pdfStored: true,
      });
      const stages = (
        await t.db('lead_activities').where({ lead_id: m.leadId, kind: 'stage_change' }).orderBy('created_at')
      ).map((a) => a.data.to);
      expect(stages).toEqual(['proposal_sent', 'contract_signed']);
      expect(await leadRow(m.leadId)).toEqual({ stage: 'contract_signed', value: '4173.00' });
      const mail = await t.mail.lastTo(m.email);
      expect(mail.subject).toBe('Your signed contract with North Gulf');
      const token = /\/sign\/([A-Za-z0-9_-]+)/.exec(mail.text)![1]!;
      const page = await t.http.get(`/api/signing/${token}`);
      expect(page.body.contract).toMatchObject({ id: res.body.id, signedInPerson: true });
      const again = await as('manager').post(`/api/proposals/${m.proposalId}/sign-in-person`, body);
      expect(again.body.code).toBe('CONTRACT.ALREADY_SIGNED');
    });

    it('is 404 for another branch’s manager and 403 for the bookkeeper', async () => {
      const m = await approvedProposal();
      const body = await signBody(m, 0);
      expect(
        (await as('otherManager').post(`/api/proposals/${m.proposalId}/sign-in-person`, body)).status,
      ).toBe(404);
      expect((await as('seller2').post(`/api/proposals/${m.proposalId}/sign-in-person`, body)).status).toBe(
        404,
      );
      expect(
        (await as('bookkeeper').post(`/api/proposals/${m.proposalId}/sign-in-person`, body)).status,
      ).toBe(403);
      expect(await t.db('contracts').where({ proposal_id: m.proposalId })).toHaveLength(0);
    });

    it('works for the branch manager on a proposal already sent', async () => {
      const m = await approvedProposal();
      const { token } = await sendIt(m);
      const res = await as('manager').post(
        `/api/proposals/${m.proposalId}/sign-in-person`,
        await signBody(m, 2, { acknowledgedNotices: ['FTC_429'] }),
      );
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body.price).toBe('1123.50');
      // The e-mailed link was replaced by the one sent with the signed contract.
      expect((await t.http.get(`/api/signing/${token}`)).body.code).toBe('SIGNING.LINK_REVOKED');
    });
  });
});
