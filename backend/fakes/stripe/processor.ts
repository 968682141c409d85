// What the processor does with money: Checkout Sessions, payments with their charges and balance
// transactions, refunds, payouts of everything not yet paid out, and an event for every change.
import { validateCard, type ValidCard } from './cards';
import { ApiError, invalid, missing } from './errors';
import { newId } from './ids';
import { cardFee } from './money';
import type { CardForm, FieldErrors } from './page';
import {
  metadata,
  optArray,
  optInteger,
  optObject,
  optString,
  reqInteger,
  reqString,
  type Params,
} from './params';
import { FakeState } from './state';
import type {
  BalanceTransaction,
  Charge,
  CheckoutSession,
  FakeEvent,
  LineItem,
  PaymentError,
  PaymentIntent,
  Payout,
  Refund,
} from './types';

/** Who caused a change: the API request (its id and Idempotency-Key) or nobody (the hosted page, a schedule). */
export interface Cause {
  requestId: string | null;
  idempotencyKey: string | null;
}

export const NO_REQUEST: Cause = { requestId: null, idempotencyKey: null };

const DAY = 86_400;

/** Smallest charge: 50 cents in USD (Stripe API reference, "minimum and maximum charge amounts", memory). */
const MINIMUM_CHARGE = 50;

export type PayResult =
  | {
      outcome: 'succeeded';
      session: CheckoutSession;
      paymentIntent: PaymentIntent;
      charge: Charge;
      balanceTransaction: BalanceTransaction;
    }
  | {
      outcome: 'declined';
      session: CheckoutSession;
      paymentIntent: PaymentIntent;
      charge: Charge;
      error: PaymentError;
    }
  | { outcome: 'invalid'; session: CheckoutSession; errors: FieldErrors };

export class Processor {
  constructor(
    readonly state: FakeState,
    private readonly baseUrl: () => string,
    /** Unix seconds, on the fake's clock (which can be moved for tests). */
    readonly now: () => number,
    private readonly apiVersion: string,
    private readonly publish: (event: FakeEvent) => boolean,
  ) {}

  emit(type: string, object: unknown, cause: Cause): FakeEvent {
    const event: FakeEvent = {
      id: newId('evt'),
      object: 'event',
      api_version: this.apiVersion,
      created: this.now(),
      data: { object: structuredClone(object) },
      livemode: false,
      // One endpoint to deliver to, if any: the delivered body says 1, and the stored event 0 once it is.
      pending_webhooks: 1,
      request: { id: cause.requestId, idempotency_key: cause.idempotencyKey },
      type,
    };
    this.state.events.set(event.id, event);
    if (!this.publish(event)) event.pending_webhooks = 0;
    return event;
  }

  // ── Checkout Sessions ────────────────────────────────────────────────────────────────────────────

  createCheckoutSession(params: Params, _cause: Cause): CheckoutSession {
    const mode = reqString(params, 'mode');
    if (mode !== 'payment')
      throw invalid(
        'mode',
        `The local fake supports mode=payment only (got ${mode}).`,
        'parameter_invalid_string',
      );
    const successUrl = reqString(params, 'success_url');
    const rawItems = optArray(params, 'line_items');
    if (!rawItems || rawItems.length === 0) throw missing('line_items');
    if (rawItems.length > 100)
      throw invalid('line_items', 'A Checkout Session takes at most 100 line items.');
    const sessionId = newId('cs_test', 58);
    const items = rawItems.map((raw, i) => this.lineItem(raw, `line_items[${i}]`));
    const currency = items[0].currency;
    if (items.some((it) => it.currency !== currency))
      throw invalid('line_items', 'All line items must be in the same currency.', 'parameter_invalid_string');
    const total = items.reduce((sum, it) => sum + it.amount_total, 0);
    if (total < MINIMUM_CHARGE)
      throw new ApiError(
        400,
        'invalid_request_error',
        'The Checkout Session total must be at least 50 cents.',
        'amount_too_small',
        'line_items',
      );
    const piData = optObject(params, 'payment_intent_data') ?? {};
    const created = this.now();
    const expiresAt = optInteger(params, 'expires_at') ?? created + DAY;
    if (expiresAt < created + 30 * 60 || expiresAt > created + DAY)
      throw invalid(
        'expires_at',
        'expires_at must be between 30 minutes and 24 hours from now.',
        'parameter_invalid_integer',
      );
    const session: CheckoutSession = {
      id: sessionId,
      object: 'checkout.session',
      amount_subtotal: total,
      amount_total: total,
      cancel_url: optString(params, 'cancel_url') ?? null,
      client_reference_id: optString(params, 'client_reference_id') ?? null,
      created,
      currency,
      customer_details: null,
      customer_email: optString(params, 'customer_email') ?? null,
      expires_at: expiresAt,
      livemode: false,
      metadata: metadata(params),
      mode: 'payment',
      payment_intent: null,
      payment_method_types: ['card'],
      payment_status: 'unpaid',
      status: 'open',
      success_url: successUrl,
      url: `${this.baseUrl()}/pay/${sessionId}`,
    };
    this.state.checkoutSessions.set(session.id, session);
    this.state.lineItems.set(session.id, items);
    this.pendingIntentData.set(session.id, {
      metadata: metadata(piData, 'metadata', 'payment_intent_data[metadata]'),
      description: optString(piData, 'description', 'payment_intent_data[description]') ?? null,
    });
    return session;
  }

