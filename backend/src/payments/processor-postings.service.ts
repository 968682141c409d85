import { Inject, Injectable, Logger } from '@nestjs/common';
import type Stripe from 'stripe';
import {
  ACCOUNTS,
  balancePaidByCard,
  cardBrandName,
  contractBalance,
  depositCapturedByCard,
  formatUsd,
  fromMinorUnits,
  money,
  MoneyDecimal,
  processorPayout,
  refundAfterCancellation,
  refundOfRevenue,
  todayInZone,
  type Money,
  type PaymentKind,
  type Posting,
  toMoneyString,
} from '@loambook/common';
import type { Knex } from 'knex';
import { LedgerService, type PostSource } from '../ledger/ledger.service';
import { JobsService } from '../jobs/jobs.service';
import { LeadsService } from '../leads/leads.service';
import { PaymentsRepository, type NewPayoutItem, type PayableContract } from './payments.repository';
import { STRIPE } from './stripe.provider';

/** What an event came to: recorded (in a branch), already recorded, or not ours. */
export type Outcome =
  | { kind: 'recorded'; branchId: string | null }
  | { kind: 'known'; branchId: string | null }
  | { kind: 'ignored'; reason: string };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

const idOf = (x: string | { id: string } | null | undefined): string | null =>
  x == null ? null : typeof x === 'string' ? x : x.id;

/** A unix time of the processor (seconds) as the branch's calendar day. */
const dayIn = (zone: string, unixSeconds: number) => todayInZone(zone, new Date(unixSeconds * 1000));

/** A processor object that is not yet what this step needs: the transaction rolls back, the processor retries. */
export class NotReadyYet extends Error {}

/**
 * Turns the processor's objects into our records and postings, idempotently: a charge is recorded and
 * posted once whichever event (or person) reports it first, keyed by the charge id (ledger key
 * `charge:<ch_…>`), a refund by its refund id (`refund:<re_…>`), a payout per branch (`payout:<po_…>:<branch>`).
 * Every method runs inside the caller's transaction; what it needs and does not have, it fetches through the
 * SDK (payment intent → latest charge → balance transaction for the fee).
 *
 * A charge whose metadata names no contract of ours is ignored (logged): our checkout sessions are made
 * only after the contract row exists and before anyone sees the link, so such a charge cannot become ours
 * later (it belongs to another integration on the same account, or to a database since reset).
 */
@Injectable()
export class ProcessorPostings {
  private readonly logger = new Logger(ProcessorPostings.name);

  constructor(
    private readonly repo: PaymentsRepository,
    private readonly ledger: LedgerService,
    private readonly jobs: JobsService,
    private readonly leads: LeadsService,
    @Inject(STRIPE) private readonly stripe: Stripe | null,
  ) {}

  private sdk(): Stripe {
    if (!this.stripe) throw new Error('The card processor is not configured (STRIPE_SECRET_KEY).');
    return this.stripe;
  }

  // ---- charges ----------------------------------------------------------------------------------

  /** A charge known by id (from a payment intent, a refund or a payout): recorded unless it is already. */
  async ensureCharge(chargeId: string, source: PostSource, trx: Knex.Transaction): Promise<Outcome> {
    const known = await this.repo.paymentByCharge(chargeId, trx);
    if (known) return { kind: 'known', branchId: known.branchId };
    const charge = await this.sdk().charges.retrieve(chargeId, { expand: ['balance_transaction'] });
    return this.recordCharge(charge, source, trx);
  }

  /** A checkout session that completed: its payment intent's latest charge. */
  async ensureSession(session: Stripe.Checkout.Session, source: PostSource, trx: Knex.Transaction) {
    if (session.payment_status !== 'paid') return { kind: 'ignored', reason: 'session not paid' } as Outcome;
    const piId = idOf(session.payment_intent);
    if (!piId) throw new NotReadyYet(`Checkout session ${session.id} is paid but names no payment intent.`);
    const known = await this.repo.paymentByIntent(piId, trx);
    if (known) return { kind: 'known', branchId: known.branchId } as Outcome;
    const pi = await this.sdk().paymentIntents.retrieve(piId, {
      expand: ['latest_charge.balance_transaction'],
    });
    return this.ensureIntent(pi, source, trx);
  }

