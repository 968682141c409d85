import { randomUUID } from 'node:crypto';
import { Inject, Injectable, Logger } from '@nestjs/common';
import type { Knex } from 'knex';
import Stripe from 'stripe';
import {
  asSubject,
  balancePaidToBank,
  BANK_METHOD_LABELS,
  branchScope,
  contractBalance,
  depositReceivedToBank,
  depositWarning,
  formatUsd,
  linkAmount,
  money,
  MoneyDecimal,
  sdkMinorUnits,
  todayInZone,
  weekdayDate,
  type CheckoutStatus,
  type ContractPayments,
  type CreatePaymentLinkRequest,
  type DepositWarning,
  type PaymentKind,
  type PaymentLinkResult,
  type PaymentList,
  type PaymentRequestView,
  type PaymentView,
  type RecordPaymentRequest,
  type RefundRequest,
  type RefundView,
  toMoneyString,
} from '@loambook/common';
import { APP_CONFIG, type AppConfig } from '../config/config';
import { KNEX } from '../database/database.module';
import { inTransaction, type Db } from '../database/transaction';
import { DomainError, notFound } from '../common/domain-error';
import type { SessionUser } from '../auth/session-user';
import { LedgerService } from '../ledger/ledger.service';
import { MailService } from '../mail/mail.service';
import { Clock } from '../signing/clock';
import { paymentLinkMail } from './payment-mails';
import { PaymentsRepository, type PayableContract, type PaymentListFilter } from './payments.repository';
import { ProcessorPostings } from './processor-postings.service';
import { STRIPE } from './stripe.provider';

const contractNotFound = () => notFound('contract');
const rule = (code: string, message: string, details: Record<string, unknown> | null = null) =>
  new DomainError('rule', code, message, details);
const forbidden = () => new DomainError('forbidden', 'AUTH.FORBIDDEN', 'Your role does not allow this.');

const KIND_LABEL: Record<PaymentKind, string> = { deposit: 'Deposit', balance: 'Balance' };

/** Where the processor sends the homeowner after paying (our public thank-you page) or giving up. */
export const THANK_YOU_PATH = '/payment/thank-you';
export const CANCELLED_PATH = '/payment/cancelled';

/**
 * Payment links (Checkout Sessions) for a contract's deposit and balance, the contract's payments panel,
 * the bookkeeper's cash / cheque / transfer recordings and refunds, and the payments list.
 */
@Injectable()
export class PaymentsService {
  private readonly logger = new Logger(PaymentsService.name);

  constructor(
    private readonly repo: PaymentsRepository,
    private readonly postings: ProcessorPostings,
    private readonly ledger: LedgerService,
    private readonly mail: MailService,
    private readonly clock: Clock,
    @Inject(KNEX) private readonly knex: Knex,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(STRIPE) private readonly stripe: Stripe | null,
  ) {}

  // ---- who may do what --------------------------------------------------------------------------

  /** The contract, if the user may see it (its sales side or its money); 404 otherwise. */
  private async readable(user: SessionUser, id: string, db: Db = this.knex): Promise<PayableContract> {
    const c = await this.repo.contract(id, db);
    if (!c) throw contractNotFound();
    const sales = user.ability.can(
      'read',
      asSubject('Contract', { branchId: c.branchId, salespersonId: c.salespersonId }),
    );
    if (!sales && !user.ability.can('read', asSubject('Payment', { branchId: c.branchId }))) {
      throw contractNotFound();
    }
    return c;
  }

  /** Asking for money: whoever may change the contract (its salesperson, the manager) or record payments. */
  private canRequest(user: SessionUser, c: PayableContract): boolean {
    return (
      user.ability.can(
        'update',
        asSubject('Contract', { branchId: c.branchId, salespersonId: c.salespersonId }),
      ) || user.ability.can('create', asSubject('Payment', { branchId: c.branchId }))
    );
  }

  private canRecord(user: SessionUser, c: { branchId: string }): boolean {
    return user.ability.can('create', asSubject('Payment', { branchId: c.branchId }));
  }

  private sdk(): Stripe {
    if (!this.stripe) {
      throw rule('PAYMENT.PROCESSOR_NOT_CONFIGURED', 'Card payments are not set up here (no processor key).');
    }
    return this.stripe;
  }

  // ---- the contract's payments ------------------------------------------------------------------