  /** payment_intent_data, kept until the first payment attempt creates the PaymentIntent. */
  private readonly pendingIntentData = new Map<
    string,
    { metadata: Record<string, string>; description: string | null }
  >();

  private lineItem(raw: unknown, path: string): LineItem {
    if (typeof raw !== 'object' || raw === null) throw invalid(path, `Invalid object: ${path}`);
    const p = raw as Params;
    const quantity = optInteger(p, 'quantity', `${path}[quantity]`) ?? 1;
    if (quantity < 1)
      throw invalid(`${path}[quantity]`, 'quantity must be at least 1.', 'parameter_invalid_integer');
    let currency: string;
    let unitAmount: number;
    let name: string;
    const priceData = optObject(p, 'price_data', `${path}[price_data]`);
    if (priceData) {
      currency = reqString(priceData, 'currency', `${path}[price_data][currency]`).toLowerCase();
      unitAmount = reqInteger(priceData, 'unit_amount', `${path}[price_data][unit_amount]`);
      const product = optObject(priceData, 'product_data', `${path}[price_data][product_data]`);
      if (!product) throw missing(`${path}[price_data][product_data]`);
      name = reqString(product, 'name', `${path}[price_data][product_data][name]`);
    } else if (p.price !== undefined) {
      throw invalid(
        `${path}[price]`,
        'The local fake has no Prices: pass price_data instead.',
        'resource_missing',
      );
    } else {
      // The older inline form: amount, currency and name on the line item itself.
      currency = reqString(p, 'currency', `${path}[currency]`).toLowerCase();
      unitAmount = reqInteger(p, 'amount', `${path}[amount]`);
      name = reqString(p, 'name', `${path}[name]`);
    }
    if (unitAmount < 0) throw invalid(path, 'unit_amount must be zero or more.', 'parameter_invalid_integer');
    if (!/^[a-z]{3}$/.test(currency))
      throw invalid(`${path}`, `Invalid currency: ${currency}`, 'parameter_invalid_string');
    const total = unitAmount * quantity;
    return {
      id: newId('li'),
      object: 'item',
      amount_discount: 0,
      amount_subtotal: total,
      amount_tax: 0,
      amount_total: total,
      currency,
      description: name,
      price: {
        id: newId('price'),
        object: 'price',
        currency,
        unit_amount: unitAmount,
        product: newId('prod', 14),
        type: 'one_time',
      },
      quantity,
    };
  }

  /** The session, expired first when its expires_at has passed on the fake's clock. */
  session(id: string): CheckoutSession {
    const session = this.state.get(this.state.checkoutSessions, 'checkout.session', id);
    if (session.status === 'open' && this.now() >= session.expires_at) this.markExpired(session, NO_REQUEST);
    return session;
  }

