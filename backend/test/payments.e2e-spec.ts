// Payments through the processor's SDK against the local fake (backend/fakes/stripe), its signed webhooks
// into the running app, the postings they make, the bookkeeper's recordings and refunds, and completion.
//
// Check values:
// - the card fee is Stripe's published US pricing, 2.9% + 30¢ per successful card charge (stripe.com/pricing,
//   published; the fake implements it, README "Money"): $1,000.00 → $29.30, net $970.70;
//   $4,420.00 → 2.9% = $128.18, + $0.30 = $128.48, net $4,291.52.
// - the signature is HMAC-SHA256 keyed with the whole endpoint secret over "<t>.<raw body>", header
//   "t=<unix>,v1=<hex>", tolerance 300 s (stripe-node Webhooks.ts, published; shared/REFERENCE-VALUES.md).
// - F.S. 489.126(2)(a) (published): an initial payment of more than 10% of the contract price starts the
//   permit and start-of-work clocks; exactly 10% does not.
// - postings: the usual postings table of shared/REFERENCE-VALUES.md "Money" (common practice).
import { createHmac, randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import knexFactory from 'knex';
import Stripe from 'stripe';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest';
import { signatureHeader, startStripeFake, type StripeFake } from '../fakes/stripe';
import { pg } from '../scripts/lib/env.mjs';
import { JOB_COMPLETED_HANDLERS, type JobCompletedHandler } from '../src/field/job-completed';
import { PaymentsCompletionHandler } from '../src/payments/completion.handler';
import { makeSignedJob, type SignedJob } from './support/job-fixtures';
import { expectTrialBalanceZero } from './support/ledger-assertions';
import {
  makeBranch,
  makeUser,
  startTestApp,
  tokenFor,
  type TestApp,
  type TestUser,
} from './support/test-app';

const SECRET = 'whsec_payments_suite_local_only_0123456789abcdef';
const SUCCEEDS = '4242 4242 4242 4242'; // Stripe testing docs (published): approved
const DECLINED = '4000 0000 0000 0002'; // Stripe testing docs (published): card_declined
const PRICE = '5420.00'; // job-fixtures DEFAULT_PLAN_PRICE: the one-option proposal's customer total

const CLEARING = '1050';
const BANK = '1010';
const RECEIVABLE = '1200';
const DEPOSITS = '2100';
const REVENUE = '4000';
const REFUNDS = '4900';
const FEES = '5100';

/** Integer cents (bigint) as the ledger's text: -123456n → "-1234.56". */
function centsText(c: bigint): string {
  const neg = c < 0n;
  const a = neg ? -c : c;
  return `${neg ? '-' : ''}${a / 100n}.${String(a % 100n).padStart(2, '0')}`;
}

describe('payments: links, signed webhooks, postings', () => {
  let t: TestApp;
  let fake: StripeFake;
  let sdk: Stripe;
  let webhookUrl: string;
  let bookkeeper: TestUser;
  const tokens = new Map<string, string>();
  const defaults = {
    duplicate: 1,
    shuffle: false,
    paused: false,
    concurrency: 1,
    retryBaseMs: 20,
    maxAttempts: 8,
  };

  const auth = async (u: TestUser) => {
    let tok = tokens.get(u.email);
    if (!tok) tokens.set(u.email, (tok = await tokenFor(t, u)));
    return { Authorization: `Bearer ${tok}` };
  };

  beforeAll(async () => {
    // The app's SDK needs the fake's port and the fake needs the app's: start the fake, then the app
    // listening on a real port (the fake delivers over HTTP), then point the fake's webhooks at it.
    fake = await startStripeFake({ port: 0, webhookSecret: SECRET, ...defaults });
    t = await startTestApp({
      STRIPE_SECRET_KEY: 'sk_test_payments_suite',
      STRIPE_WEBHOOK_SECRET: SECRET,
      STRIPE_API_HOST: '127.0.0.1',
      STRIPE_API_PORT: String(fake.port),
      STRIPE_API_PROTOCOL: 'http',
    });
    await t.app.listen(0, '127.0.0.1');
    webhookUrl = `http://127.0.0.1:${(t.app.getHttpServer().address() as AddressInfo).port}/api/payments/webhook`;
    fake.configure({ webhookUrl });
    sdk = new Stripe('sk_test_payments_suite_driver', {
      host: '127.0.0.1',
      port: fake.port,
      protocol: 'http',
      maxNetworkRetries: 0,
    });
    bookkeeper = await makeUser(t.db, 'bookkeeper');
  });

  afterAll(async () => {
    await fake?.close();
    await t?.close();
  });

  beforeEach(async () => {
    await fake.reset();
    fake.configure({ ...defaults, webhookUrl, webhookSecret: SECRET });
  });

  afterEach(async () => {
    await fake.flushDeliveries();
    await expectTrialBalanceZero(t.db);
  });

  // ---- helpers ----------------------------------------------------------------------------------

  async function office() {
    const branchId = await makeBranch(t.db);
    const seller = await makeUser(t.db, 'salesperson', [branchId]);
    return { branchId, seller };
  }

  /** Debits − credits per account code of the branch, as numeric text ("-1000.00"). */
  async function balances(branchId: string): Promise<Record<string, string>> {
    const r = await t.db.raw(
      `select a.code,
              coalesce(sum(case l.side when 'debit' then l.amount else -l.amount end), 0)::numeric(14,2)::text as bal
         from ledger_accounts a left join journal_lines l on l.account_id = a.id
        where a.branch_id = ? group by a.code`,
      [branchId],
    );
    return Object.fromEntries(r.rows.map((x: { code: string; bal: string }) => [x.code, x.bal]));
  }

  async function entriesOf(contractId: string, reason: string) {
    return t.db('journal_entries').where({ contract_id: contractId, reason_code: reason }).select('id');
  }

  async function linesOf(entryId: string) {
    const rows = await t
      .db('journal_lines as l')
      .join('ledger_accounts as a', 'a.id', 'l.account_id')
      .where('l.entry_id', entryId)
      .orderBy('l.position')
      .select('a.code', 'l.side', 'l.amount');
    return rows.map((r) => `${r.code} ${r.side} ${r.amount}`);
  }

  /** A session made straight through the SDK with the metadata our links carry (bulk tests). */
  function sessionFor(job: SignedJob, branchId: string, kind: 'deposit' | 'balance', cents: number) {
    const metadata = { contractId: job.contractId, branchId, kind };
    return sdk.checkout.sessions.create({
      mode: 'payment',
      line_items: [
        {
          price_data: {
            currency: 'usd',
            unit_amount: cents,
            product_data: { name: `${kind} ${job.number}` },
          },
          quantity: 1,
        },
      ],
      metadata,
      payment_intent_data: { metadata },
      success_url: 'http://loambook.test/payment/thank-you?session_id={CHECKOUT_SESSION_ID}',
    });
  }

  async function createLink(user: TestUser, contractId: string, body: Record<string, unknown>) {
    return t.http
      .post(`/api/contracts/${contractId}/payment-links`)
      .set(await auth(user))
      .send(body);
  }

  const sessionIdOf = (url: string) => url.split('/pay/')[1]!;

  async function payDeposit(seller: TestUser, job: SignedJob) {
    const link = await createLink(seller, job.contractId, { kind: 'deposit' });
    expect(link.status, JSON.stringify(link.body)).toBe(201);
    const paid = fake.pay(sessionIdOf(link.body.request.url), SUCCEEDS);
    expect(paid.outcome).toBe('succeeded');
    const flushed = await fake.flushDeliveries();
    expect(flushed.pending).toBe(0);
    return { link: link.body, paid };
  }

  /** Expected ledger balances of a branch, from the fake's own records (integer cents). */
  function expectedFromFake(contractBranch: Map<string, string>) {
    const per = new Map<string, Record<string, bigint>>();
    const acc = (b: string) => {
      if (!per.has(b)) {
        per.set(b, {
          [CLEARING]: 0n,
          [BANK]: 0n,
          [FEES]: 0n,
          [DEPOSITS]: 0n,
          [RECEIVABLE]: 0n,
          [REFUNDS]: 0n,
        });
      }
      return per.get(b)!;
    };
    const chargeKind = new Map<string, { branch: string; kind: string }>();
    let charges = 0;
    for (const ch of fake.state.charges.values()) {
      const branch = contractBranch.get(ch.metadata.contractId ?? '');
      if (!branch || ch.status !== 'succeeded') continue;
      charges += 1;
      const txn = fake.state.balanceTransactions.get(ch.balance_transaction!)!;
      const a = acc(branch);
      a[CLEARING] += BigInt(txn.net);
      a[FEES] += BigInt(txn.fee);
      if (ch.metadata.kind === 'deposit') a[DEPOSITS] -= BigInt(txn.amount);
      else a[RECEIVABLE] -= BigInt(txn.amount);
      chargeKind.set(ch.id, { branch, kind: ch.metadata.kind! });
    }
    for (const r of fake.state.refunds.values()) {
      const c = chargeKind.get(r.charge);
      if (!c) continue;
      const a = acc(c.branch);
      a[CLEARING] -= BigInt(r.amount);
      if (c.kind === 'deposit') a[DEPOSITS] += BigInt(r.amount);
      else a[REFUNDS] += BigInt(r.amount);
    }
    // A payout sweeps everything not yet paid out: each branch's clearing goes to its bank.
    if (fake.state.payouts.size > 0) {
      for (const a of per.values()) {
        a[BANK] += a[CLEARING]!;
        a[CLEARING] = 0n;
      }
    }
    return { per, charges };
  }

  async function expectLedgerMatches(contractBranch: Map<string, string>) {
    const { per, charges } = expectedFromFake(contractBranch);
    for (const [branchId, want] of per) {
      const got = await balances(branchId);
      for (const [code, cents] of Object.entries(want)) {
        expect(got[code], `branch ${branchId} account ${code}`).toBe(centsText(cents));
      }
    }
    const contracts = [...contractBranch.keys()];
    const cardEntries = await t
      .db('journal_entries')
      .whereIn('contract_id', contracts)
      .whereIn('reason_code', ['deposit.card', 'balance.card'])
      .select('idempotency_key');
    expect(cardEntries.length, 'one card posting per charge').toBe(charges);
    expect(new Set(cardEntries.map((e) => e.idempotency_key)).size).toBe(charges);
    const payments = await t
      .db('payments')
      .whereIn('contract_id', contracts)
      .count<{ count: string }[]>('* as count');
    expect(Number(payments[0]!.count)).toBe(charges);
  }

  // ---- signatures -------------------------------------------------------------------------------

  it('signs as published: node:crypto, the SDK and the fake agree', () => {
    const payload = JSON.stringify({ id: 'evt_scheme_check', object: 'event', type: 'charge.succeeded' });
    const at = 1_767_225_600; // 2026-01-01T00:00:00Z
    const hmac = createHmac('sha256', SECRET).update(`${at}.${payload}`, 'utf8').digest('hex');
    const byHand = `t=${at},v1=${hmac}`;
    expect(sdk.webhooks.generateTestHeaderString({ payload, secret: SECRET, timestamp: at })).toBe(byHand);
    expect(signatureHeader(payload, SECRET, at)).toBe(byHand);
    // and the SDK's check accepts it 300 s later, refuses it 301 s later (tolerance 300 s; receivedAt in ms)
    expect(sdk.webhooks.constructEvent(payload, byHand, SECRET, 300, undefined, (at + 300) * 1000).id).toBe(
      'evt_scheme_check',
    );
    expect(() =>
      sdk.webhooks.constructEvent(payload, byHand, SECRET, 300, undefined, (at + 301) * 1000),
    ).toThrow(/tolerance/i);
  });

  it('refuses forged, altered, stale and missing signatures with 400 and writes nothing', async () => {
    const { branchId, seller } = await office();
    const job = await makeSignedJob(t, { branchId, seller, depositAmount: '1000.00' });
    fake.configure({ paused: true });
    const link = await createLink(seller, job.contractId, { kind: 'deposit' });
    fake.pay(sessionIdOf(link.body.request.url), SUCCEEDS);
    const event = [...fake.state.events.values()].find((e) => e.type === 'charge.succeeded')!;
    const body = JSON.stringify(event);
    const now = Math.floor(Date.now() / 1000);

    const counts = async () => {
      const q = (table: string) =>
        t
          .db(table)
          .count<{ n: string }[]>('* as n')
          .then((r) => r[0]!.n);
      return {
        events: await q('webhook_events'),
        payments: await q('payments'),
        entries: await q('journal_entries'),
        activities: await q('lead_activities'),
      };
    };
    const before = await counts();
    const send = (payload: string, header?: string) => {
      const req = t.http.post('/api/payments/webhook').set('Content-Type', 'application/json');
      return (header ? req.set('Stripe-Signature', header) : req).send(payload);
    };
    const amount = (event.data.object as { amount: number }).amount;
    const altered = body.replace(`"amount":${amount}`, `"amount":${amount + 100}`);
    expect(altered).not.toBe(body);
    const refused = [
      ['forged', await send(body, signatureHeader(body, 'whsec_somebody_else_entirely', now))],
      ['altered', await send(altered, signatureHeader(body, SECRET, now))],
      ['stale', await send(body, signatureHeader(body, SECRET, now - 301))],
      ['garbled', await send(body, 't=abc,v1=zz')],
      ['missing', await send(body)],
    ] as const;
    for (const [what, res] of refused) {
      expect(res.status, what).toBe(400);
      expect(res.body.code, what).toBe(
        what === 'missing' ? 'WEBHOOK.SIGNATURE_MISSING' : 'WEBHOOK.SIGNATURE_INVALID',
      );
    }
    expect(await counts(), 'nothing written by a refused delivery').toEqual(before);

    // The same body, signed 290 s ago (inside the tolerance), is taken: the refusals above were the signature.
    const ok = await send(body, signatureHeader(body, SECRET, now - 290));
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    const after = await counts();
    expect(Number(after.events)).toBe(Number(before.events) + 1);
    expect(Number(after.payments)).toBe(Number(before.payments) + 1);
    // and it again, now a duplicate: 200 at once, nothing more
    const again = await send(body, signatureHeader(body, SECRET, now));
    expect(again.body).toEqual({ received: true, duplicate: true });
    expect(await counts()).toEqual(after);
  });

  // ---- a deposit --------------------------------------------------------------------------------

  it('takes a $1,000.00 deposit through the fake: fee 29.30, net 970.70, posted once; the lead moves on', async () => {
    const { branchId, seller } = await office();
    const job = await makeSignedJob(t, { branchId, seller, depositAmount: '1000.00' });

    const link = await createLink(seller, job.contractId, { kind: 'deposit' });
    expect(link.status, JSON.stringify(link.body)).toBe(201);
    expect(link.body.request).toMatchObject({ kind: 'deposit', amount: '1000.00', status: 'open' });
    expect(link.body.emailed).toBe(true);
    // 1000 / 5420 = 18.45% of the price: more than 10% (F.S. 489.126(2)(a))
    expect(link.body.depositWarning.largeInitialPayment).toBe(true);
    expect(link.body.depositWarning.clocks.map((c: { code: string }) => c.code)).toEqual([
      'FL_489_126_PERMIT',
      'FL_489_126_START',
    ]);
    const mail = await t.mail.lastTo(job.email);
    expect(mail.text).toContain(link.body.request.url);
    expect(mail.text).toContain('$1,000.00');

    const sessionId = sessionIdOf(link.body.request.url);
    const declined = fake.pay(sessionId, DECLINED);
    expect(declined.outcome).toBe('declined');
    const paid = fake.pay(sessionId, SUCCEEDS);
    expect(paid.outcome).toBe('succeeded');
    const flushed = await fake.flushDeliveries();
    expect(flushed.pending).toBe(0);
    expect(
      fake.deliveries.every((d) => d.ok),
      JSON.stringify(fake.deliveries.filter((d) => !d.ok)),
    ).toBe(true);
    // charge.succeeded, payment_intent.succeeded and checkout.session.completed all name the same charge
    expect(fake.deliveries.map((d) => d.eventType)).toEqual(
      expect.arrayContaining(['charge.succeeded', 'payment_intent.succeeded', 'checkout.session.completed']),
    );

    const entries = await entriesOf(job.contractId, 'deposit.card');
    expect(entries).toHaveLength(1);
    expect(await linesOf(entries[0]!.id)).toEqual([
      `${CLEARING} debit 970.70`,
      `${FEES} debit 29.30`,
      `${DEPOSITS} credit 1000.00`,
    ]);
    const payment = await t.db('payments').where({ contract_id: job.contractId }).first();
    expect(payment).toMatchObject({
      method: 'card',
      kind: 'deposit',
      amount: '1000.00',
      fee: '29.30',
      net: '970.70',
    });
    expect(payment.card_last4).toBe('4242');

    const contract = await t.db('contracts').where({ id: job.contractId }).first('deposit_received_at');
    expect(contract.deposit_received_at).not.toBeNull();
    expect((await t.db('leads').where({ id: job.leadId }).first('stage')).stage).toBe('deposit_received');
    const activity = await t.db('lead_activities').where({ lead_id: job.leadId, kind: 'payment' });
    expect(activity).toHaveLength(1);
    expect(activity[0].body).toContain('$1,000.00');

    const panel = await t.http.get(`/api/contracts/${job.contractId}/payments`).set(await auth(seller));
    expect(panel.status).toBe(200);
    expect(panel.body).toMatchObject({ paid: '1000.00', depositHeld: '1000.00', balanceDue: '4420.00' });
    expect(panel.body.requests[0]).toMatchObject({ status: 'paid', url: null });
    const status = await t.http.get(`/api/payments/checkout/${sessionId}`);
    expect(status.body).toMatchObject({ status: 'received', amount: '1000.00', kind: 'deposit' });
    expect((await t.http.get('/api/payments/checkout/cs_test_unknown_session_000')).status).toBe(404);
  });

  it('warns on a deposit over 10% only; refuses links beyond the balance; hides another branch', async () => {
    const { branchId, seller } = await office();
    const tenPct = await makeSignedJob(t, { branchId, seller, depositAmount: '542.00' });
    const link = await createLink(seller, tenPct.contractId, { kind: 'deposit' });
    expect(link.status).toBe(201);
    expect(link.body.depositWarning, 'exactly 10% does not trigger F.S. 489.126(2)(a)').toBeNull();
    const over = await createLink(seller, tenPct.contractId, { kind: 'deposit', amount: '542.01' });
    expect(over.body.depositWarning.largeInitialPayment).toBe(true);
    // the second link replaced the first
    const requests = await t
      .db('payment_requests')
      .where({ contract_id: tenPct.contractId })
      .orderBy('created_at');
    expect(requests.map((r) => r.status)).toEqual(['cancelled', 'open']);

    const tooMuch = await createLink(seller, tenPct.contractId, { kind: 'balance', amount: '5420.01' });
    expect(tooMuch.status).toBe(422);
    expect(tooMuch.body.code).toBe('PAYMENT.AMOUNT_TOO_LARGE');
    const tiny = await createLink(seller, tenPct.contractId, { kind: 'balance', amount: '0.49' });
    expect(tiny.body.code).toBe('PAYMENT.AMOUNT_TOO_SMALL');

    const other = await office();
    const manager = await makeUser(t.db, 'branch_manager', [other.branchId]);
    const hidden = await t.http.get(`/api/contracts/${tenPct.contractId}/payments`).set(await auth(manager));
    expect(hidden.status).toBe(404);
    const resend = await t.http
      .post(`/api/payment-requests/${requests[1].id}/resend`)
      .set(await auth(seller))
      .send({});
    expect(resend.status).toBe(200);
    expect(resend.body.emailCount).toBe(2);
  });

  it('ignores (200) a charge whose contract is not in the database, with nothing written', async () => {
    const metadata = { contractId: randomUUID(), branchId: randomUUID(), kind: 'deposit' };
    const session = await sdk.checkout.sessions.create({
      mode: 'payment',
      line_items: [
        {
          price_data: { currency: 'usd', unit_amount: 10_000, product_data: { name: 'Elsewhere' } },
          quantity: 1,
        },
      ],
      metadata,
      payment_intent_data: { metadata },
      success_url: 'http://loambook.test/payment/thank-you',
    });
    const before = await t.db('journal_entries').count<{ n: string }[]>('* as n');
    fake.pay(session.id, SUCCEEDS);
    await fake.flushDeliveries();
    expect(fake.deliveries.every((d) => d.status === 200)).toBe(true);
    const events = await t.db('webhook_events').whereIn(
      'event_id',
      fake.deliveries.map((d) => d.eventId),
    );
    expect(events.length).toBeGreaterThanOrEqual(3);
    expect(events.filter((e) => e.type === 'charge.succeeded')[0].outcome).toBe('ignored');
    expect(await t.db('journal_entries').count<{ n: string }[]>('* as n')).toEqual(before);
  });

  // ---- many events, any order -------------------------------------------------------------------

  it('1,000+ events delivered twice each in shuffled order: the ledger equals the sums exactly, each charge posted once', async () => {
    const A = await office();
    const B = await office();
    const jobs = [
      { ...A, job: await makeSignedJob(t, { branchId: A.branchId, seller: A.seller }) },
      { ...A, job: await makeSignedJob(t, { branchId: A.branchId, seller: A.seller }) },
      { ...B, job: await makeSignedJob(t, { branchId: B.branchId, seller: B.seller }) },
      { ...B, job: await makeSignedJob(t, { branchId: B.branchId, seller: B.seller }) },
    ];
    const contractBranch = new Map(jobs.map((j) => [j.job.contractId, j.branchId]));
    // Two copies of every event, queued while paused, then delivered in a seeded shuffled order, four at a time.
    fake.configure({ paused: true, duplicate: 2, shuffle: true, seed: 11, concurrency: 4 });
    const charges: string[] = [];
    for (let i = 0; i < 240; i++) {
      const j = jobs[i % jobs.length]!;
      const cents = 5_000 + ((i * 3_719) % 95_000) + (i % 97); // $50.00 … $1,050.96, varied cents
      const s = await sessionFor(j.job, j.branchId, i % 3 === 0 ? 'balance' : 'deposit', cents);
      const r = fake.pay(s.id, SUCCEEDS);
      expect(r.outcome).toBe('succeeded');
      if (r.outcome === 'succeeded') charges.push(r.charge.id);
    }
    for (let i = 0; i < charges.length; i += 12) {
      const ch = fake.state.charges.get(charges[i]!)!;
      await sdk.refunds.create({ charge: ch.id, amount: Math.floor(ch.amount / 2) });
    }
    expect(fake.payoutNow()).toHaveLength(1);
    const events = fake.state.events.size;
    expect(events).toBeGreaterThanOrEqual(1000);

    const flushed = await fake.flushDeliveries(120_000);
    expect(flushed.pending).toBe(0);
    expect(fake.deliveries.filter((d) => d.outcome === 'gave_up')).toEqual([]);
    expect(fake.deliveries.filter((d) => d.ok).length, 'every copy answered 2xx').toBe(events * 2);
    // the order really was shuffled: the first delivery was not the first event
    expect(fake.deliveries[0]!.eventId).not.toBe([...fake.state.events.keys()][0]);

    await expectLedgerMatches(contractBranch);
    const processed = await t
      .db('webhook_events')
      .whereIn('event_id', [...fake.state.events.keys()])
      .whereNotNull('processed_at')
      .count<{ n: string }[]>('* as n');
    expect(Number(processed[0]!.n)).toBe(events);
    const refundEntries = await t
      .db('journal_entries')
      .whereIn('contract_id', [...contractBranch.keys()])
      .whereIn('reason_code', ['refund.cancellation', 'refund.revenue']);
    expect(refundEntries).toHaveLength(fake.state.refunds.size);
    // the payout is split per branch and adds up to the payout
    const payout = [...fake.state.payouts.values()][0]!;
    const split = await t
      .db('processor_payout_branches as b')
      .join('processor_payouts as p', 'p.id', 'b.payout_id')
      .where('p.processor_payout_id', payout.id)
      .select('b.branch_id', 'b.net', 'p.amount');
    expect(split.map((s) => s.branch_id).sort()).toEqual([A.branchId, B.branchId].sort());
    const items = await t
      .db('processor_payout_items as i')
      .join('processor_payouts as p', 'p.id', 'i.payout_id')
      .where('p.processor_payout_id', payout.id)
      .count<{ n: string }[]>('* as n');
    expect(Number(items[0]!.n)).toBe(charges.length + fake.state.refunds.size);
    const total = await t.db.raw(
      `select (sum(b.net) = p.amount) as ok from processor_payout_branches b
         join processor_payouts p on p.id = b.payout_id where p.processor_payout_id = ? group by p.amount`,
      [payout.id],
    );
    expect(total.rows[0].ok).toBe(true);
  }, 120_000);

  it('the database goes away in the middle of a delivery run and comes back: after redelivery, exact', async () => {
    // Simulates a database outage for the app only: the shared PostgreSQL cluster serves other test runs,
    // so instead of stopping it, the app's database refuses new connections and its open ones are
    // terminated (from an admin connection to the "postgres" database), then it is allowed again.
    const { branchId, seller } = await office();
    const job = await makeSignedJob(t, { branchId, seller });
    const contractBranch = new Map([[job.contractId, branchId]]);
    fake.configure({ paused: true, maxAttempts: 12 });
    for (let i = 0; i < 16; i++) {
      const s = await sessionFor(job, branchId, i % 4 === 0 ? 'balance' : 'deposit', 10_000 + i * 1_234);
      expect(fake.pay(s.id, SUCCEEDS).outcome).toBe('succeeded');
    }
    fake.payoutNow();
    const events = fake.state.events.size;

    const database = inject('databaseName');
    const admin = knexFactory({
      client: 'pg',
      connection: {
        host: pg.host,
        port: pg.port,
        user: pg.user,
        password: pg.password,
        database: 'postgres',
      },
      pool: { min: 1, max: 1 },
    });
    const flushing = fake.flushDeliveries(60_000);
    try {
      for (let i = 0; i < 400 && fake.deliveries.filter((d) => d.ok).length < 12; i++) {
        await new Promise((r) => setTimeout(r, 5));
      }
      await admin.raw(`alter database "${database}" with allow_connections false`);
      await admin.raw(
        `select pg_terminate_backend(pid) from pg_stat_activity where datname = ? and pid <> pg_backend_pid()`,
        [database],
      );
      await new Promise((r) => setTimeout(r, 400));
    } finally {
      await admin.raw(`alter database "${database}" with allow_connections true`);
      await admin.destroy();
    }
    const flushed = await flushing;
    expect(flushed.pending).toBe(0);
    const failedDuringOutage = fake.deliveries.filter((d) => !d.ok);
    expect(failedDuringOutage.length, 'some deliveries failed while the database was away').toBeGreaterThan(
      0,
    );
    expect(failedDuringOutage.every((d) => d.status === 500 || d.status === null)).toBe(true);
    expect(fake.deliveries.filter((d) => d.outcome === 'gave_up')).toEqual([]);
    const deliveredEvents = new Set(fake.deliveries.filter((d) => d.ok).map((d) => d.eventId));
    expect(deliveredEvents.size).toBe(events);
    await expectLedgerMatches(contractBranch);
    // the failures were noted and then cleared by the successful retry
    const noted = await t
      .db('webhook_events')
      .whereIn('event_id', [...fake.state.events.keys()])
      .whereNull('processed_at');
    expect(noted).toEqual([]);
  }, 60_000);

  // ---- the bookkeeper ---------------------------------------------------------------------------

  it('records cash, cheque and transfer payments through the bank, once per request id', async () => {
    const { branchId, seller } = await office();
    const job = await makeSignedJob(t, { branchId, seller, depositAmount: '500.00' });
    const headers = await auth(bookkeeper);
    const requestId = randomUUID();
    const body = {
      kind: 'deposit',
      method: 'cheque',
      amount: '500.00',
      receivedOn: '2026-01-05',
      reference: 'Cheque 1042',
      requestId,
    };
    const first = await t.http.post(`/api/contracts/${job.contractId}/payments`).set(headers).send(body);
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    expect(first.body).toMatchObject({
      method: 'cheque',
      amount: '500.00',
      fee: '0.00',
      net: '500.00',
      receivedOn: '2026-01-05',
    });
    const again = await t.http.post(`/api/contracts/${job.contractId}/payments`).set(headers).send(body);
    expect(again.body.id).toBe(first.body.id);
    const entries = await entriesOf(job.contractId, 'deposit.bank');
    expect(entries).toHaveLength(1);
    expect(await linesOf(entries[0]!.id)).toEqual([`${BANK} debit 500.00`, `${DEPOSITS} credit 500.00`]);
    expect((await t.db('leads').where({ id: job.leadId }).first('stage')).stage).toBe('deposit_received');

    const balance = await t.http
      .post(`/api/contracts/${job.contractId}/payments`)
      .set(headers)
      .send({ kind: 'balance', method: 'transfer', amount: '4920.00', receivedOn: '2026-01-06' });
    expect(balance.status).toBe(201);
    const bal = await entriesOf(job.contractId, 'balance.bank');
    expect(await linesOf(bal[0]!.id)).toEqual([`${BANK} debit 4920.00`, `${RECEIVABLE} credit 4920.00`]);

    const over = await t.http
      .post(`/api/contracts/${job.contractId}/payments`)
      .set(headers)
      .send({ kind: 'balance', method: 'cash', amount: '0.01', receivedOn: '2026-01-06' });
    expect(over.status).toBe(422);
    expect(over.body.code).toBe('PAYMENT.AMOUNT_TOO_LARGE');
    const future = await t.http
      .post(`/api/contracts/${job.contractId}/payments`)
      .set(headers)
      .send({ kind: 'balance', method: 'cash', amount: '1.00', receivedOn: '2999-01-01' });
    expect(future.status).toBe(400);
    expect(future.body.details[0].field).toBe('receivedOn');
    const bySeller = await t.http
      .post(`/api/contracts/${job.contractId}/payments`)
      .set(await auth(seller))
      .send({ kind: 'balance', method: 'cash', amount: '1.00', receivedOn: '2026-01-06' });
    expect(bySeller.status).toBe(403);

    const list = await t.http.get(`/api/payments?branchId=${branchId}`).set(headers);
    expect(list.status).toBe(200);
    expect(list.body.total).toBe(2);
    expect(list.body.totals).toEqual({ amount: '5420.00', fee: '0.00', net: '5420.00' });
    const panel = await t.http.get(`/api/contracts/${job.contractId}/payments`).set(headers);
    expect(panel.body.balanceDue).toBe('0.00');
  });

  it('refunds a cancelled contract’s card deposit: posted at once, not again when charge.refunded arrives', async () => {
    const { branchId, seller } = await office();
    const job = await makeSignedJob(t, { branchId, seller, depositAmount: '1000.00' });
    await payDeposit(seller, job);
    const headers = await auth(bookkeeper);
    const early = await t.http.post(`/api/contracts/${job.contractId}/refunds`).set(headers).send({});
    expect(early.status).toBe(422);
    expect(early.body.code).toBe('PAYMENT.REFUND_NOT_CANCELLED');

    const cancelled = await t.http
      .post(`/api/contracts/${job.contractId}/cancel`)
      .set(await auth(seller))
      .send({ note: 'Homeowner phoned within the window and mailed the signed form.' });
    expect(cancelled.status, JSON.stringify(cancelled.body)).toBe(200);

    fake.configure({ paused: true });
    const refund = await t.http
      .post(`/api/contracts/${job.contractId}/refunds`)
      .set(headers)
      .send({ reason: 'Cancelled within the three-day window' });
    expect(refund.status, JSON.stringify(refund.body)).toBe(201);
    expect(refund.body).toHaveLength(1);
    expect(refund.body[0]).toMatchObject({ amount: '1000.00', status: 'succeeded' });
    const entries = await entriesOf(job.contractId, 'refund.cancellation');
    expect(entries).toHaveLength(1);
    expect(await linesOf(entries[0]!.id)).toEqual([
      `${DEPOSITS} debit 1000.00`,
      `${CLEARING} credit 1000.00`,
    ]);

    const seen = fake.deliveries.length;
    await fake.flushDeliveries();
    const refundDeliveries = fake.deliveries.slice(seen);
    expect(refundDeliveries.map((d) => d.eventType).sort()).toEqual(['charge.refunded', 'refund.created']);
    expect(refundDeliveries.every((d) => d.ok)).toBe(true);
    expect(await entriesOf(job.contractId, 'refund.cancellation')).toHaveLength(1);
    expect(await t.db('refunds').where({ contract_id: job.contractId })).toHaveLength(1);
    // the processor kept its fee: clearing is short by it (Stripe refunds docs, published)
    const b = await balances(branchId);
    expect(b[CLEARING]).toBe('-29.30');
    expect(b[DEPOSITS]).toBe('0.00');
    expect(b[FEES]).toBe('29.30');

    const twice = await t.http.post(`/api/contracts/${job.contractId}/refunds`).set(headers).send({});
    expect(twice.body.code).toBe('PAYMENT.NOTHING_TO_REFUND');
  });

  // ---- completion -------------------------------------------------------------------------------

  it('at completion posts the revenue and e-mails the balance link; the balance and the payout post exactly', async () => {
    const handlers = t.app.get<JobCompletedHandler[]>(JOB_COMPLETED_HANDLERS, { strict: false });
    expect(
      handlers.some((h) => h instanceof PaymentsCompletionHandler),
      'registered for completion',
    ).toBe(true);
    const handler = t.app.get(PaymentsCompletionHandler, { strict: false });

    const { branchId, seller } = await office();
    const job = await makeSignedJob(t, { branchId, seller, depositAmount: '1000.00' });
    await payDeposit(seller, job);
    const completedAt = new Date();
    const event = { jobId: job.jobId, contractId: job.contractId, leadId: job.leadId, branchId, completedAt };
    await t.db.transaction((trx) => handler.onJobCompleted(event, trx));

    const done = await t.db('journal_entries').where({ job_id: job.jobId, reason_code: 'job.completed' });
    expect(done).toHaveLength(1);
    expect(await linesOf(done[0].id)).toEqual([
      `${DEPOSITS} debit 1000.00`,
      `${RECEIVABLE} debit 4420.00`,
      `${REVENUE} credit ${PRICE}`,
    ]);
    const request = await t
      .db('payment_requests')
      .where({ contract_id: job.contractId, kind: 'balance' })
      .first();
    expect(request).toMatchObject({ amount: '4420.00', status: 'open' });
    // e-mailed once the completion's transaction has committed
    let mail;
    for (let i = 0; i < 100 && !mail; i++) {
      mail = t.mail.inbox.find((m) => m.to === job.email && /^Balance/.test(m.subject));
      if (!mail) await new Promise((r) => setTimeout(r, 50));
    }
    expect(mail?.text).toContain(request.url);
    expect(mail?.text).toContain('$4,420.00');

    // told twice (a retried completion): still one posting, no second link
    await t.db.transaction((trx) => handler.onJobCompleted(event, trx));
    expect(
      await t.db('journal_entries').where({ job_id: job.jobId, reason_code: 'job.completed' }),
    ).toHaveLength(1);

    expect(fake.pay(sessionIdOf(request.url), SUCCEEDS).outcome).toBe('succeeded');
    await fake.flushDeliveries();
    const bal = await entriesOf(job.contractId, 'balance.card');
    expect(await linesOf(bal[0]!.id)).toEqual([
      `${CLEARING} debit 4291.52`,
      `${FEES} debit 128.48`,
      `${RECEIVABLE} credit 4420.00`,
    ]);
    expect(
      await t.db('payment_requests').where({ contract_id: job.contractId }).whereNot({ status: 'paid' }),
    ).toEqual([]);

    const [payout] = fake.payoutNow();
    expect(payout!.amount).toBe(526_222); // 970.70 + 4291.52
    await fake.flushDeliveries();
    const b = await balances(branchId);
    expect(b).toMatchObject({
      [BANK]: '5262.22',
      [CLEARING]: '0.00',
      [RECEIVABLE]: '0.00',
      [DEPOSITS]: '0.00',
      [FEES]: '157.78',
      [REVENUE]: '-5420.00',
    });
    const stored = await t.db('processor_payouts').where({ processor_payout_id: payout!.id }).first();
    expect(stored).toMatchObject({ amount: '5262.22', status: 'paid' });
    const items = await t.db('processor_payout_items').where({ payout_id: stored.id }).orderBy('amount');
    expect(items.map((i) => [i.type, i.amount, i.fee, i.net])).toEqual([
      ['charge', '1000.00', '29.30', '970.70'],
      ['charge', '4420.00', '128.48', '4291.52'],
    ]);
  });
});