  /** A payment intent that succeeded: its latest charge. */
  async ensureIntent(pi: Stripe.PaymentIntent, source: PostSource, trx: Knex.Transaction): Promise<Outcome> {
    if (pi.status !== 'succeeded') return { kind: 'ignored', reason: `payment intent ${pi.status}` };
    const latest = pi.latest_charge;
    if (!latest) throw new NotReadyYet(`Payment intent ${pi.id} succeeded but has no charge yet.`);
    if (typeof latest === 'string') return this.ensureCharge(latest, source, trx);
    return this.recordCharge(latest, source, trx);
  }

  /**
   * Records a succeeded charge: the payment, its posting (deposit or balance, by card), the link paid, the
   * lead's timeline, and — for a deposit that is now in full — contracts.deposit_received_at and the lead
   * moved on (JobsService.advanceLead).
   */
  async recordCharge(charge: Stripe.Charge, source: PostSource, trx: Knex.Transaction): Promise<Outcome> {
    if (charge.status !== 'succeeded' || !charge.paid) {
      return { kind: 'ignored', reason: `charge ${charge.status}` };
    }
    const meta = charge.metadata ?? {};
    const kind = meta.kind === 'balance' ? 'balance' : meta.kind === 'deposit' ? 'deposit' : null;
    if (!kind || !UUID.test(meta.contractId ?? '')) {
      if (await this.repo.paymentByCharge(charge.id, trx)) return { kind: 'known', branchId: null };
      this.logger.log({ charge: charge.id }, 'Charge ignored: its metadata names no Loambook contract');
      return { kind: 'ignored', reason: 'no contract in the metadata' };
    }
    // The fee first, from the processor, before the contract's lock is taken (the lock is held to commit).
    const txn = await this.balanceTransaction(charge);
    // One round trip: the contract, locked for this transaction (another event about the same charge waits
    // here), and whether the charge is recorded already.
    const contract = await this.repo.contractForCharge(meta.contractId!, charge.id, trx);
    if (!contract) {
      this.logger.warn(
        { charge: charge.id, contractId: meta.contractId },
        'Charge ignored: its contract is not in this database',
      );
      return { kind: 'ignored', reason: 'contract not in the database' };
    }
    if (contract.chargeKnown) return { kind: 'known', branchId: contract.branchId };

    const gross = fromMinorUnits(txn.amount);
    const fee = fromMinorUnits(txn.fee);
    const net = fromMinorUnits(txn.net);
    if (!money(gross).minus(fee).equals(money(net))) {
      throw new Error(`Balance transaction ${txn.id}: net is not amount − fee.`);
    }
    const receivedOn = dayIn(contract.timezone, charge.created);
    const card = charge.payment_method_details?.card ?? null;
    const cardText = card ? ` (${cardBrandName(card.brand)} •••• ${card.last4 ?? '????'})` : '';
    const posting: Posting =
      kind === 'deposit'
        ? depositCapturedByCard({ gross, fee, memo: `Card deposit${cardText}, charge ${charge.id}` })
        : balancePaidByCard({ gross, fee, memo: `Card balance payment${cardText}, charge ${charge.id}` });
    const { entry } = await this.ledger.post(
      posting,
      {
        branchId: contract.branchId,
        idempotencyKey: `charge:${charge.id}`,
        source,
        effectiveOn: receivedOn,
        leadId: contract.leadId,
        contractId: contract.id,
      },
      trx,
    );
    const requestId = UUID.test(meta.paymentRequestId ?? '') ? meta.paymentRequestId! : null;
    const what = kind === 'deposit' ? 'Deposit' : 'Balance payment';
    const paymentId = await this.repo.insertPayment(
      {
        contractId: contract.id,
        branchId: contract.branchId,
        paymentRequestId: requestId,
        kind,
        method: 'card',
        amount: gross,
        fee,
        net,
        currency: txn.currency,
        paymentIntentId: idOf(charge.payment_intent),
        chargeId: charge.id,
        balanceTransactionId: txn.id,
        cardBrand: card?.brand ?? null,
        cardLast4: card?.last4 && /^\d{4}$/.test(card.last4) ? card.last4 : null,
        reference: null,
        receivedOn,
        recordedBy: null,
        requestKey: null,
        journalEntryId: entry.id,
      },
      trx,
      {
        leadId: contract.leadId,
        body: `${what} of ${formatUsd(gross)} received by card${cardText}.`,
        actorId: null,
      },
    );
    if (!paymentId) return { kind: 'known', branchId: contract.branchId };
    const paidAt = new Date(charge.created * 1000);
    if (requestId) await this.repo.markRequestPaid(requestId, paidAt, trx);
    await this.afterPayment(contract, kind, paidAt, null, trx);
    return { kind: 'recorded', branchId: contract.branchId };
  }

