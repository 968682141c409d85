import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';
import type {
  LeadStage,
  PaymentKind,
  PaymentListRow,
  PaymentMethod,
  PaymentRequestStatus,
  PaymentRequestView,
  PaymentView,
  RefundView,
} from '@loambook/common';

/** A contract as the payments feature needs it: its money, its homeowner and its branch. */
export interface PayableContract {
  id: string;
  branchId: string;
  leadId: string;
  salespersonId: string | null;
  price: string;
  depositAmount: string;
  depositReceivedAt: Date | null;
  cancelledAt: Date | null;
  signedOn: string;
  optionTitle: string;
  homeownerName: string;
  email: string | null;
  state: string;
  branchName: string;
  branchPhone: string | null;
  timezone: string;
  jobCompleted: boolean;
  /** The lead's stage as read with the contract (the lead itself is locked only to move it). */
  leadStage: LeadStage;
}

export interface NewPaymentRequest {
  id: string;
  contractId: string;
  branchId: string;
  kind: PaymentKind;
  amount: string;
  currency: string;
  checkoutSessionId: string;
  url: string;
  expiresAt: Date | null;
  createdBy: string | null;
}

export interface NewPayment {
  contractId: string;
  branchId: string;
  paymentRequestId: string | null;
  kind: PaymentKind;
  method: PaymentMethod;
  amount: string;
  fee: string;
  net: string;
  currency: string;
  paymentIntentId: string | null;
  chargeId: string | null;
  balanceTransactionId: string | null;
  cardBrand: string | null;
  cardLast4: string | null;
  reference: string | null;
  receivedOn: string;
  recordedBy: string | null;
  requestKey: string | null;
  journalEntryId: string;
}

export interface StoredPayment {
  id: string;
  contractId: string;
  branchId: string;
  kind: PaymentKind;
  method: PaymentMethod;
  amount: string;
  chargeId: string | null;
  journalEntryId: string;
}

export interface NewRefund {
  contractId: string;
  branchId: string;
  paymentId: string;
  amount: string;
  currency: string;
  processorRefundId: string | null;
  balanceTransactionId: string | null;
  status: 'pending' | 'succeeded' | 'failed';
  reason: string | null;
  requestedBy: string | null;
  refundedOn: string;
  journalEntryId: string | null;
}

export interface NewPayoutItem {
  balanceTransactionId: string;
  type: string;
  sourceId: string | null;
  amount: string;
  fee: string;
  net: string;
  currency: string;
  branchId: string;
  paymentId: string | null;
  refundId: string | null;
}

export interface WebhookEventRow {
  eventId: string;
  type: string;
  apiVersion: string | null;
  created: Date;
  payload: string;
}

export interface PaymentListFilter {
  /** null: every branch (the bookkeeper, the owner). */
  branchIds: string[] | null;
  branchId?: string;
  from?: string;
  to?: string;
  method?: PaymentMethod;
  kind?: PaymentKind;
  page: number;
  pageSize: number;
}

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

/** The rows as PostgreSQL gives them (numeric as text, dates already as text through to_char). */
interface RequestRow {
  id: string;
  contract_id: string;
  kind: PaymentKind;
  amount: string;
  status: PaymentRequestStatus;
  url: string;
  expires_at: Date | null;
  emailed_to: string | null;
  emailed_at: Date | null;
  email_count: number;
  created_at: Date;
  paid_at: Date | null;
}

interface PaymentRow {
  id: string;
  contract_id: string;
  branch_id: string;
  kind: PaymentKind;
  method: PaymentMethod;
  amount: string;
  fee: string;
  net: string;
  refunded?: string;
  received_on: string;
  reference: string | null;
  card_brand: string | null;
  card_last4: string | null;
  recorded_by: string | null;
  recorded_by_name: string | null;
  journal_entry_id: string;
  created_at: Date;
}

interface RefundRow {
  id: string;
  payment_id: string;
  amount: string;
  status: RefundView['status'];
  reason: string | null;
  refunded_on: string;
  journal_entry_id: string | null;
  created_at: Date;
}

function requestView(r: RequestRow): PaymentRequestView {
  const live = r.status === 'open';
  return {
    id: r.id,
    contractId: r.contract_id,
    kind: r.kind,
    amount: r.amount,
    status: r.status,
    url: live ? r.url : null,
    expiresAt: iso(r.expires_at),
    emailedTo: r.emailed_to,
    emailedAt: iso(r.emailed_at),
    emailCount: r.email_count,
    createdAt: r.created_at.toISOString(),
    paidAt: iso(r.paid_at),
  };
}