  expireCheckoutSession(id: string, cause: Cause): CheckoutSession {
    const session = this.session(id);
    if (session.status !== 'open')
      throw new ApiError(
        400,
        'invalid_request_error',
        `Only Checkout Sessions with a status in ["open"] can be expired (this one is ${session.status}).`,
      );
    this.markExpired(session, cause);
    return session;
  }

  private markExpired(session: CheckoutSession, cause: Cause): void {
    session.status = 'expired';
    session.url = null;
    this.emit('checkout.session.expired', session, cause);
  }

  // ── Payments ─────────────────────────────────────────────────────────────────────────────────────

  /** A payment attempt on an open session, from the hosted page or the pay control endpoint. */
  pay(sessionId: string, form: Partial<CardForm>, cause: Cause = NO_REQUEST): PayResult {
    const session = this.session(sessionId);
    if (session.status !== 'open')
      throw new ApiError(
        400,
        'invalid_request_error',
        `This Checkout Session is ${session.status}; it can no longer be paid.`,
        session.status === 'complete' ? 'checkout_session_complete' : 'checkout_session_expired',
      );
    const checked = validateCard(form, new Date(this.now() * 1000));
    if (!checked.ok) return { outcome: 'invalid', session, errors: checked.errors };
    const card = checked.card;
    const pi = this.intentFor(session, cause);
    const charge = this.newCharge(session, pi, card);
    if (card.test.outcome === 'declined') {
      const error: PaymentError = {
        type: 'card_error',
        code: 'card_declined',
        decline_code: card.test.declineCode,
        message: card.test.message ?? 'Your card was declined.',
        charge: charge.id,
      };
      Object.assign(charge, {
        status: 'failed',
        paid: false,
        captured: false,
        amount_captured: 0,
        failure_code: 'card_declined',
        failure_message: error.message,
        outcome: {
          network_status: 'declined_by_network',
          reason: card.test.declineCode ?? null,
          seller_message: 'The bank did not return any further details with this decline.',
          type: 'issuer_declined',
        },
      } satisfies Partial<Charge>);
      pi.status = 'requires_payment_method';
      pi.last_payment_error = error;
      pi.latest_charge = charge.id;
      this.state.charges.set(charge.id, charge);
      this.emit('charge.failed', charge, cause);
      this.emit('payment_intent.payment_failed', pi, cause);
      return { outcome: 'declined', session, paymentIntent: pi, charge, error };
    }
    const created = this.now();
    const fee = cardFee(charge.amount);
    const txn: BalanceTransaction = {
      id: newId('txn'),
      object: 'balance_transaction',
      amount: charge.amount,
      // Funds become available two days later on the standard US schedule (Stripe docs, memory); the
      // fake's payouts sweep whatever is not yet paid out, whatever this date says.
      available_on: created + 2 * DAY,
      created,
      currency: charge.currency,
      description: charge.description,
      exchange_rate: null,
      fee,
      fee_details: [
        {
          amount: fee,
          application: null,
          currency: charge.currency,
          description: 'Stripe processing fees',
          type: 'stripe_fee',
        },
      ],
      net: charge.amount - fee,
      reporting_category: 'charge',
      source: charge.id,
      status: 'pending',
      type: 'charge',
    };
    this.state.balanceTransactions.set(txn.id, txn);
    charge.balance_transaction = txn.id;
    this.state.charges.set(charge.id, charge);
    Object.assign(pi, {
      status: 'succeeded',
      amount_received: charge.amount,
      latest_charge: charge.id,
      last_payment_error: null,
    } satisfies Partial<PaymentIntent>);
    Object.assign(session, {
      status: 'complete',
      payment_status: 'paid',
      url: null,
      customer_details: { email: session.customer_email, name: card.name },
    } satisfies Partial<CheckoutSession>);
    this.emit('charge.succeeded', charge, cause);
    this.emit('payment_intent.succeeded', pi, cause);
    this.emit('checkout.session.completed', session, cause);
    return { outcome: 'succeeded', session, paymentIntent: pi, charge, balanceTransaction: txn };
  }