  private async balanceTransaction(charge: Stripe.Charge): Promise<Stripe.BalanceTransaction> {
    const bt = charge.balance_transaction;
    if (bt && typeof bt !== 'string') return bt;
    if (!bt) throw new NotReadyYet(`Charge ${charge.id} has no balance transaction yet.`);
    return this.sdk().balanceTransactions.retrieve(bt);
  }

  /**
   * What follows a payment. A deposit: once the deposits cover the contract's deposit, the contract's
   * deposit_received_at is set and the lead moves along. Any payment once the job is completed: the lead
   * moves along, and on to paid in full when the payments less refunds now cover the price
   * (LeadsService.settleIfPaid; JobsService.advanceLead stops at completed). A balance payment before the
   * job is completed: of the facts the pipeline reads (LeadFacts) a payment changes only the money paid,
   * which only the step from completed to paid in full looks at, so the lead can move only where nothing
   * has moved it yet — still at contract signed on a contract asking no deposit (whose deposit counts as
   * received). Elsewhere the lead's stage and facts are not read for it: three statements saved on half
   * the webhook events. The contract row is locked by the caller.
   */
  async afterPayment(
    contract: PayableContract,
    kind: PaymentKind,
    paidAt: Date,
    actorId: string | null,
    trx: Knex.Transaction,
  ): Promise<void> {
    if (contract.cancelledAt) return;
    if (kind === 'deposit' && !contract.depositReceivedAt) {
      const m = await this.repo.movements(contract.id, trx);
      const held = money(contractBalance(contract.price, m).depositHeld);
      if (!held.lessThan(money(contract.depositAmount))) {
        if (await this.repo.setDepositReceived(contract.id, paidAt, trx)) {
          await this.jobs.advanceLead(contract.leadId, actorId, trx);
        }
      }
    }
    if (contract.jobCompleted || (kind === 'balance' && contract.leadStage === 'contract_signed')) {
      await this.jobs.advanceLead(contract.leadId, actorId, trx);
      await this.leads.settleIfPaid(contract.leadId, actorId, trx);
    }
  }

  // ---- refunds ----------------------------------------------------------------------------------

  /** Every refund of a charge (charge.refunded names the charge, not the refunds). */
  async ensureRefundsOfCharge(
    charge: Stripe.Charge,
    source: PostSource,
    trx: Knex.Transaction,
  ): Promise<Outcome> {
    const refunds: Stripe.Refund[] = [];
    await this.sdk()
      .refunds.list({ charge: charge.id, limit: 100 })
      .autoPagingEach((r) => {
        refunds.push(r);
      });
    let last: Outcome = { kind: 'ignored', reason: 'no refunds' };
    for (const r of refunds.reverse()) last = await this.recordRefund(r, source, trx);
    return last;
  }