  async forContract(user: SessionUser, contractId: string): Promise<ContractPayments> {
    const c = await this.readable(user, contractId);
    const [m, requests, payments, refunds, cards] = await Promise.all([
      this.repo.movements(c.id),
      this.repo.requests(c.id),
      this.repo.payments(c.id),
      this.repo.refunds(c.id),
      this.repo.refundableCardPayments(c.id),
    ]);
    const b = contractBalance(c.price, m);
    const refundable = cards.reduce((a, p) => a.plus(money(p.remaining)), new MoneyDecimal(0));
    return {
      contractId: c.id,
      leadId: c.leadId,
      branchId: c.branchId,
      price: c.price,
      depositAmount: c.depositAmount,
      cancelled: c.cancelledAt !== null,
      completed: c.jobCompleted,
      depositReceivedAt: c.depositReceivedAt?.toISOString() ?? null,
      paid: b.paid,
      refunded: b.refunded,
      depositHeld: b.depositHeld,
      balanceDue: c.cancelledAt ? '0.00' : b.balanceDue,
      refundable: c.cancelledAt ? toMoneyString(refundable) : '0.00',
      requests,
      payments,
      refunds,
      depositWarning: this.warningFor(c, c.depositAmount, b.depositHeld),
      processorEnabled: this.stripe !== null,
    };
  }

  private warningFor(c: PayableContract, amount: string, alreadyHeld: string): DepositWarning | null {
    const initial = money(amount).plus(money(alreadyHeld));
    if (!initial.greaterThan(0)) return null;
    try {
      return depositWarning({
        state: c.state,
        contractPrice: c.price,
        initialPayment: toMoneyString(initial),
        signedOn: c.signedOn,
      });
    } catch {
      return null;
    }
  }

  // ---- payment links ----------------------------------------------------------------------------

  async createLink(
    user: SessionUser,
    contractId: string,
    dto: CreatePaymentLinkRequest,
  ): Promise<PaymentLinkResult> {
    const c = await this.readable(user, contractId);
    if (!this.canRequest(user, c)) throw forbidden();
    const { request, emailed } = await this.makeLink(c, dto.kind, dto.amount ?? null, user.id, this.knex);
    const held = contractBalance(c.price, await this.repo.movements(c.id)).depositHeld;
    return {
      request,
      emailed,
      depositWarning: dto.kind === 'deposit' ? this.warningFor(c, request.amount, held) : null,
    };
  }

  /**
   * Makes a Checkout Session for the contract and stores it as the open link of its kind (an older open
   * link of the same kind is cancelled here and expired at the processor), then e-mails it to the
   * homeowner once `db`'s transaction has committed. Used by the salesperson's request and, at completion,
   * for the balance (inside the completion's transaction).
   */
  async makeLink(
    c: PayableContract,
    kind: PaymentKind,
    typed: string | null,
    createdBy: string | null,
    db: Db,
  ): Promise<{ request: PaymentRequestView; emailed: boolean }> {
    if (c.cancelledAt) {
      throw rule('PAYMENT.CONTRACT_CANCELLED', 'The contract was cancelled: nothing is to be paid under it.');
    }
    const stripe = this.sdk();
    const b = contractBalance(c.price, await this.repo.movements(c.id, db));
    const chosen = linkAmount({ kind, typed, contractDeposit: c.depositAmount, balanceDue: b.balanceDue });
    if (!chosen.ok) {
      throw rule(chosen.problem.code, chosen.problem.message, { field: 'amount' });
    }
    const amount = chosen.amount;
    const requestId = randomUUID();
    const metadata = { contractId: c.id, branchId: c.branchId, kind, paymentRequestId: requestId };
    const description = `${KIND_LABEL[kind]} — ${c.optionTitle}`.slice(0, 250);
    let session: Stripe.Checkout.Session;
    try {
      session = await stripe.checkout.sessions.create(
        {
          mode: 'payment',
          line_items: [
            {
              price_data: {
                currency: 'usd',
                unit_amount: sdkMinorUnits(amount),
                product_data: { name: `${description} (${c.branchName})`.slice(0, 250) },
              },
              quantity: 1,
            },
          ],
          ...(c.email ? { customer_email: c.email } : {}),
          client_reference_id: c.id,
          metadata,
          payment_intent_data: { metadata, description },
          success_url: `${this.config.publicUrl}${THANK_YOU_PATH}?session_id={CHECKOUT_SESSION_ID}`,
          cancel_url: `${this.config.publicUrl}${CANCELLED_PATH}`,
        },
        { idempotencyKey: `link:${requestId}` },
      );
    } catch (e) {
      throw processorError(e);
    }
    if (!session.url) throw new Error(`Checkout session ${session.id} came back without a URL.`);

    const replaced: string[] = [];
    const request = await inTransaction(db, async (trx) => {
      await this.repo.contract(c.id, trx, true);
      const open = await this.repo.openRequest(c.id, kind, trx);
      if (open) {
        await this.repo.setRequestStatus(open.id, 'cancelled', trx);
        replaced.push(open.sessionId);
      }
      return this.repo.insertRequest(
        {
          id: requestId,
          contractId: c.id,
          branchId: c.branchId,
          kind,
          amount,
          currency: 'usd',
          checkoutSessionId: session.id,
          url: session.url!,
          expiresAt: session.expires_at ? new Date(session.expires_at * 1000) : null,
          createdBy,
        },
        trx,
      );
    });

    const afterCommit = async () => {
      for (const old of replaced) {
        await stripe.checkout.sessions.expire(old).catch((e: unknown) => {
          this.logger.warn({ session: old, err: String(e) }, 'Could not expire a replaced checkout session');
        });
      }
      return this.emailLink(c, request);
    };
    if (db.isTransaction) {
      // Inside someone's transaction (completion): mail only once it has committed.
      void (db as Knex.Transaction).executionPromise.then(afterCommit).catch(() => undefined);
      return { request, emailed: Boolean(c.email) };
    }
    const sent = await afterCommit();
    return { request: sent ?? request, emailed: sent !== null };
  }