  private intentFor(session: CheckoutSession, cause: Cause): PaymentIntent {
    if (session.payment_intent) return this.state.paymentIntents.get(session.payment_intent)!;
    const data = this.pendingIntentData.get(session.id) ?? { metadata: {}, description: null };
    const id = newId('pi');
    const pi: PaymentIntent = {
      id,
      object: 'payment_intent',
      amount: session.amount_total,
      amount_capturable: 0,
      amount_received: 0,
      capture_method: 'automatic',
      client_secret: `${id}_secret_${newId('s').slice(2)}`,
      created: this.now(),
      currency: session.currency,
      description: data.description,
      last_payment_error: null,
      latest_charge: null,
      livemode: false,
      metadata: data.metadata,
      payment_method_types: ['card'],
      receipt_email: session.customer_email,
      status: 'requires_payment_method',
    };
    this.state.paymentIntents.set(pi.id, pi);
    session.payment_intent = pi.id;
    this.emit('payment_intent.created', pi, cause);
    return pi;
  }

  private newCharge(session: CheckoutSession, pi: PaymentIntent, card: ValidCard): Charge {
    return {
      id: newId('ch'),
      object: 'charge',
      amount: pi.amount,
      amount_captured: pi.amount,
      amount_refunded: 0,
      balance_transaction: null,
      billing_details: { name: card.name, email: session.customer_email },
      captured: true,
      created: this.now(),
      currency: pi.currency,
      description: pi.description,
      failure_code: null,
      failure_message: null,
      livemode: false,
      metadata: { ...pi.metadata },
      outcome: {
        network_status: 'approved_by_network',
        reason: null,
        seller_message: 'Payment complete.',
        type: 'authorized',
      },
      paid: true,
      payment_intent: pi.id,
      payment_method_details: {
        type: 'card',
        card: {
          brand: card.test.brand,
          last4: card.last4,
          exp_month: card.expMonth,
          exp_year: card.expYear,
          funding: 'credit',
        },
      },
      receipt_email: session.customer_email,
      refunded: false,
      status: 'succeeded',
    };
  }

  // ── Refunds ──────────────────────────────────────────────────────────────────────────────────────

  createRefund(params: Params, cause: Cause): Refund {
    const chargeId = optString(params, 'charge');
    const piId = optString(params, 'payment_intent');
    if (!chargeId && !piId) throw missing('charge');
    let charge: Charge;
    if (chargeId) charge = this.state.get(this.state.charges, 'charge', chargeId, 'charge');
    else {
      const pi = this.state.get(this.state.paymentIntents, 'payment_intent', piId!, 'payment_intent');
      if (pi.status !== 'succeeded' || !pi.latest_charge)
        throw new ApiError(
          400,
          'invalid_request_error',
          `PaymentIntent ${pi.id} does not have a successful charge to refund.`,
          'charge_not_refundable',
          'payment_intent',
        );
      charge = this.state.charges.get(pi.latest_charge)!;
    }
    if (charge.status !== 'succeeded')
      throw new ApiError(
        400,
        'invalid_request_error',
        `Charge ${charge.id} did not succeed; there is nothing to refund.`,
        'charge_not_refundable',
        'charge',
      );
    const remaining = charge.amount - charge.amount_refunded;
    if (remaining === 0)
      throw new ApiError(
        400,
        'invalid_request_error',
        `Charge ${charge.id} has already been refunded.`,
        'charge_already_refunded',
        'charge',
      );
    const amount = optInteger(params, 'amount') ?? remaining;
    if (amount < 1)
      throw invalid('amount', 'The refund amount must be at least 1.', 'parameter_invalid_integer');
    if (amount > remaining)
      throw new ApiError(
        400,
        'invalid_request_error',
        `Refund amount (${amount}) is greater than the unrefunded amount on the charge (${remaining}).`,
        'amount_too_large',
        'amount',
      );
    const reason = optString(params, 'reason') ?? null;
    if (reason && !['duplicate', 'fraudulent', 'requested_by_customer'].includes(reason))
      throw invalid('reason', `Invalid reason: ${reason}`, 'parameter_invalid_string');
    const created = this.now();
    const refundId = newId('re');
    const txn: BalanceTransaction = {
      id: newId('txn'),
      object: 'balance_transaction',
      amount: -amount,
      available_on: created,
      created,
      currency: charge.currency,
      description: 'REFUND FOR CHARGE',
      exchange_rate: null,
      // The processing fee of the original charge is not returned on a refund (Stripe pricing FAQ, memory).
      fee: 0,
      fee_details: [],
      net: -amount,
      reporting_category: 'refund',
      source: refundId,
      status: 'pending',
      type: 'refund',
    };
    const refund: Refund = {
      id: refundId,
      object: 'refund',
      amount,
      balance_transaction: txn.id,
      charge: charge.id,
      created,
      currency: charge.currency,
      metadata: metadata(params),
      payment_intent: charge.payment_intent,
      reason,
      status: 'succeeded',
    };
    this.state.balanceTransactions.set(txn.id, txn);
    this.state.refunds.set(refund.id, refund);
    charge.amount_refunded += amount;
    charge.refunded = charge.amount_refunded === charge.amount;
    this.emit('refund.created', refund, cause);
    this.emit('charge.refunded', charge, cause);
    return refund;
  }