  /**
   * Records a refund that went through and posts it (once, key `refund:<re_…>`): a deposit refunded before
   * the work was recognised as revenue is customer deposits / processor clearing (refundAfterCancellation);
   * anything else, refunds and allowances / clearing (refundOfRevenue). The processor keeps its fee.
   */
  async recordRefund(
    refund: Stripe.Refund,
    source: PostSource,
    trx: Knex.Transaction,
    requestedBy: string | null = null,
  ): Promise<Outcome> {
    const existing = await this.repo.refundByProcessorId(refund.id, trx);
    if (existing?.journalEntryId) return { kind: 'known', branchId: null };
    if (refund.status !== 'succeeded') {
      // pending: the processor sends refund.updated when it settles; failed/canceled: nothing moved.
      return { kind: 'ignored', reason: `refund ${refund.status}` };
    }
    const chargeId = idOf(refund.charge);
    if (!chargeId) return { kind: 'ignored', reason: 'refund without a charge' };
    const charged = await this.ensureCharge(chargeId, source, trx);
    if (charged.kind === 'ignored')
      return { kind: 'ignored', reason: `refund of a charge not ours (${charged.reason})` };
    const payment = (await this.repo.paymentByCharge(chargeId, trx))!;
    const contract = (await this.repo.contract(payment.contractId, trx, true))!;
    const amount = fromMinorUnits(refund.amount);
    const refundedOn = dayIn(contract.timezone, refund.created);
    const beforeRevenue = payment.kind === 'deposit' && !contract.jobCompleted;
    const posting = beforeRevenue
      ? refundAfterCancellation({
          amount,
          via: 'processor',
          memo: `Deposit refunded to the card, refund ${refund.id}`,
        })
      : refundOfRevenue({ amount, via: 'processor', memo: `Refunded to the card, refund ${refund.id}` });
    const { entry } = await this.ledger.post(
      posting,
      {
        branchId: contract.branchId,
        idempotencyKey: `refund:${refund.id}`,
        source,
        effectiveOn: refundedOn,
        leadId: contract.leadId,
        contractId: contract.id,
      },
      trx,
    );
    const { created } = await this.repo.upsertRefund(
      {
        contractId: contract.id,
        branchId: contract.branchId,
        paymentId: payment.id,
        amount,
        currency: refund.currency,
        processorRefundId: refund.id,
        balanceTransactionId: idOf(refund.balance_transaction as string | { id: string } | null),
        status: 'succeeded',
        reason: refund.reason ?? null,
        requestedBy,
        refundedOn,
        journalEntryId: entry.id,
      },
      trx,
    );
    if (created) {
      await this.repo.addLeadActivity(
        {
          leadId: contract.leadId,
          branchId: contract.branchId,
          body: `${formatUsd(amount)} refunded to the card.`,
          data: { refundId: refund.id, paymentId: payment.id, amount },
          actorId: requestedBy,
        },
        trx,
      );
    }
    return { kind: created ? 'recorded' : 'known', branchId: contract.branchId };
  }

  // ---- payouts ----------------------------------------------------------------------------------