  /** Sends the link to the homeowner; null when the lead has no e-mail or the mail did not go out. */
  private async emailLink(c: PayableContract, r: PaymentRequestView): Promise<PaymentRequestView | null> {
    if (!c.email || !r.url) return null;
    const expires =
      r.expiresAt !== null
        ? `${weekdayDate(todayInZone(c.timezone, new Date(r.expiresAt)))}, ${new Date(r.expiresAt).toLocaleTimeString('en-US', { timeZone: c.timezone, hour: 'numeric', minute: '2-digit' })}`
        : null;
    try {
      await this.mail.send({
        to: c.email,
        ...paymentLinkMail({
          homeownerName: c.homeownerName,
          branchName: c.branchName,
          branchPhone: c.branchPhone,
          kind: r.kind,
          amount: r.amount,
          optionTitle: c.optionTitle,
          link: r.url,
          expires,
        }),
      });
    } catch (e) {
      this.logger.warn({ request: r.id, err: String(e) }, 'The payment link e-mail did not go out');
      return null;
    }
    return this.repo.markEmailed(r.id, c.email, this.clock.now());
  }

  async resend(user: SessionUser, requestId: string): Promise<PaymentRequestView> {
    const found = await this.repo.request(requestId);
    if (!found) throw notFound('payment request');
    const c = await this.readable(user, found.view.contractId).catch(() => {
      throw notFound('payment request');
    });
    if (!this.canRequest(user, c)) throw forbidden();
    if (found.view.status !== 'open') {
      throw new DomainError('conflict', 'PAYMENT.LINK_CLOSED', 'This link no longer works: make a new one.', {
        status: found.view.status,
      });
    }
    if (found.view.expiresAt && new Date(found.view.expiresAt) <= this.clock.now()) {
      throw new DomainError('conflict', 'PAYMENT.LINK_CLOSED', 'This link has expired: make a new one.', {
        status: 'expired',
      });
    }
    if (!c.email) {
      throw rule(
        'PAYMENT.NO_EMAIL',
        'The lead has no e-mail address: copy the link and send it another way.',
      );
    }
    const sent = await this.emailLink(c, found.view);
    if (!sent) throw rule('PAYMENT.MAIL_FAILED', 'The e-mail did not go out. Try again, or copy the link.');
    return sent;
  }

  /** The public thank-you page asks whether the payment of its checkout has been recorded. */
  async checkoutStatus(sessionId: string): Promise<CheckoutStatus> {
    const found = /^cs_[A-Za-z0-9_]{8,200}$/.test(sessionId)
      ? await this.repo.requestBySession(sessionId)
      : undefined;
    if (!found) throw notFound('checkout', 'PAYMENT.CHECKOUT_UNKNOWN');
    const s = found.view.status;
    return {
      status: s === 'paid' ? 'received' : s === 'open' ? 'processing' : 'closed',
      kind: found.view.kind,
      amount: found.view.amount,
      branchName: found.branchName,
      branchPhone: found.branchPhone,
    };
  }