  // ── Payouts ──────────────────────────────────────────────────────────────────────────────────────

  /**
   * Pays out everything not yet paid out — charges net of their fees, minus refunds — one payout per
   * currency whose sum is positive. Each swept transaction becomes available and belongs to the payout;
   * the payout has its own balance transaction of type payout for minus its amount.
   */
  payOut(cause: Cause = NO_REQUEST): Payout[] {
    const byCurrency = new Map<string, BalanceTransaction[]>();
    for (const txn of this.state.balanceTransactions.values()) {
      if (txn.type === 'payout' || this.state.paidOutBy.has(txn.id)) continue;
      byCurrency.set(txn.currency, [...(byCurrency.get(txn.currency) ?? []), txn]);
    }
    const payouts: Payout[] = [];
    for (const [currency, txns] of byCurrency) {
      const amount = txns.reduce((sum, t) => sum + t.net, 0);
      if (amount <= 0) continue;
      const created = this.now();
      const payoutId = newId('po');
      const own: BalanceTransaction = {
        id: newId('txn'),
        object: 'balance_transaction',
        amount: -amount,
        available_on: created,
        created,
        currency,
        description: 'STRIPE PAYOUT',
        exchange_rate: null,
        fee: 0,
        fee_details: [],
        net: -amount,
        reporting_category: 'payout',
        source: payoutId,
        status: 'available',
        type: 'payout',
      };
      const payout: Payout = {
        id: payoutId,
        object: 'payout',
        amount,
        // Arrives the next day, at midnight UTC as the API gives arrival dates (memory).
        arrival_date: Math.floor(created / DAY) * DAY + DAY,
        automatic: true,
        balance_transaction: own.id,
        created,
        currency,
        description: 'STRIPE PAYOUT',
        destination: 'ba_local_test_bank',
        failure_code: null,
        failure_message: null,
        livemode: false,
        metadata: {},
        method: 'standard',
        source_type: 'card',
        statement_descriptor: null,
        status: 'in_transit',
        type: 'bank_account',
      };
      for (const t of txns) {
        t.status = 'available';
        this.state.paidOutBy.set(t.id, payoutId);
      }
      this.state.balanceTransactions.set(own.id, own);
      this.state.paidOutBy.set(own.id, payoutId);
      this.state.payouts.set(payout.id, payout);
      this.emit('payout.created', payout, cause);
      payout.status = 'paid';
      this.emit('payout.paid', payout, cause);
      payouts.push(payout);
    }
    return payouts;
  }

  /** The balance: what is not yet paid out is pending; paid-out funds have left. */
  balance() {
    const pending = new Map<string, number>();
    for (const txn of this.state.balanceTransactions.values())
      if (txn.type !== 'payout' && !this.state.paidOutBy.has(txn.id))
        pending.set(txn.currency, (pending.get(txn.currency) ?? 0) + txn.net);
    const currencies = new Set([...pending.keys(), 'usd']);
    return {
      object: 'balance',
      available: [...currencies].map((c) => ({ amount: 0, currency: c, source_types: { card: 0 } })),
      livemode: false,
      pending: [...currencies].map((c) => ({
        amount: pending.get(c) ?? 0,
        currency: c,
        source_types: { card: pending.get(c) ?? 0 },
      })),
    };
  }

  clear(): void {
    this.pendingIntentData.clear();
  }
}
