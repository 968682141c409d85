import { Inject, Injectable, Logger } from '@nestjs/common';
import type { Knex } from 'knex';
import type Stripe from 'stripe';
import { APP_CONFIG, type AppConfig } from '../config/config';
import { KNEX } from '../database/database.module';
import type { PostSource } from '../ledger/ledger.service';
import { ProcessorPostings, type Outcome } from './processor-postings.service';
import { PaymentsRepository, type WebhookEventRow } from './payments.repository';
import { STRIPE } from './stripe.provider';

/**
 * Tolerance of the signature's timestamp: 300 s, the SDK's default; only older timestamps are refused
 * (stripe-node Webhooks.ts, published; shared/REFERENCE-VALUES.md "Payment webhooks").
 */
export const WEBHOOK_TOLERANCE_SECONDS = 300;

/** Charges name our contract in their metadata (ProcessorPostings checks it again). */
const CONTRACT_ID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export interface WebhookAnswer {
  status: number;
  body: Record<string, unknown>;
  /** Time spent on the event after its signature was checked, in ms (sent as Server-Timing). */
  processMs?: number;
}

const answer = (status: number, body: Record<string, unknown>, since?: bigint): WebhookAnswer => ({
  status,
  body,
  ...(since !== undefined ? { processMs: Number(process.hrtime.bigint() - since) / 1e6 } : {}),
});

/**
 * The processor's webhook: verify, record the event id once, process in one transaction.
 *
 * 1. The signature is checked against the raw body with the SDK (constructEvent, tolerance 300 s). Missing,
 *    wrong, altered or stale: 400, and nothing is written.
 * 2. An id already processed answers 200 at once: one indexed lookup outside any transaction is all a
 *    duplicate costs. Otherwise one transaction per event, whose first statement inserts the event id
 *    (unique) with ON CONFLICT: that insert is the guard. A copy arriving while the first is still being
 *    processed waits on the unique index, then finds it processed and does nothing more.
 * 3. The event's work (records, postings) runs in the same transaction. Any failure rolls all of it back —
 *    the event row too, so the retry processes it — and answers 500 so that the processor retries; the
 *    failure is then noted apart (webhook_events.last_error, processed_at null) for people to see.
 * Order does not matter: each handler fetches what it lacks through the SDK, and postings are keyed by the
 * processor's object (charge, refund, payout), never by the event, so whichever event comes first posts.
 */
@Injectable()
export class WebhooksService {
  private readonly logger = new Logger(WebhooksService.name);

  constructor(
    private readonly repo: PaymentsRepository,
    private readonly postings: ProcessorPostings,
    @Inject(KNEX) private readonly knex: Knex,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(STRIPE) private readonly stripe: Stripe | null,
  ) {}