  // ---- the bookkeeper's recordings ---------------------------------------------------------------

  /** Cash, a cheque or a transfer that reached the bank: bank / customer deposits or receivable. */
  async recordPayment(
    user: SessionUser,
    contractId: string,
    dto: RecordPaymentRequest,
  ): Promise<PaymentView> {
    const c = await this.readable(user, contractId);
    if (!this.canRecord(user, c)) throw forbidden();
    const requestKey = dto.requestId ?? randomUUID();
    const again = await this.repo.paymentByRequestKey(requestKey);
    if (again) {
      if (again.contractId !== c.id)
        throw rule('PAYMENT.REQUEST_REUSED', 'This request id was used for another payment.');
      return this.repo.paymentView(again.id);
    }
    if (c.cancelledAt) {
      throw rule('PAYMENT.CONTRACT_CANCELLED', 'The contract was cancelled: nothing is to be paid under it.');
    }
    const today = todayInZone(c.timezone, this.clock.now());
    if (dto.receivedOn > today) {
      throw new DomainError('invalid', 'VALIDATION.FAILED', 'Some fields need attention.', [
        { field: 'receivedOn', message: 'The day the money was received cannot be in the future.' },
      ]);
    }
    const amount = money(dto.amount);
    if (!amount.greaterThan(0)) {
      throw new DomainError('invalid', 'VALIDATION.FAILED', 'Some fields need attention.', [
        { field: 'amount', message: 'Enter an amount above zero.' },
      ]);
    }
    const paymentId = await inTransaction(this.knex, async (trx) => {
      const locked = (await this.repo.contract(c.id, trx, true))!;
      const due = money(contractBalance(locked.price, await this.repo.movements(c.id, trx)).balanceDue);
      if (amount.greaterThan(due)) {
        throw rule(
          'PAYMENT.AMOUNT_TOO_LARGE',
          `That is more than the ${formatUsd(due)} left to pay on the contract.`,
          {
            field: 'amount',
          },
        );
      }
      const amountText = toMoneyString(amount);
      const posting =
        dto.kind === 'deposit'
          ? depositReceivedToBank({ amount: amountText, method: dto.method })
          : balancePaidToBank({ amount: amountText, method: dto.method });
      if (dto.reference) posting.memo = `${posting.memo} (${dto.reference})`.slice(0, 500);
      const { entry } = await this.ledger.post(
        posting,
        {
          branchId: c.branchId,
          idempotencyKey: `payment:${requestKey}`,
          source: { kind: 'user', userId: user.id },
          effectiveOn: dto.receivedOn,
          leadId: c.leadId,
          contractId: c.id,
        },
        trx,
      );
      const id = await this.repo.insertPayment(
        {
          contractId: c.id,
          branchId: c.branchId,
          paymentRequestId: null,
          kind: dto.kind,
          method: dto.method,
          amount: amountText,
          fee: '0.00',
          net: amountText,
          currency: 'usd',
          paymentIntentId: null,
          chargeId: null,
          balanceTransactionId: null,
          cardBrand: null,
          cardLast4: null,
          reference: dto.reference?.trim() || null,
          receivedOn: dto.receivedOn,
          recordedBy: user.id,
          requestKey,
          journalEntryId: entry.id,
        },
        trx,
        {
          leadId: c.leadId,
          body:
            `${dto.kind === 'deposit' ? 'Deposit' : 'Balance payment'} of ${formatUsd(amountText)} received by ` +
            `${BANK_METHOD_LABELS[dto.method]}${dto.reference?.trim() ? ` (${dto.reference.trim()})` : ''}.`,
          actorId: user.id,
        },
      );
      if (!id)
        throw new DomainError('conflict', 'PAYMENT.ALREADY_RECORDED', 'This payment was recorded already.');
      await this.postings.afterPayment(locked, dto.kind, this.clock.now(), user.id, trx);
      return id;
    });
    return this.repo.paymentView(paymentId);
  }

