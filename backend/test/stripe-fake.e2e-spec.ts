// The local card-processor fake, driven through the official stripe SDK the app uses, with a small
// webhook receiver in this process that checks every delivery's signature twice: with the SDK's
// constructEvent and recomputed with node:crypto from the published scheme.
import { createHmac, timingSafeEqual } from 'node:crypto';
import { createServer, type IncomingHttpHeaders, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { cardFee, formatMinor, signatureHeader, startStripeFake, type StripeFake } from '../fakes/stripe';

const SECRET = 'whsec_suite_local_only_0123456789abcdef';
// Tolerance of constructEvent: 300 s; only older timestamps are refused (stripe-node Webhooks.ts, published;
// shared/REFERENCE-VALUES.md "Payment webhooks").
const TOLERANCE = 300;
const SUCCEEDS = '4242 4242 4242 4242'; // Stripe testing docs (published): approved
const DECLINED = '4000 0000 0000 0002'; // Stripe testing docs (published): card_declined / generic_decline

interface Received {
  headers: IncomingHttpHeaders;
  body: string;
  event: Stripe.Event;
  status: number;
  at: number;
}

/** A webhook endpoint: verifies each delivery, records it, answers with whatever `answer` says. */
async function startReceiver(stripe: Stripe) {
  const received: Received[] = [];
  const attemptsByEvent = new Map<string, number>();
  let answer: (eventId: string, attempt: number) => number = () => 200;
  const server: Server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const body = Buffer.concat(chunks).toString('utf8');
      const header = String(req.headers['stripe-signature'] ?? '');
      let event: Stripe.Event;
      try {
        event = stripe.webhooks.constructEvent(body, header, SECRET, TOLERANCE);
      } catch {
        res.statusCode = 400;
        return res.end('bad signature');
      }
      const attempt = (attemptsByEvent.get(event.id) ?? 0) + 1;
      attemptsByEvent.set(event.id, attempt);
      const status = answer(event.id, attempt);
      received.push({ headers: req.headers, body, event, status, at: Date.now() });
      res.statusCode = status;
      res.end();
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return {
    url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/payments/webhook`,
    received,
    answerWith(fn: typeof answer) {
      answer = fn;
    },
    reset() {
      received.length = 0;
      attemptsByEvent.clear();
      answer = () => 200;
    },
    /** Deliveries answered 2xx, in arrival order. */
    accepted: () => received.filter((r) => r.status < 300),
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/** The published scheme by hand: HMAC-SHA256 keyed with the whole secret over "<t>.<body>". */
function recompute(header: string, body: string, secret: string) {
  const parts = Object.fromEntries(header.split(',').map((kv) => kv.split('=') as [string, string]));
  const expected = createHmac('sha256', secret).update(`${parts.t}.${body}`, 'utf8').digest('hex');
  return { t: Number(parts.t), v1: parts.v1, expected };
}

describe('local card-processor fake', () => {
  let fake: StripeFake;
  let stripe: Stripe;
  let receiver: Awaited<ReturnType<typeof startReceiver>>;
  const defaults = { duplicate: 1, shuffle: false, paused: false, seed: 7, retryBaseMs: 20, maxAttempts: 5 };

  beforeAll(async () => {
    // The receiver needs an SDK instance for constructEvent only; it never calls the API.
    receiver = await startReceiver(new Stripe('sk_test_receiver_unused'));
    fake = await startStripeFake({ port: 0, webhookUrl: receiver.url, webhookSecret: SECRET, ...defaults });
    stripe = new Stripe('sk_test_local_suite', {
      host: '127.0.0.1',
      port: fake.port,
      protocol: 'http',
      maxNetworkRetries: 0,
    });
  });

  afterAll(async () => {
    await fake?.close();
    await receiver?.close();
  });

  beforeEach(async () => {
    await fake.reset();
    fake.configure({ ...defaults, webhookUrl: receiver.url, webhookSecret: SECRET });
    receiver.reset();
  });

  const createSession = (unitAmount: number, metadata: Record<string, string> = { contractId: 'ct-0001' }) =>
    stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [
        {
          price_data: {
            currency: 'usd',
            unit_amount: unitAmount,
            product_data: { name: 'Deposit, contract C-0001' },
          },
          quantity: 1,
        },
      ],
      success_url: 'http://loambook.test/pay/done?session={CHECKOUT_SESSION_ID}',
      cancel_url: 'http://loambook.test/pay/cancelled',
      customer_email: 'pat.ferrow@example.com',
      metadata,
      payment_intent_data: { metadata },
    });

  const control = (path: string, body: unknown = {}) =>
    fetch(`${fake.url}/_fake${path}`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify(body),
    });

  const postForm = (url: string, form: Record<string, string>) =>
    fetch(url, {
      method: 'POST',
      headers: { 'Content-Type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams(form).toString(),
      redirect: 'manual',
    });

  /** Creates a session for `amount` and pays it with the approved test card; returns the payment intent id. */
  async function paid(amount: number): Promise<string> {
    const session = await createSession(amount);
    const res = await control(`/checkout/${session.id}/pay`, { card: SUCCEEDS });
    expect(res.status).toBe(200);
    return ((await res.json()) as { payment_intent: { id: string } }).payment_intent.id;
  }

  describe('the fee rule', () => {
    // 2.9% + 30¢ per successful card charge, Stripe's standard US pricing (published pricing page, memory);
    // the percentage rounded half up to a cent (memory).
    it.each([
      [100_000, 2_930], // $1,000.00 → $29.30 (29.00 + 0.30)
      [25_000, 755], // $250.00 → $7.55 (7.25 + 0.30)
      [1_000, 59], // $10.00 → $0.59
      [1_234, 66], // $12.34 → 35.786¢ rounds to 36¢, + 30¢
      [500, 45], // $5.00 → 14.5¢ rounds half up to 15¢, + 30¢
      [50, 31], // $0.50, the smallest charge → 1.45¢ rounds to 1¢, + 30¢
    ])('a charge of %i cents costs %i cents', (amount, fee) => {
      expect(cardFee(amount)).toBe(fee);
    });

    it('formats minor units without fractions of a number', () => {
      expect(formatMinor(100_000, 'usd')).toBe('$1,000.00');
      expect(formatMinor(5, 'usd')).toBe('$0.05');
      expect(formatMinor(123_456_789, 'eur')).toBe('1,234,567.89 EUR');
      expect(formatMinor(5000, 'jpy')).toBe('5,000 JPY');
    });
  });

  describe('the API through the SDK', () => {
    it('refuses requests without a secret test key', async () => {
      const res = await fetch(`${fake.url}/v1/checkout/sessions/cs_test_x`);
      expect(res.status).toBe(401);
      expect(((await res.json()) as { error: { type: string } }).error.type).toBe('invalid_request_error');
      const live = new Stripe('sk_live_not_here', { host: '127.0.0.1', port: fake.port, protocol: 'http' });
      await expect(live.payouts.list()).rejects.toMatchObject({
        type: 'StripeAuthenticationError',
        statusCode: 401,
      });
    });

    it('creates a Checkout Session shaped like the real one, with its own payment page', async () => {
      const session = await createSession(100_000);
      expect(session).toMatchObject({
        object: 'checkout.session',
        mode: 'payment',
        status: 'open',
        payment_status: 'unpaid',
        amount_total: 100_000,
        currency: 'usd',
        customer_email: 'pat.ferrow@example.com',
        metadata: { contractId: 'ct-0001' },
        payment_intent: null,
        livemode: false,
      });
      expect(session.id).toMatch(/^cs_test_\w+$/);
      expect(session.url).toBe(`${fake.url}/pay/${session.id}`);
      expect(session.expires_at - session.created).toBe(86_400);
      const again = await stripe.checkout.sessions.retrieve(session.id, { expand: ['line_items'] });
      expect(again.line_items?.data).toEqual([
        expect.objectContaining({
          description: 'Deposit, contract C-0001',
          quantity: 1,
          amount_total: 100_000,
        }),
      ]);
    });

    it('answers errors in the API shape with the right status', async () => {
      await expect(stripe.checkout.sessions.retrieve('cs_test_nothing')).rejects.toMatchObject({
        type: 'StripeInvalidRequestError',
        statusCode: 404,
        code: 'resource_missing',
      });
      await expect(
        stripe.checkout.sessions.create({
          mode: 'payment',
          line_items: [
            { price_data: { currency: 'usd', unit_amount: 1000, product_data: { name: 'x' } }, quantity: 1 },
          ],
        } as Stripe.Checkout.SessionCreateParams),
      ).rejects.toMatchObject({ statusCode: 400, code: 'parameter_missing', param: 'success_url' });
      // The smallest charge is 50 cents in USD (Stripe API reference, memory).
      await expect(createSession(49)).rejects.toMatchObject({ statusCode: 400, code: 'amount_too_small' });
      await expect(createSession(50)).resolves.toMatchObject({ amount_total: 50 });
    });

    it('replays the first answer for a repeated Idempotency-Key', async () => {
      const params = {
        mode: 'payment' as const,
        line_items: [
          {
            price_data: { currency: 'usd', unit_amount: 5000, product_data: { name: 'Deposit' } },
            quantity: 2,
          },
        ],
        success_url: 'http://loambook.test/ok',
      };
      const a = await stripe.checkout.sessions.create(params, { idempotencyKey: 'deposit-ct-0002' });
      const b = await stripe.checkout.sessions.create(params, { idempotencyKey: 'deposit-ct-0002' });
      expect(b.id).toBe(a.id);
      expect(a.amount_total).toBe(10_000);
      await expect(
        stripe.checkout.sessions.create(
          { ...params, success_url: 'http://loambook.test/other' },
          { idempotencyKey: 'deposit-ct-0002' },
        ),
      ).rejects.toMatchObject({ type: 'StripeIdempotencyError', statusCode: 400 });
    });

    it('pays $1,000.00 with the approved card: charge, fee $29.30 and net $970.70 in the balance transaction', async () => {
      const session = await createSession(100_000);
      const piId = await (async () => {
        const res = await control(`/checkout/${session.id}/pay`, { card: SUCCEEDS, name: 'Pat Ferrow' });
        return ((await res.json()) as { payment_intent: { id: string } }).payment_intent.id;
      })();
      const done = await stripe.checkout.sessions.retrieve(session.id, {
        expand: ['payment_intent.latest_charge.balance_transaction'],
      });
      expect(done).toMatchObject({ status: 'complete', payment_status: 'paid', url: null });
      const pi = done.payment_intent as Stripe.PaymentIntent;
      expect(pi).toMatchObject({ id: piId, status: 'succeeded', amount: 100_000, amount_received: 100_000 });
      expect(pi.metadata).toEqual({ contractId: 'ct-0001' });
      const charge = pi.latest_charge as Stripe.Charge;
      expect(charge).toMatchObject({
        object: 'charge',
        paid: true,
        captured: true,
        amount_refunded: 0,
        status: 'succeeded',
      });
      expect(charge.id).toMatch(/^ch_/);
      expect(charge.payment_method_details?.card?.last4).toBe('4242');
      const txn = charge.balance_transaction as Stripe.BalanceTransaction;
      // $1,000.00 at 2.9% + 30¢ (published pricing page, memory): fee $29.30, net $970.70.
      expect(txn).toMatchObject({
        object: 'balance_transaction',
        type: 'charge',
        amount: 100_000,
        fee: 2_930,
        net: 97_070,
        currency: 'usd',
        source: charge.id,
        status: 'pending',
      });
      expect(txn.id).toMatch(/^txn_/);
      expect(txn.fee_details).toEqual([expect.objectContaining({ type: 'stripe_fee', amount: 2_930 })]);
      expect(txn.available_on).toBeGreaterThan(txn.created);
      // The same objects one by one.
      expect((await stripe.paymentIntents.retrieve(piId)).latest_charge).toBe(charge.id);
      expect((await stripe.charges.retrieve(charge.id)).balance_transaction).toBe(txn.id);
      expect((await stripe.balanceTransactions.retrieve(txn.id)).net).toBe(97_070);
      // A complete session cannot be paid again.
      expect((await control(`/checkout/${session.id}/pay`, { card: SUCCEEDS })).status).toBe(400);

      await fake.flushDeliveries();
      expect(receiver.accepted().map((r) => r.event.type)).toEqual([
        'payment_intent.created',
        'charge.succeeded',
        'payment_intent.succeeded',
        'checkout.session.completed',
      ]);
      const completed = receiver.accepted()[3].event.data.object as Stripe.Checkout.Session;
      expect(completed).toMatchObject({
        id: session.id,
        payment_intent: piId,
        metadata: { contractId: 'ct-0001' },
      });
    });

    it('declines 4000 0000 0000 0002 with card_declined / generic_decline and keeps the session open', async () => {
      const session = await createSession(100_000);
      const res = await control(`/checkout/${session.id}/pay`, { card: DECLINED });
      expect(res.status).toBe(402);
      const body = (await res.json()) as {
        error: { code: string; decline_code: string };
        payment_intent: { id: string };
      };
      expect(body.error).toMatchObject({ code: 'card_declined', decline_code: 'generic_decline' });
      const pi = await stripe.paymentIntents.retrieve(body.payment_intent.id);
      expect(pi.status).toBe('requires_payment_method');
      expect(pi.last_payment_error).toMatchObject({
        type: 'card_error',
        code: 'card_declined',
        decline_code: 'generic_decline',
      });
      const charge = await stripe.charges.retrieve(pi.latest_charge as string);
      expect(charge).toMatchObject({
        status: 'failed',
        paid: false,
        failure_code: 'card_declined',
        balance_transaction: null,
      });
      expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
      expect((await stripe.balanceTransactions.list()).data).toEqual([]);
      await fake.flushDeliveries();
      expect(receiver.accepted().map((r) => r.event.type)).toEqual([
        'payment_intent.created',
        'charge.failed',
        'payment_intent.payment_failed',
      ]);
      // Trying again with the approved card succeeds on the same payment intent.
      const retry = (await (await control(`/checkout/${session.id}/pay`, { card: SUCCEEDS })).json()) as {
        payment_intent: { id: string; status: string };
      };
      expect(retry.payment_intent).toMatchObject({ id: pi.id, status: 'succeeded' });
    });

    it('expires an open session; its page then says so', async () => {
      const session = await createSession(20_000);
      const expired = await stripe.checkout.sessions.expire(session.id);
      expect(expired).toMatchObject({ status: 'expired', url: null });
      await expect(stripe.checkout.sessions.expire(session.id)).rejects.toMatchObject({ statusCode: 400 });
      const page = await fetch(`${fake.url}/pay/${session.id}`);
      expect(page.status).toBe(410);
      expect(await page.text()).toContain('expired');
      const events = await stripe.events.list({ type: 'checkout.session.expired' });
      expect(events.data.map((e) => (e.data.object as Stripe.Checkout.Session).id)).toEqual([session.id]);
    });

    it('refunds in part and in full, each with a negative balance transaction', async () => {
      const piId = await paid(100_000);
      const part = await stripe.refunds.create({
        payment_intent: piId,
        amount: 25_000,
        reason: 'requested_by_customer',
      });
      expect(part).toMatchObject({
        object: 'refund',
        amount: 25_000,
        status: 'succeeded',
        payment_intent: piId,
      });
      expect(part.id).toMatch(/^re_/);
      const partTxn = await stripe.balanceTransactions.retrieve(part.balance_transaction as string);
      expect(partTxn).toMatchObject({
        type: 'refund',
        amount: -25_000,
        fee: 0,
        net: -25_000,
        source: part.id,
      });
      let charge = await stripe.charges.retrieve(part.charge as string);
      expect(charge).toMatchObject({ amount_refunded: 25_000, refunded: false });

      const rest = await stripe.refunds.create({ charge: charge.id }); // no amount: the rest
      expect(rest.amount).toBe(75_000);
      expect((await stripe.refunds.retrieve(rest.id)).charge).toBe(charge.id);
      charge = await stripe.charges.retrieve(charge.id);
      expect(charge).toMatchObject({ amount_refunded: 100_000, refunded: true });
      await expect(stripe.refunds.create({ charge: charge.id })).rejects.toMatchObject({
        statusCode: 400,
        code: 'charge_already_refunded',
      });
      const piId2 = await paid(10_000);
      await expect(stripe.refunds.create({ payment_intent: piId2, amount: 10_001 })).rejects.toMatchObject({
        statusCode: 400,
        code: 'amount_too_large',
      });
      expect((await stripe.refunds.list({ charge: charge.id })).data.map((r) => r.id)).toEqual([
        rest.id,
        part.id,
      ]);
    });

    it('pays out the net of charges less refunds and lists the transactions inside the payout', async () => {
      const first = await paid(100_000); // fee 2,930 → net 97,070
      const second = await paid(25_000); // fee 755 → net 24,245
      await stripe.refunds.create({ payment_intent: second, amount: 10_000 }); // net −10,000
      expect((await stripe.balance.retrieve()).pending).toEqual([
        expect.objectContaining({ currency: 'usd', amount: 111_315 }),
      ]);

      const res = await control('/payouts');
      const { data: payouts } = (await res.json()) as { data: Stripe.Payout[] };
      // 97,070 + 24,245 − 10,000 = 111,315 cents = $1,113.15 (sums of the fee rule above).
      expect(payouts).toHaveLength(1);
      const payout = await stripe.payouts.retrieve(payouts[0].id);
      expect(payout).toMatchObject({
        object: 'payout',
        amount: 111_315,
        currency: 'usd',
        status: 'paid',
        automatic: true,
      });
      expect(payout.id).toMatch(/^po_/);
      expect(payout.arrival_date % 86_400).toBe(0);
      expect(payout.arrival_date).toBeGreaterThan(payout.created);

      const inside = await stripe.balanceTransactions.list({ payout: payout.id, limit: 100 });
      expect(inside.data.map((t) => t.type).sort()).toEqual(['charge', 'charge', 'payout', 'refund']);
      const swept = inside.data.filter((t) => t.type !== 'payout');
      expect(swept.reduce((sum, t) => sum + t.net, 0)).toBe(payout.amount);
      expect(swept.every((t) => t.status === 'available')).toBe(true);
      const own = inside.data.find((t) => t.type === 'payout')!;
      expect(own).toMatchObject({ id: payout.balance_transaction, amount: -111_315, source: payout.id });
      const charges = await stripe.balanceTransactions.list({ payout: payout.id, type: 'charge' });
      const firstCharge = (await stripe.paymentIntents.retrieve(first)).latest_charge;
      expect(charges.data.map((t) => t.source)).toContain(firstCharge);
      expect(charges.data).toHaveLength(2);

      // Pages of 2 follow starting_after through the SDK's auto-pagination.
      const paged = await stripe.balanceTransactions
        .list({ payout: payout.id, limit: 2 })
        .autoPagingToArray({ limit: 10 });
      expect(paged.map((t) => t.id)).toEqual(inside.data.map((t) => t.id));
      expect((await stripe.balanceTransactions.list({ payout: payout.id, limit: 2 })).has_more).toBe(true);

      // Nothing is paid out twice: the next payout waits for new money.
      expect(fake.payoutNow()).toEqual([]);
      await paid(5_000); // fee 175 → net 4,825
      const [next] = fake.payoutNow();
      expect(next.amount).toBe(4_825);
      expect((await stripe.payouts.list()).data.map((p) => p.id)).toEqual([next.id, payout.id]);
      await expect(stripe.balanceTransactions.list({ payout: 'po_nothing' })).rejects.toMatchObject({
        statusCode: 404,
      });

      await fake.flushDeliveries();
      expect(
        receiver
          .accepted()
          .filter((r) => r.event.type.startsWith('payout.'))
          .map((r) => r.event.type),
      ).toEqual(['payout.created', 'payout.paid', 'payout.created', 'payout.paid']);
    });

    it('lists and retrieves events newest first', async () => {
      await paid(30_000);
      const events = await stripe.events.list({ limit: 3 });
      expect(events.object).toBe('list');
      expect(events.url).toBe('/v1/events');
      expect(events.has_more).toBe(true);
      expect(events.data.map((e) => e.type)).toEqual([
        'checkout.session.completed',
        'payment_intent.succeeded',
        'charge.succeeded',
      ]);
      const one = await stripe.events.retrieve(events.data[0].id);
      expect(one).toMatchObject({ object: 'event', livemode: false, api_version: Stripe.API_VERSION });
      expect(one.id).toMatch(/^evt_/);
      expect((await stripe.events.list({ types: ['payment_intent.created'] })).data).toHaveLength(1);
    });
  });

  describe('the hosted payment page (no browser: fetch and a form post)', () => {
    it('shows the amount and description, labels every input and says it is a stand-in', async () => {
      const session = await createSession(100_000);
      const res = await fetch(session.url!);
      expect(res.status).toBe(200);
      expect(res.headers.get('content-type')).toContain('text/html');
      const html = await res.text();
      expect(html).toContain('$1,000.00');
      expect(html).toContain('Deposit, contract C-0001');
      expect(html).toContain('Local test stand-in');
      const inputs = [...html.matchAll(/<input id="(\w+)"/g)].map((m) => m[1]);
      expect(inputs.sort()).toEqual(['cvc', 'expiry', 'name', 'number']);
      for (const id of inputs) expect(html).toContain(`<label for="${id}">`);
      expect(html).toContain(`action="/pay/${session.id}"`);
    });

    it('shows field errors, then the decline on the page, then redirects to success_url', async () => {
      const session = await createSession(100_000);
      const blank = await postForm(session.url!, {
        number: '4242 4242 4242 4241',
        expiry: '13 / 30',
        cvc: '',
        name: '',
      });
      expect(blank.status).toBe(400);
      const blankHtml = await blank.text();
      expect(blankHtml).toContain('This card number is not valid.');
      expect(blankHtml).toContain('The month must be 01 to 12.');
      expect(blankHtml).toContain('Enter the security code.');
      expect(blankHtml).toContain('aria-invalid="true"');
      expect(fake.state.paymentIntents.size).toBe(0);

      const card = { expiry: '12 / 34', cvc: '123', name: 'Pat Ferrow' };
      const declined = await postForm(session.url!, { ...card, number: DECLINED });
      expect(declined.status).toBe(402);
      expect(await declined.text()).toContain('Your card was declined.');
      await fake.flushDeliveries();
      expect(receiver.accepted().map((r) => r.event.type)).toContain('payment_intent.payment_failed');

      const ok = await postForm(session.url!, { ...card, number: SUCCEEDS });
      expect(ok.status).toBe(303);
      expect(ok.headers.get('location')).toBe(`http://loambook.test/pay/done?session=${session.id}`);
      expect((await stripe.checkout.sessions.retrieve(session.id)).payment_status).toBe('paid');
      const after = await fetch(session.url!);
      expect(await after.text()).toContain('This payment is complete');
    });
  });

  describe('signed webhook deliveries', () => {
    it('signs each delivery so constructEvent and a node:crypto recomputation both accept it', async () => {
      await paid(100_000);
      await fake.flushDeliveries();
      expect(receiver.accepted()).toHaveLength(4);
      for (const r of receiver.accepted()) {
        const header = String(r.headers['stripe-signature']);
        expect(header).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
        const { t, v1, expected } = recompute(header, r.body, SECRET);
        expect(timingSafeEqual(Buffer.from(v1, 'hex'), Buffer.from(expected, 'hex'))).toBe(true);
        expect(Math.abs(Date.now() / 1000 - t)).toBeLessThan(60);
        expect(r.headers['content-type']).toContain('application/json');
        const event = stripe.webhooks.constructEvent(r.body, header, SECRET);
        expect(event).toMatchObject({ object: 'event', livemode: false, pending_webhooks: 1 });
        expect(event.request).toEqual({ id: null, idempotency_key: null });
      }
      // The fake's helper and the SDK's own test header agree with the hand computation.
      const body = receiver.accepted()[0].body;
      const t = Math.floor(Date.now() / 1000);
      expect(signatureHeader(body, SECRET, t)).toBe(
        stripe.webhooks.generateTestHeaderString({ payload: body, secret: SECRET, timestamp: t }),
      );
      expect(fake.state.events.get(receiver.accepted()[0].event.id)?.pending_webhooks).toBe(0);
    });

    it('fails constructEvent for an altered body, a wrong secret, or a stale or missing signature', async () => {
      await paid(10_000);
      await fake.flushDeliveries();
      const { body, headers } = receiver.accepted()[3];
      const header = String(headers['stripe-signature']);
      const now = Math.floor(Date.now() / 1000);
      const verify =
        (b: string, h: string, secret = SECRET) =>
        () =>
          stripe.webhooks.constructEvent(b, h, secret, TOLERANCE);
      expect(verify(body, header)).not.toThrow();
      expect(verify(body.replace('"amount_total": 10000', '"amount_total": 1000000'), header)).toThrow(
        Stripe.errors.StripeSignatureVerificationError,
      );
      expect(verify(body, header, 'whsec_someone_else')).toThrow(
        Stripe.errors.StripeSignatureVerificationError,
      );
      // A correct signature made 301 s ago is stale; 299 s ago is still inside the 300 s tolerance.
      expect(verify(body, signatureHeader(body, SECRET, now - 301))).toThrow(/tolerance/);
      expect(verify(body, signatureHeader(body, SECRET, now - 299))).not.toThrow();
      expect(verify(body, '')).toThrow(Stripe.errors.StripeSignatureVerificationError);
      expect(verify(body, `t=${now}`)).toThrow(/No signatures found/);
      // Several v1 signatures: one match is enough (published scheme).
      const good = signatureHeader(body, SECRET, now);
      expect(verify(body, `${good},v1=${'0'.repeat(64)}`)).not.toThrow();
    });

    it('retries a 500 with exponential back-off until the receiver answers 200', async () => {
      receiver.answerWith((_id, attempt) => (attempt <= 2 ? 500 : 200));
      fake.configure({ paused: true }); // so that the flush below makes every attempt
      await paid(10_000);
      const result = await fake.flushDeliveries();
      expect(result).toEqual({ delivered: 4, failed: 0, attempts: 12, pending: 0 });
      for (const eventId of new Set(receiver.received.map((r) => r.event.id))) {
        const tries = receiver.received.filter((r) => r.event.id === eventId);
        expect(tries.map((r) => r.status)).toEqual([500, 500, 200]);
        const log = fake.deliveries.filter((d) => d.eventId === eventId);
        expect(log.map((d) => [d.attempt, d.status, d.outcome])).toEqual([
          [1, 500, 'retry'],
          [2, 500, 'retry'],
          [3, 200, 'delivered'],
        ]);
        // Back-off of retryBaseMs × 2^(n−1): ≥ 20 ms before the 2nd try, ≥ 40 ms before the 3rd.
        expect(log[1].at - log[0].at).toBeGreaterThanOrEqual(20);
        expect(log[2].at - log[1].at).toBeGreaterThanOrEqual(40);
      }
      const listed = (await (await fetch(`${fake.url}/_fake/deliveries`)).json()) as { data: unknown[] };
      expect(listed.data).toHaveLength(12);
    });

    it('retries a connection error, gives up after maxAttempts, and redelivers on request', async () => {
      // A port that was free a moment ago: nothing listens there, so every attempt is refused.
      const probe = createServer();
      await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', resolve));
      const closedPort = (probe.address() as AddressInfo).port;
      await new Promise<void>((resolve) => probe.close(() => resolve()));
      fake.configure({
        webhookUrl: `http://127.0.0.1:${closedPort}/refused`,
        maxAttempts: 3,
        retryBaseMs: 5,
        paused: true,
      });
      const session = await createSession(10_000);
      await stripe.checkout.sessions.expire(session.id); // one event
      const result = await fake.flushDeliveries();
      expect(result).toMatchObject({ delivered: 0, failed: 1, attempts: 3, pending: 0 });
      expect(fake.deliveries.map((d) => [d.status, d.outcome])).toEqual([
        [null, 'retry'],
        [null, 'retry'],
        [null, 'gave_up'],
      ]);
      expect(fake.deliveries[0].error).toMatch(/ECONNREFUSED/);
      fake.configure({ webhookUrl: receiver.url });
      expect(await (await control('/redeliver')).json()).toEqual({ queued: 1 });
      expect((await (await control('/deliver')).json()) as object).toMatchObject({ delivered: 1 });
      expect(receiver.accepted().map((r) => r.event.type)).toEqual(['checkout.session.expired']);
      // An event caused by an API request names it.
      expect(receiver.accepted()[0].event.request?.id).toMatch(/^req_/);
    });

    it('duplicate mode sends every event the configured number of times', async () => {
      await control('/config', { duplicate: 3 });
      await paid(10_000);
      await fake.flushDeliveries();
      const ids = receiver.accepted().map((r) => r.event.id);
      expect(ids).toHaveLength(12);
      const unique = [...new Set(ids)];
      expect(unique).toHaveLength(4);
      for (const id of unique) {
        const copies = receiver.accepted().filter((r) => r.event.id === id);
        expect(copies).toHaveLength(3);
        expect(new Set(copies.map((c) => c.body)).size).toBe(1);
      }
    });

    it('shuffle mode delivers a paused batch in a random order that its seed replays', async () => {
      const orderFor = async (seed: number) => {
        await fake.reset();
        receiver.reset();
        fake.configure({ shuffle: true, seed, paused: true });
        for (let i = 0; i < 4; i++) await paid(10_000 + i * 100);
        expect(receiver.received).toHaveLength(0); // paused: nothing goes out
        const created = [...fake.state.events.keys()];
        await fake.flushDeliveries();
        return receiver.accepted().map((r) => created.indexOf(r.event.id));
      };
      const a = await orderFor(11);
      expect([...a].sort((x, y) => x - y)).toEqual([...Array(16).keys()]); // every event, once
      expect(a).not.toEqual([...Array(16).keys()]); // not in creation order
      expect(await orderFor(11)).toEqual(a); // the same seed, the same order
      expect(await orderFor(12)).not.toEqual(a);
    });

    it('checks settings and forgets everything on reset through the control endpoints', async () => {
      expect((await control('/config', { duplicate: 0 })).status).toBe(400);
      expect((await control('/config', { webhookSecret: 'not-a-secret' })).status).toBe(400);
      expect((await control('/config', { colour: 'green' })).status).toBe(400);
      const config = (await (await fetch(`${fake.url}/_fake/config`)).json()) as Record<string, unknown>;
      expect(config).toMatchObject({
        webhookUrl: receiver.url,
        webhookSecret: SECRET,
        duplicate: 1,
        retryBaseMs: 20,
      });
      await paid(10_000);
      expect((await stripe.checkout.sessions.list()).data).toHaveLength(1);
      expect((await control('/reset')).status).toBe(200);
      expect((await stripe.checkout.sessions.list()).data).toHaveLength(0);
      expect((await stripe.events.list()).data).toHaveLength(0);
      expect(fake.deliveries).toHaveLength(0);
    });

    it('holds deliveries while paused and sends them on resume', async () => {
      fake.configure({ paused: true });
      await paid(10_000);
      await new Promise((r) => setTimeout(r, 50));
      expect(receiver.received).toHaveLength(0);
      const config = (await (await control('/config', { paused: false })).json()) as { paused: boolean };
      expect(config.paused).toBe(false);
      for (let i = 0; i < 100 && receiver.accepted().length < 4; i++)
        await new Promise((r) => setTimeout(r, 20));
      expect(receiver.accepted()).toHaveLength(4);
    });
  });
});