  /**
   * A payout that reached the bank: its balance transactions (listed through the SDK, every page), each
   * attributed to the branch of its payment or refund, and one posting per branch, bank / processor
   * clearing for the branch's net (the other way round if refunds made it negative). A transaction we cannot
   * attribute (a charge not ours, a type we do not handle) fails the event: 500, and the processor retries
   * while someone looks (webhook_events.last_error).
   */
  async recordPayout(payout: Stripe.Payout, source: PostSource, trx: Knex.Transaction): Promise<Outcome> {
    if (payout.status !== 'paid') return { kind: 'ignored', reason: `payout ${payout.status}` };
    const payoutRowId = await this.repo.insertPayout(
      {
        processorPayoutId: payout.id,
        amount: fromMinorUnits(payout.amount),
        currency: payout.currency,
        arrivalDate: new Date(payout.arrival_date * 1000).toISOString().slice(0, 10),
        status: payout.status,
        balanceTransactionId: idOf(payout.balance_transaction as string | { id: string } | null),
        createdAt: new Date(payout.created * 1000),
      },
      trx,
    );
    if (!payoutRowId) return { kind: 'known', branchId: null };

    const txns: Stripe.BalanceTransaction[] = [];
    await this.sdk()
      .balanceTransactions.list({ payout: payout.id, limit: 100 })
      .autoPagingEach((t) => {
        txns.push(t);
      });
    const items: NewPayoutItem[] = [];
    for (const t of txns) {
      if (t.type === 'payout') continue;
      const sourceId = idOf(t.source as string | { id: string } | null);
      let branchId: string;
      let paymentId: string | null = null;
      let refundId: string | null = null;
      if (t.type === 'charge' || t.type === 'payment') {
        if (!sourceId) throw new Error(`Balance transaction ${t.id} names no charge.`);
        let p = await this.repo.paymentByCharge(sourceId, trx);
        if (!p) {
          await this.ensureCharge(sourceId, source, trx);
          p = await this.repo.paymentByCharge(sourceId, trx);
        }
        if (!p)
          throw new Error(`Payout ${payout.id} holds charge ${sourceId}, which is not a Loambook payment.`);
        branchId = p.branchId;
        paymentId = p.id;
      } else if (t.type === 'refund' || t.type === 'payment_refund') {
        if (!sourceId) throw new Error(`Balance transaction ${t.id} names no refund.`);
        let r = await this.repo.refundForPayout(sourceId, trx);
        if (!r) {
          await this.recordRefund(await this.sdk().refunds.retrieve(sourceId), source, trx);
          r = await this.repo.refundForPayout(sourceId, trx);
        }
        if (!r)
          throw new Error(`Payout ${payout.id} holds refund ${sourceId}, which is not a Loambook refund.`);
        branchId = r.branchId;
        refundId = r.id;
      } else {
        throw new Error(`Payout ${payout.id}: balance transactions of type ${t.type} are not handled.`);
      }
      items.push({
        balanceTransactionId: t.id,
        type: t.type === 'payment' ? 'charge' : t.type === 'payment_refund' ? 'refund' : t.type,
        sourceId,
        amount: fromMinorUnits(t.amount),
        fee: fromMinorUnits(t.fee),
        net: fromMinorUnits(t.net),
        currency: t.currency,
        branchId,
        paymentId,
        refundId,
      });
    }

    const zero = () => new MoneyDecimal(0);
    const perBranch = new Map<string, { gross: Money; fee: Money; net: Money; count: number }>();
    let total = zero();
    for (const it of items) {
      const b = perBranch.get(it.branchId) ?? { gross: zero(), fee: zero(), net: zero(), count: 0 };
      b.gross = b.gross.plus(money(it.amount));
      b.fee = b.fee.plus(money(it.fee));
      b.net = b.net.plus(money(it.net));
      b.count += 1;
      perBranch.set(it.branchId, b);
      total = total.plus(money(it.net));
    }
    if (!total.equals(money(fromMinorUnits(payout.amount)))) {
      throw new Error(
        `Payout ${payout.id} is ${fromMinorUnits(payout.amount)} but its transactions net ${toMoneyString(total)}.`,
      );
    }
    await this.repo.insertPayoutItems(payoutRowId, items, trx);
    const arrival = new Date(payout.arrival_date * 1000).toISOString().slice(0, 10);
    for (const [branchId, b] of [...perBranch].sort(([a], [c]) => a.localeCompare(c))) {
      let journalEntryId: string | null = null;
      if (!b.net.isZero()) {
        const { entry } = await this.ledger.post(
          payoutPosting(b.net, payout.id),
          {
            branchId,
            idempotencyKey: `payout:${payout.id}:${branchId}`,
            source,
            effectiveOn: arrival,
          },
          trx,
        );
        journalEntryId = entry.id;
      }
      await this.repo.insertPayoutBranch(
        {
          payoutId: payoutRowId,
          branchId,
          gross: toMoneyString(b.gross),
          fee: toMoneyString(b.fee),
          net: toMoneyString(b.net),
          itemCount: b.count,
          journalEntryId,
        },
        trx,
      );
    }
    return { kind: 'recorded', branchId: perBranch.size === 1 ? [...perBranch.keys()][0]! : null };
  }
}

/**
 * A branch's share of a payout: bank / processor clearing (processorPayout). When refunds in the payout
 * exceed the branch's charges, the branch's share is negative: the same accounts the other way round.
 */
function payoutPosting(net: Money, payoutId: string): Posting {
  const memo = `Processor payout ${payoutId}`;
  if (net.greaterThan(0)) return processorPayout({ amount: toMoneyString(net), memo });
  const amount = toMoneyString(net.negated());
  return {
    reasonCode: 'processor.payout',
    lines: [
      { account: ACCOUNTS.processorClearing, side: 'debit', amount },
      { account: ACCOUNTS.bank, side: 'credit', amount },
    ],
    memo: `${memo} (refunds exceeded this branch's charges)`,
  };
}