function paymentView(r: PaymentRow): PaymentView {
  return {
    id: r.id,
    contractId: r.contract_id,
    branchId: r.branch_id,
    kind: r.kind,
    method: r.method,
    amount: r.amount,
    fee: r.fee,
    net: r.net,
    refunded: r.refunded ?? '0.00',
    receivedOn: r.received_on,
    reference: r.reference,
    cardBrand: r.card_brand,
    cardLast4: r.card_last4,
    recordedBy: r.recorded_by ? { id: r.recorded_by, name: r.recorded_by_name ?? '' } : null,
    journalEntryId: r.journal_entry_id,
    createdAt: r.created_at.toISOString(),
  };
}

function refundView(r: RefundRow): RefundView {
  return {
    id: r.id,
    paymentId: r.payment_id,
    amount: r.amount,
    status: r.status,
    reason: r.reason,
    refundedOn: r.refunded_on,
    journalEntryId: r.journal_entry_id,
    createdAt: r.created_at.toISOString(),
  };
}

const PAYMENT_COLUMNS = [
  'p.id',
  'p.contract_id',
  'p.branch_id',
  'p.kind',
  'p.method',
  'p.amount',
  'p.fee',
  'p.net',
  'p.reference',
  'p.card_brand',
  'p.card_last4',
  'p.recorded_by',
  'p.journal_entry_id',
  'p.created_at',
  'u.name as recorded_by_name',
];

const REFUND_COLUMNS = ['id', 'payment_id', 'amount', 'status', 'reason', 'journal_entry_id', 'created_at'];