  async receive(raw: unknown, signature: string | undefined): Promise<WebhookAnswer> {
    const secret = this.config.stripe.webhookSecret;
    if (!this.stripe || !secret) {
      return answer(503, { code: 'WEBHOOK.NOT_CONFIGURED', message: 'Payments are not configured here.' });
    }
    if (!Buffer.isBuffer(raw) || raw.length === 0) {
      return answer(400, { code: 'WEBHOOK.BODY_MISSING', message: 'The event body is missing.' });
    }
    if (!signature) {
      return answer(400, {
        code: 'WEBHOOK.SIGNATURE_MISSING',
        message: 'The Stripe-Signature header is missing.',
      });
    }
    let event: Stripe.Event;
    try {
      event = this.stripe.webhooks.constructEvent(raw, signature, secret, WEBHOOK_TOLERANCE_SECONDS);
    } catch {
      return answer(400, {
        code: 'WEBHOOK.SIGNATURE_INVALID',
        message: 'The signature does not match the body, or its timestamp is too old.',
      });
    }
    const since = process.hrtime.bigint();
    const row: WebhookEventRow = {
      eventId: event.id,
      type: event.type,
      apiVersion: event.api_version ?? null,
      created: new Date(event.created * 1000),
      payload: raw.toString('utf8'),
    };
    try {
      // A copy of an event already processed: one indexed lookup, no transaction, and 200 at once.
      if (await this.repo.eventProcessed(event.id)) {
        return answer(200, { received: true, duplicate: true }, since);
      }
      const fee = this.feeAhead(event);
      const outcome = await this.knex.transaction(async (trx) => {
        if (!(await this.repo.claimEvent(row, trx))) return null;
        await fee;
        const o = await this.process(event, trx);
        if (o.kind === 'ignored') await this.repo.markEventIgnored(event.id, trx);
        return o;
      });
      if (!outcome) return answer(200, { received: true, duplicate: true }, since);
      if (outcome.kind === 'ignored') {
        this.logger.log(
          { event: event.id, type: event.type, reason: outcome.reason },
          'Webhook event ignored',
        );
      }
      return answer(200, { received: true, outcome: outcome.kind }, since);
    } catch (e) {
      const message = e instanceof Error ? e.message : String(e);
      this.logger.warn(
        { event: event.id, type: event.type, err: message },
        'Webhook event failed: the processor will retry',
      );
      try {
        await this.repo.noteEventFailure(row, message);
      } catch (noted) {
        this.logger.warn({ event: event.id, err: String(noted) }, 'Could not note the failed webhook event');
      }
      return answer(
        500,
        { code: 'WEBHOOK.PROCESSING_FAILED', message: 'The event could not be processed; retry.' },
        since,
      );
    }
  }

  /**
   * A new charge of one of our contracts needs its balance transaction (the fee) from the processor before
   * it is recorded: fetched while the transaction opens and claims the event, rather than after, and put
   * in the charge as the expanded object (which ProcessorPostings.recordCharge then uses as it is). Only
   * an optimisation: if the fetch fails, the charge keeps the id and recordCharge fetches it (and reports
   * a failure) itself.
   */
  private feeAhead(event: Stripe.Event): Promise<void> {
    if (event.type !== 'charge.succeeded' || !this.stripe) return Promise.resolve();
    const charge = event.data.object;
    const id = charge.balance_transaction;
    if (typeof id !== 'string' || charge.status !== 'succeeded' || !charge.paid) return Promise.resolve();
    if (!CONTRACT_ID.test(charge.metadata?.contractId ?? '')) return Promise.resolve();
    return this.stripe.balanceTransactions.retrieve(id).then(
      (txn) => {
        if (charge.balance_transaction === id) charge.balance_transaction = txn;
      },
      () => undefined,
    );
  }

  /** One event's work, inside its transaction. */
  private process(event: Stripe.Event, trx: Knex.Transaction): Promise<Outcome> {
    const source: PostSource = { kind: 'event', ref: event.id };
    const object = event.data.object as unknown;
    switch (event.type) {
      case 'charge.succeeded':
        return this.postings.recordCharge(object as Stripe.Charge, source, trx);
      case 'payment_intent.succeeded':
        return this.postings.ensureIntent(object as Stripe.PaymentIntent, source, trx);
      case 'checkout.session.completed':
      case 'checkout.session.async_payment_succeeded':
        return this.postings.ensureSession(object as Stripe.Checkout.Session, source, trx);
      case 'checkout.session.expired':
        return this.repo
          .expireBySession((object as Stripe.Checkout.Session).id, trx)
          .then(() => ({ kind: 'recorded', branchId: null }) as Outcome);
      case 'charge.refunded':
        return this.postings.ensureRefundsOfCharge(object as Stripe.Charge, source, trx);
      case 'refund.created':
      case 'refund.updated':
      case 'charge.refund.updated':
        return this.postings.recordRefund(object as Stripe.Refund, source, trx);
      case 'payout.paid':
        return this.postings.recordPayout(object as Stripe.Payout, source, trx);
      default:
        return Promise.resolve({ kind: 'ignored', reason: 'not an event Loambook acts on' });
    }
  }
}