  /**
   * Gives a cancelled contract's card payments back through the processor (16 CFR 429: every payment is
   * returned after a cancellation). The refund is recorded and posted here at once, under the refund's id,
   * so the charge.refunded webhook that follows finds it done.
   */
  async refund(user: SessionUser, contractId: string, dto: RefundRequest): Promise<RefundView[]> {
    const c = await this.readable(user, contractId);
    if (!this.canRecord(user, c)) throw forbidden();
    if (!c.cancelledAt) {
      throw rule('PAYMENT.REFUND_NOT_CANCELLED', 'Refunds are made here only for a cancelled contract.');
    }
    const cards = (await this.repo.refundableCardPayments(c.id)).filter((p) =>
      money(p.remaining).greaterThan(0),
    );
    const refundable = cards.reduce((a, p) => a.plus(money(p.remaining)), new MoneyDecimal(0));
    if (refundable.isZero()) {
      throw rule('PAYMENT.NOTHING_TO_REFUND', 'No card payment of this contract is left to refund.');
    }
    const wanted = dto.amount ? money(dto.amount) : refundable;
    if (!wanted.greaterThan(0) || wanted.greaterThan(refundable)) {
      throw rule(
        'PAYMENT.REFUND_TOO_LARGE',
        `At most ${formatUsd(refundable)} can be refunded to the card.`,
        {
          field: 'amount',
        },
      );
    }
    const stripe = this.sdk();
    const requestKey = dto.requestId ?? randomUUID();
    const reason = dto.reason?.trim() || null;
    let left = wanted;
    const ids: string[] = [];
    for (const p of cards) {
      if (left.isZero()) break;
      const part = MoneyDecimal.min(left, money(p.remaining));
      left = left.minus(part);
      let refund: Stripe.Refund;
      try {
        refund = await stripe.refunds.create(
          {
            charge: p.chargeId,
            amount: sdkMinorUnits(toMoneyString(part)),
            reason: 'requested_by_customer',
            metadata: { contractId: c.id, branchId: c.branchId, paymentId: p.id, requestedBy: user.id },
          },
          { idempotencyKey: `refund:${requestKey}:${p.id}` },
        );
      } catch (e) {
        throw processorError(e);
      }
      const id = await inTransaction(this.knex, async (trx) => {
        await this.postings.recordRefund(refund, { kind: 'user', userId: user.id }, trx, user.id);
        const row = await this.repo.refundByProcessorId(refund.id, trx);
        if (row) await this.repo.noteRefundRequester(row.id, user.id, reason, trx);
        return row?.id ?? null;
      });
      if (id) ids.push(id);
    }
    return this.repo.refundViews(ids);
  }

  // ---- the bookkeeper's list --------------------------------------------------------------------

  async list(
    user: SessionUser,
    q: {
      branchId?: string;
      from?: string;
      to?: string;
      method?: PaymentListFilter['method'];
      kind?: PaymentKind;
      page?: string;
      pageSize?: string;
    },
  ): Promise<PaymentList> {
    const scope = branchScope(user, 'money');
    if (q.branchId && scope && !scope.includes(q.branchId)) throw notFound('branch');
    if (q.from && q.to && q.from > q.to) {
      throw new DomainError('invalid', 'VALIDATION.FAILED', 'Some fields need attention.', [
        { field: 'to', message: 'The end date is before the start date.' },
      ]);
    }
    const page = Number.parseInt(q.page ?? '1', 10) || 1;
    const pageSize = Number.parseInt(q.pageSize ?? '25', 10) || 25;
    const r = await this.repo.list({
      branchIds: scope,
      branchId: q.branchId,
      from: q.from,
      to: q.to,
      method: q.method,
      kind: q.kind,
      page,
      pageSize,
    });
    return { ...r, page, pageSize };
  }
}

/**
 * A failed call to the processor as a rule the user can read: a refusal (a card error, a bad request) or
 * the processor out of reach (after the SDK's own retries). Nothing of ours was written before the call.
 */
function processorError(e: unknown): Error {
  if (e instanceof Stripe.errors.StripeError && e.statusCode && e.statusCode < 500) {
    return new DomainError('rule', 'PAYMENT.PROCESSOR_REFUSED', `The card processor refused: ${e.message}`, {
      processorCode: e.code ?? null,
    });
  }
  return new DomainError(
    'rule',
    'PAYMENT.PROCESSOR_UNAVAILABLE',
    'The card processor could not be reached. Try again in a few minutes.',
  );
}