/** The only file of the payments feature that touches Knex. */
@Injectable()
export class PaymentsRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  /** Dates come back as 'YYYY-MM-DD' text (to_char), never through a JavaScript Date. */
  private day(column: string, as: string) {
    return this.knex.raw(`to_char(${column}, 'YYYY-MM-DD') as ${as}`);
  }

  // ---- contracts --------------------------------------------------------------------------------

  async contract(id: string, db: Db = this.knex, forUpdate = false): Promise<PayableContract | undefined> {
    return this.contractQuery(id, db, forUpdate) as Promise<PayableContract | undefined>;
  }

  /**
   * The contract a charge names, locked for this transaction, with whether that charge is recorded
   * already: one round trip on the webhook's hot path.
   */
  async contractForCharge(
    contractId: string,
    chargeId: string,
    db: Db,
  ): Promise<(PayableContract & { chargeKnown: boolean }) | undefined> {
    return this.contractForChargeQuery(contractId, chargeId, db) as Promise<
      (PayableContract & { chargeKnown: boolean }) | undefined
    >;
  }

  /** contractForCharge's statement, unrun (the webhook benchmark replays its SQL in pgbench). */
  contractForChargeQuery(contractId: string, chargeId: string, db: Db) {
    return this.contractQuery(contractId, db, true).select(
      db.raw('exists (select 1 from payments p where p.processor_charge_id = ?) as "chargeKnown"', [
        chargeId,
      ]),
    );
  }

  private contractQuery(id: string, db: Db, forUpdate: boolean) {
    const q = db('contracts as c')
      .join('leads as l', 'l.id', 'c.lead_id')
      .join('branches as b', 'b.id', 'c.branch_id')
      .join('proposal_options as o', 'o.id', 'c.option_id')
      .where('c.id', id)
      .first(
        'c.id',
        'c.branch_id as branchId',
        'c.lead_id as leadId',
        'c.salesperson_id as salespersonId',
        'c.price',
        'c.deposit_amount as depositAmount',
        'c.deposit_received_at as depositReceivedAt',
        'c.cancelled_at as cancelledAt',
        db.raw(`to_char(c.signed_on, 'YYYY-MM-DD') as "signedOn"`),
        'o.title as optionTitle',
        'l.homeowner_name as homeownerName',
        'l.email',
        'l.state',
        'l.stage as leadStage',
        'b.name as branchName',
        'b.phone as branchPhone',
        'b.timezone',
        db.raw(
          `exists (select 1 from jobs j where j.contract_id = c.id and j.status = 'completed') as "jobCompleted"`,
        ),
      );
    if (forUpdate) q.forUpdate('c');
    return q;
  }

  async setDepositReceived(contractId: string, at: Date, db: Db): Promise<boolean> {
    const n = await db('contracts')
      .where({ id: contractId })
      .whereNull('deposit_received_at')
      .update({ deposit_received_at: at });
    return n > 0;
  }

  async addLeadActivity(
    a: { leadId: string; branchId: string; body: string; data: object; actorId: string | null },
    db: Db,
  ): Promise<void> {
    await db('lead_activities').insert({
      lead_id: a.leadId,
      branch_id: a.branchId,
      kind: 'payment',
      body: a.body.slice(0, 4000),
      data: JSON.stringify(a.data),
      actor_id: a.actorId,
    });
  }

  /** Every payment and succeeded refund of a contract, with the kind of payment each gave back. */
  async movements(contractId: string, db: Db = this.knex) {
    const payments = (await db('payments')
      .where({ contract_id: contractId })
      .select('kind', 'amount', 'method')) as { kind: PaymentKind; amount: string; method: PaymentMethod }[];
    const refunds = (await db('refunds as r')
      .join('payments as p', 'p.id', 'r.payment_id')
      .where('r.contract_id', contractId)
      .where('r.status', 'succeeded')
      .select('p.kind', 'r.amount')) as { kind: PaymentKind; amount: string }[];
    return { payments, refunds };
  }

  // ---- payment requests -------------------------------------------------------------------------

  async insertRequest(r: NewPaymentRequest, db: Db): Promise<PaymentRequestView> {
    const [row] = await db('payment_requests')
      .insert({
        id: r.id,
        contract_id: r.contractId,
        branch_id: r.branchId,
        kind: r.kind,
        amount: r.amount,
        currency: r.currency,
        checkout_session_id: r.checkoutSessionId,
        url: r.url,
        expires_at: r.expiresAt,
        created_by: r.createdBy,
      })
      .returning('*');
    return requestView(row);
  }

  async openRequest(contractId: string, kind: PaymentKind, db: Db) {
    const row = await db('payment_requests')
      .where({ contract_id: contractId, kind, status: 'open' })
      .forUpdate()
      .first('id', 'checkout_session_id as sessionId');
    return row as { id: string; sessionId: string } | undefined;
  }

  async request(id: string, db: Db = this.knex) {
    const row = await db('payment_requests').where({ id }).first();
    return row
      ? { view: requestView(row), sessionId: row.checkout_session_id as string, url: row.url as string }
      : undefined;
  }

  async requestBySession(sessionId: string, db: Db = this.knex) {
    const row = await db('payment_requests as r')
      .join('branches as b', 'b.id', 'r.branch_id')
      .where('r.checkout_session_id', sessionId)
      .first('r.*', 'b.name as branch_name', 'b.phone as branch_phone');
    return row
      ? {
          view: requestView(row),
          branchName: row.branch_name as string,
          branchPhone: row.branch_phone as string | null,
        }
      : undefined;
  }

  async setRequestStatus(
    id: string,
    status: Exclude<PaymentRequestStatus, 'paid'>,
    db: Db,
    onlyFrom: PaymentRequestStatus[] = ['open'],
  ): Promise<void> {
    await db('payment_requests').where({ id }).whereIn('status', onlyFrom).update({ status });
  }

  async expireBySession(sessionId: string, db: Db): Promise<void> {
    await db('payment_requests')
      .where({ checkout_session_id: sessionId, status: 'open' })
      .update({ status: 'expired' });
  }

  async markRequestPaid(id: string, at: Date, db: Db): Promise<void> {
    await db('payment_requests')
      .where({ id })
      .whereNot({ status: 'paid' })
      .update({ status: 'paid', paid_at: at });
  }

  async markEmailed(id: string, to: string, at: Date, db: Db = this.knex): Promise<PaymentRequestView> {
    const [row] = await db('payment_requests')
      .where({ id })
      .update({ emailed_to: to, emailed_at: at, email_count: db.raw('email_count + 1') })
      .returning('*');
    return requestView(row);
  }

  async requests(contractId: string, db: Db = this.knex): Promise<PaymentRequestView[]> {
    const rows = await db('payment_requests')
      .where({ contract_id: contractId })
      .orderBy('created_at', 'desc');
    return rows.map(requestView);
  }

  // ---- payments ---------------------------------------------------------------------------------

  /**
   * Inserts the payment unless one with the same processor ids or request key exists (null then), and in
   * the same statement the lead's timeline entry for it (one round trip on the webhook's hot path). The
   * payment request is named only if it exists (the metadata of a session whose row was never committed
   * names a request that is not there).
   */
  async insertPayment(
    p: NewPayment,
    db: Db,
    activity: { leadId: string; body: string; actorId: string | null },
  ): Promise<string | null> {
    const r = await db.raw(
      `with p as (
         insert into payments (contract_id, branch_id, payment_request_id, kind, method, amount, fee, net, currency,
           processor_payment_intent_id, processor_charge_id, processor_balance_transaction_id, card_brand, card_last4,
           reference, received_on, recorded_by, request_key, journal_entry_id)
         values (?, ?, (select r.id from payment_requests r where r.id = ?), ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?,
           ?, ?, ?)
         on conflict do nothing
         returning id, branch_id, kind, amount)
       insert into lead_activities (lead_id, branch_id, kind, body, data, actor_id)
       select ?, p.branch_id, 'payment', ?,
              jsonb_build_object('paymentId', p.id, 'kind', p.kind, 'amount', p.amount::text), ?
         from p
       returning data ->> 'paymentId' as id`,
      [
        p.contractId,
        p.branchId,
        p.paymentRequestId,
        p.kind,
        p.method,
        p.amount,
        p.fee,
        p.net,
        p.currency,
        p.paymentIntentId,
        p.chargeId,
        p.balanceTransactionId,
        p.cardBrand,
        p.cardLast4,
        p.reference,
        p.receivedOn,
        p.recordedBy,
        p.requestKey,
        p.journalEntryId,
        activity.leadId,
        activity.body.slice(0, 4000),
        activity.actorId,
      ],
    );
    return (r.rows[0]?.id as string | undefined) ?? null;
  }

  private storedPayment(db: Db) {
    return db('payments').select(
      'id',
      'contract_id as contractId',
      'branch_id as branchId',
      'kind',
      'method',
      'amount',
      'processor_charge_id as chargeId',
      'journal_entry_id as journalEntryId',
    );
  }

  async paymentByCharge(chargeId: string, db: Db = this.knex): Promise<StoredPayment | undefined> {
    return this.storedPayment(db).where({ processor_charge_id: chargeId }).first();
  }

  async paymentByIntent(paymentIntentId: string, db: Db = this.knex): Promise<StoredPayment | undefined> {
    return this.storedPayment(db).where({ processor_payment_intent_id: paymentIntentId }).first();
  }

  async paymentByRequestKey(key: string, db: Db = this.knex): Promise<StoredPayment | undefined> {
    return this.storedPayment(db).where({ request_key: key }).first();
  }

  /** The card payments of a contract with what is left to refund on each, oldest first. */
  async refundableCardPayments(contractId: string, db: Db = this.knex) {
    const rows = await db('payments as p')
      .where({ 'p.contract_id': contractId, 'p.method': 'card' })
      .select(
        'p.id',
        'p.kind',
        'p.amount',
        'p.processor_charge_id as chargeId',
        db.raw(
          `p.amount - coalesce((select sum(r.amount) from refunds r where r.payment_id = p.id
             and r.status <> 'failed'), 0) as "remaining"`,
        ),
      )
      .orderBy('p.created_at');
    return rows as { id: string; kind: PaymentKind; amount: string; chargeId: string; remaining: string }[];
  }

  async payments(contractId: string, db: Db = this.knex): Promise<PaymentView[]> {
    const rows = await db('payments as p')
      .leftJoin('users as u', 'u.id', 'p.recorded_by')
      .where('p.contract_id', contractId)
      .select(
        ...PAYMENT_COLUMNS,
        this.day('p.received_on', 'received_on'),
        db.raw(
          `coalesce((select sum(r.amount) from refunds r where r.payment_id = p.id and r.status = 'succeeded'),
             0)::numeric(14,2)::text as refunded`,
        ),
      )
      .orderBy('p.received_on')
      .orderBy('p.created_at');
    return rows.map(paymentView);
  }

  async paymentView(id: string, db: Db = this.knex): Promise<PaymentView> {
    const row = await db('payments as p')
      .leftJoin('users as u', 'u.id', 'p.recorded_by')
      .where('p.id', id)
      .first(...PAYMENT_COLUMNS, this.day('p.received_on', 'received_on'));
    return paymentView(row);
  }

  async list(
    f: PaymentListFilter,
    db: Db = this.knex,
  ): Promise<{
    rows: PaymentListRow[];
    total: number;
    totals: { amount: string; fee: string; net: string };
  }> {
    const base = () => {
      const q = db('payments as p');
      if (f.branchIds) q.whereIn('p.branch_id', f.branchIds);
      if (f.branchId) q.where('p.branch_id', f.branchId);
      if (f.from) q.where('p.received_on', '>=', f.from);
      if (f.to) q.where('p.received_on', '<=', f.to);
      if (f.method) q.where('p.method', f.method);
      if (f.kind) q.where('p.kind', f.kind);
      return q;
    };
    const sums = await base().first(
      db.raw('count(*)::int as total'),
      db.raw('coalesce(sum(p.amount), 0)::numeric(14,2)::text as amount'),
      db.raw('coalesce(sum(p.fee), 0)::numeric(14,2)::text as fee'),
      db.raw('coalesce(sum(p.net), 0)::numeric(14,2)::text as net'),
    );
    const rows = await base()
      .join('contracts as c', 'c.id', 'p.contract_id')
      .join('leads as l', 'l.id', 'c.lead_id')
      .join('branches as b', 'b.id', 'p.branch_id')
      .leftJoin('users as u', 'u.id', 'p.recorded_by')
      .select(
        ...PAYMENT_COLUMNS,
        this.day('p.received_on', 'received_on'),
        'b.code as branch_code',
        'c.lead_id',
        'l.homeowner_name',
        db.raw(
          `coalesce((select sum(r.amount) from refunds r where r.payment_id = p.id and r.status = 'succeeded'),
             0)::numeric(14,2)::text as refunded`,
        ),
      )
      .orderBy('p.received_on', 'desc')
      .orderBy('p.created_at', 'desc')
      .limit(f.pageSize)
      .offset((f.page - 1) * f.pageSize);
    return {
      rows: rows.map((r: PaymentRow & { branch_code: string; lead_id: string; homeowner_name: string }) => ({
        ...paymentView(r),
        branchCode: r.branch_code,
        leadId: r.lead_id,
        homeownerName: r.homeowner_name,
      })),
      total: sums.total,
      totals: { amount: sums.amount, fee: sums.fee, net: sums.net },
    };
  }

  // ---- refunds ----------------------------------------------------------------------------------

  async refundByProcessorId(processorRefundId: string, db: Db = this.knex) {
    return db('refunds')
      .where({ processor_refund_id: processorRefundId })
      .first('id', 'status', 'journal_entry_id as journalEntryId') as Promise<
      { id: string; status: string; journalEntryId: string | null } | undefined
    >;
  }

  /** Inserts the refund unless its processor id is known: returns the id either way. */
  async upsertRefund(r: NewRefund, db: Db): Promise<{ id: string; created: boolean }> {
    const rows = await db('refunds')
      .insert({
        contract_id: r.contractId,
        branch_id: r.branchId,
        payment_id: r.paymentId,
        amount: r.amount,
        currency: r.currency,
        processor_refund_id: r.processorRefundId,
        processor_balance_transaction_id: r.balanceTransactionId,
        status: r.status,
        reason: r.reason,
        requested_by: r.requestedBy,
        refunded_on: r.refundedOn,
        journal_entry_id: r.journalEntryId,
      })
      .onConflict('processor_refund_id')
      .ignore()
      .returning('id');
    if (rows[0]) return { id: rows[0].id, created: true };
    const found = await this.refundByProcessorId(r.processorRefundId!, db);
    return { id: found!.id, created: false };
  }

  async noteRefundRequester(id: string, userId: string, reason: string | null, db: Db): Promise<void> {
    await db('refunds')
      .where({ id })
      .whereNull('requested_by')
      .update({ requested_by: userId, ...(reason ? { reason } : {}) });
  }

  async refunds(contractId: string, db: Db = this.knex): Promise<RefundView[]> {
    const rows = await db('refunds')
      .where({ contract_id: contractId })
      .select(...REFUND_COLUMNS, this.day('refunded_on', 'refunded_on'))
      .orderBy('created_at');
    return rows.map(refundView);
  }

  async refundViews(ids: string[], db: Db = this.knex): Promise<RefundView[]> {
    const rows = await db('refunds')
      .whereIn('id', ids)
      .select(...REFUND_COLUMNS, this.day('refunded_on', 'refunded_on'))
      .orderBy('created_at');
    return rows.map(refundView);
  }

  // ---- payouts ----------------------------------------------------------------------------------

  /** Inserts the payout unless its processor id is known: null then (it was recorded before). */
  async insertPayout(
    p: {
      processorPayoutId: string;
      amount: string;
      currency: string;
      arrivalDate: string;
      status: string;
      balanceTransactionId: string | null;
      createdAt: Date;
    },
    db: Db,
  ): Promise<string | null> {
    const rows = await db('processor_payouts')
      .insert({
        processor_payout_id: p.processorPayoutId,
        amount: p.amount,
        currency: p.currency,
        arrival_date: p.arrivalDate,
        status: p.status,
        processor_balance_transaction_id: p.balanceTransactionId,
        processor_created_at: p.createdAt,
      })
      .onConflict('processor_payout_id')
      .ignore()
      .returning('id');
    return rows[0]?.id ?? null;
  }

  async insertPayoutItems(payoutId: string, items: NewPayoutItem[], db: Db): Promise<void> {
    for (let i = 0; i < items.length; i += 500) {
      await db('processor_payout_items').insert(
        items.slice(i, i + 500).map((it) => ({
          payout_id: payoutId,
          processor_balance_transaction_id: it.balanceTransactionId,
          type: it.type,
          source_id: it.sourceId,
          amount: it.amount,
          fee: it.fee,
          net: it.net,
          currency: it.currency,
          branch_id: it.branchId,
          payment_id: it.paymentId,
          refund_id: it.refundId,
        })),
      );
    }
  }

  async insertPayoutBranch(
    b: {
      payoutId: string;
      branchId: string;
      gross: string;
      fee: string;
      net: string;
      itemCount: number;
      journalEntryId: string | null;
    },
    db: Db,
  ): Promise<void> {
    await db('processor_payout_branches').insert({
      payout_id: b.payoutId,
      branch_id: b.branchId,
      gross: b.gross,
      fee: b.fee,
      net: b.net,
      item_count: b.itemCount,
      journal_entry_id: b.journalEntryId,
    });
  }

  async refundForPayout(processorRefundId: string, db: Db) {
    return db('refunds')
      .where({ processor_refund_id: processorRefundId })
      .first('id', 'branch_id as branchId') as Promise<{ id: string; branchId: string } | undefined>;
  }

  async branchZone(branchId: string, db: Db = this.knex): Promise<string> {
    const row = await db('branches').where({ id: branchId }).first('timezone');
    return row?.timezone ?? 'UTC';
  }

  // ---- webhook events ---------------------------------------------------------------------------

  /**
   * Claims the event for this transaction: true when it is new (or only failed before), false when it was
   * processed already. One indexed insert; a concurrent copy waits on the unique index until this
   * transaction ends, then sees it processed.
   */
  async claimEvent(e: WebhookEventRow, db: Db): Promise<boolean> {
    const r = await db.raw(
      `insert into webhook_events (event_id, type, api_version, created, payload, processed_at, outcome)
       values (?, ?, ?, ?, ?::jsonb, now(), 'processed')
       on conflict (event_id) do update
         set attempts = webhook_events.attempts + 1, processed_at = now(), outcome = 'processed',
             last_error = null, received_at = now()
         where webhook_events.processed_at is null
       returning id`,
      [e.eventId, e.type, e.apiVersion, e.created, e.payload],
    );
    return r.rows.length > 0;
  }

  /** Whether the event was processed already (webhook_events.event_id is unique, so this is an index lookup). */
  async eventProcessed(eventId: string, db: Db = this.knex): Promise<boolean> {
    const r = await db.raw('select 1 from webhook_events where event_id = ? and processed_at is not null', [
      eventId,
    ]);
    return r.rows.length > 0;
  }

  async markEventIgnored(eventId: string, db: Db) {
    await db('webhook_events').where({ event_id: eventId }).update({ outcome: 'ignored' });
  }

  /** After a failed attempt (its transaction rolled back): notes it, unprocessed, for the retry and for people. */
  async noteEventFailure(e: WebhookEventRow, error: string, db: Db = this.knex): Promise<void> {
    await db.raw(
      `insert into webhook_events (event_id, type, api_version, created, payload, last_error)
       values (?, ?, ?, ?, ?::jsonb, ?)
       on conflict (event_id) do update
         set attempts = webhook_events.attempts + 1, last_error = excluded.last_error, received_at = now()
         where webhook_events.processed_at is null`,
      [e.eventId, e.type, e.apiVersion, e.created, e.payload, error.slice(0, 2000)],
    );
  }
}
