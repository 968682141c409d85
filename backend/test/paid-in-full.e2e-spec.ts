// The last stage of a lead, "paid in full" (issue #5): the live contract's job is completed and what was
// received under it, less refunds, covers the contract price. Reached after the balance is paid by card
// (the processor's signed webhooks, through the local fake) or recorded by the bookkeeper (cash, cheque,
// transfer), and at completion when everything was paid before the work was done.
//
// Check values (hand-checked sums on job-fixtures' DEFAULT_PLAN, price $5,420.00):
// - deposit $1,000.00 + card balance $4,420.00 = $5,420.00 → paid in full;
// - deposit $500.00 + cash $4,000.00 = $4,500.00 < $5,420.00 → still completed; + cheque $920.00 → $5,420.00.
// - a refund still pending counts as money gone back: $5,420.00 − $0.01 < $5,420.00 (our rule: paid in full
//   is the end of the line, so it is not reached on money that is on its way back).
import { randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { COMPLETION_CHECKLIST_ITEMS, todayInZone } from '@loambook/common';
import { startStripeFake, type StripeFake } from '../fakes/stripe';
import { LeadsRepository } from '../src/leads/leads.repository';
import { Clock } from '../src/signing/clock';
import {
  DEFAULT_PLAN_PRICE,
  makeCrew,
  makeSignedJob,
  putJobOnCrew,
  type CrewFixture,
  type SignedJob,
} from './support/job-fixtures';
import { expectTrialBalanceZero } from './support/ledger-assertions';
import { inkSignature } from './support/signing-fixtures';
import {
  makeBranch,
  makeUser,
  startTestApp,
  tokenFor,
  type TestApp,
  type TestUser,
} from './support/test-app';

const SECRET = 'whsec_paid_in_full_suite_local_only_0123456789';
const SUCCEEDS = '4242 4242 4242 4242'; // Stripe testing docs (published): approved
const ZONE = 'America/Chicago';

const CHECKLIST = Object.fromEntries(COMPLETION_CHECKLIST_ITEMS.map((i) => [i.key, true]));
// Three points, one reference (the completion's minimum re-survey).
const RESURVEY = [
  { label: 'A', xFt: '0', yFt: '0', elevationIn: '0', isReference: true },
  { label: 'B', xFt: '25', yFt: '0', elevationIn: '-0.25' },
  { label: 'C', xFt: '0', yFt: '25', elevationIn: '-0.25' },
];

describe('a lead reaches paid in full once its completed job is paid for', () => {
  let t: TestApp;
  let fake: StripeFake;
  let branchId: string;
  let seller: TestUser;
  let bookkeeper: TestUser;
  let crewLead: TestUser;
  let crew: CrewFixture;
  let ink: string;
  const tokens = new Map<string, string>();

  const auth = async (u: TestUser) => {
    let tok = tokens.get(u.email);
    if (!tok) tokens.set(u.email, (tok = await tokenFor(t, u)));
    return { Authorization: `Bearer ${tok}` };
  };

  beforeAll(async () => {
    fake = await startStripeFake({ port: 0, webhookSecret: SECRET, retryBaseMs: 20 });
    t = await startTestApp({
      STRIPE_SECRET_KEY: 'sk_test_paid_in_full_suite',
      STRIPE_WEBHOOK_SECRET: SECRET,
      STRIPE_API_HOST: '127.0.0.1',
      STRIPE_API_PORT: String(fake.port),
      STRIPE_API_PROTOCOL: 'http',
    });
    await t.app.listen(0, '127.0.0.1');
    const port = (t.app.getHttpServer().address() as AddressInfo).port;
    fake.configure({ webhookUrl: `http://127.0.0.1:${port}/api/payments/webhook` });
    branchId = await makeBranch(t.db, { timezone: ZONE });
    seller = await makeUser(t.db, 'salesperson', [branchId]);
    bookkeeper = await makeUser(t.db, 'bookkeeper');
    crewLead = await makeUser(t.db, 'crew_lead', [branchId]);
    crew = await makeCrew(t, branchId, crewLead);
    ink = await inkSignature();
  });

  afterAll(async () => {
    await fake?.close();
    await t?.close();
  });

  afterEach(async () => {
    await fake.flushDeliveries();
    await expectTrialBalanceZero(t.db);
  });

  // ---- helpers ----------------------------------------------------------------------------------

  const stage = async (leadId: string) =>
    ((await t.db('leads').where({ id: leadId }).first('stage')) as { stage: string }).stage;

  const today = () => todayInZone(ZONE, t.app.get(Clock).now());

  async function payByCardLink(url: string) {
    expect(fake.pay(url.split('/pay/')[1]!, SUCCEEDS).outcome).toBe('succeeded');
    expect((await fake.flushDeliveries()).pending).toBe(0);
  }

  async function record(job: SignedJob, kind: 'deposit' | 'balance', method: string, amount: string) {
    const res = await t.http
      .post(`/api/contracts/${job.contractId}/payments`)
      .set(await auth(bookkeeper))
      .send({ kind, method, amount, receivedOn: today(), requestId: randomUUID() });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body;
  }

  /** On the crew and started, then completed by the crew lead through the API (the real completion). */
  async function complete(job: SignedJob) {
    await putJobOnCrew(t, job.jobId, crew, { status: 'in_progress' });
    const res = await t.http
      .post(`/api/jobs/${job.jobId}/complete`)
      .set(await auth(crewLead))
      .send({
        checklist: CHECKLIST,
        resurvey: RESURVEY,
        homeownerName: job.homeownerName,
        signaturePng: ink,
      });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  }

  async function stageMoves(leadId: string) {
    const rows = await t
      .db('lead_activities')
      .where({ lead_id: leadId, kind: 'stage_change' })
      .orderBy('created_at')
      .orderBy('id')
      .select('data');
    return rows.map((r) => `${r.data.from}→${r.data.to}`);
  }

  // ---- the card ---------------------------------------------------------------------------------

  it('card: the balance link paid after completion moves the lead from completed to paid in full', async () => {
    const job = await makeSignedJob(t, { branchId, seller, depositAmount: '1000.00', windowClosed: true });
    expect(job.price).toBe(DEFAULT_PLAN_PRICE);
    const link = await t.http
      .post(`/api/contracts/${job.contractId}/payment-links`)
      .set(await auth(seller))
      .send({ kind: 'deposit' });
    expect(link.status, JSON.stringify(link.body)).toBe(201);
    await payByCardLink(link.body.request.url);
    expect(await stage(job.leadId)).toBe('deposit_received');

    await complete(job);
    expect(await stage(job.leadId)).toBe('completed');
    // Completion invoiced the balance: $5,420.00 − $1,000.00 = $4,420.00.
    const balance = await t
      .db('payment_requests')
      .where({ contract_id: job.contractId, kind: 'balance', status: 'open' })
      .first('url', 'amount');
    expect(balance.amount).toBe('4420.00');

    await payByCardLink(balance.url);
    expect(await stage(job.leadId)).toBe('paid_in_full');
    expect((await stageMoves(job.leadId)).slice(-1)).toEqual(['completed→paid_in_full']);
    const payments = await t.db('payments').where({ contract_id: job.contractId }).orderBy('created_at');
    expect(payments.map((p) => [p.kind, p.method, p.amount])).toEqual([
      ['deposit', 'card', '1000.00'],
      ['balance', 'card', '4420.00'],
    ]);

    // The lead page says so, on the branch's clock, with a link to the job.
    const lead = await t.http.get(`/api/leads/${job.leadId}`).set(await auth(seller));
    expect(lead.status).toBe(200);
    expect(lead.body).toMatchObject({
      stage: 'paid_in_full',
      timezone: ZONE,
      job: { id: job.jobId, number: job.number, status: 'completed' },
    });
  });

  // ---- the bookkeeper's recordings --------------------------------------------------------------

  it('cash and cheque: a partial balance leaves the lead completed; the rest moves it to paid in full', async () => {
    const job = await makeSignedJob(t, { branchId, seller, depositAmount: '500.00', windowClosed: true });
    await record(job, 'deposit', 'cheque', '500.00');
    expect(await stage(job.leadId)).toBe('deposit_received');
    await complete(job);
    expect(await stage(job.leadId)).toBe('completed');

    await record(job, 'balance', 'cash', '4000.00'); // 500 + 4000 = 4500 < 5420
    expect(await stage(job.leadId)).toBe('completed');
    expect((await t.app.get(LeadsRepository).facts(job.leadId)).paidInFull).toBe(false);

    await record(job, 'balance', 'cheque', '920.00'); // 500 + 4000 + 920 = 5420
    expect(await stage(job.leadId)).toBe('paid_in_full');
    expect(await stageMoves(job.leadId)).toEqual(
      expect.arrayContaining(['in_progress→completed', 'completed→paid_in_full']),
    );
    const panel = await t.http.get(`/api/contracts/${job.contractId}/payments`).set(await auth(bookkeeper));
    expect(panel.body).toMatchObject({ paid: '5420.00', balanceDue: '0.00' });
  });

  it('paid before the work: completion itself moves the lead on to paid in full', async () => {
    const job = await makeSignedJob(t, { branchId, seller, windowClosed: true });
    await record(job, 'balance', 'transfer', DEFAULT_PLAN_PRICE);
    // Not completed yet: paid, but the lead waits for the job (deposit none asked: deposit received).
    expect(await stage(job.leadId)).toBe('deposit_received');
    await complete(job);
    expect(await stage(job.leadId)).toBe('paid_in_full');
    // Nothing left to invoice: no balance link was made.
    expect(await t.db('payment_requests').where({ contract_id: job.contractId })).toEqual([]);
  });

  it('paid in full waits for the job: the whole price paid before it starts moves the lead no further', async () => {
    const job = await makeSignedJob(t, { branchId, seller, depositAmount: '500.00', windowClosed: true });
    await record(job, 'deposit', 'cash', '500.00');
    await record(job, 'balance', 'cash', '4920.00'); // the whole price, the job not even scheduled
    expect(await stage(job.leadId)).toBe('deposit_received');
    expect((await t.app.get(LeadsRepository).facts(job.leadId)).paidInFull).toBe(false);
  });

  // ---- refunds ----------------------------------------------------------------------------------

  it('refunds count against the payments: one pending counts as gone back, a failed one does not', async () => {
    const job = await makeSignedJob(t, { branchId, seller, depositAmount: '500.00', windowClosed: true });
    const deposit = await record(job, 'deposit', 'cheque', '500.00');
    await record(job, 'balance', 'cheque', '4920.00');
    await complete(job);
    const repo = t.app.get(LeadsRepository);
    expect((await repo.facts(job.leadId)).paidInFull).toBe(true);

    // A refund of one cent on its way back (pending: not yet posted): 5420.00 − 0.01 < 5420.00.
    const [refund] = await t
      .db('refunds')
      .insert({
        contract_id: job.contractId,
        branch_id: branchId,
        payment_id: deposit.id,
        amount: '0.01',
        status: 'pending',
        refunded_on: today(),
      })
      .returning('id');
    expect((await repo.facts(job.leadId)).paidInFull).toBe(false);
    await t.db('refunds').where({ id: refund.id }).update({ status: 'failed' });
    expect((await repo.facts(job.leadId)).paidInFull).toBe(true);
  });
});
