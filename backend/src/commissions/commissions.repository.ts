import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import type {
  CommissionLineKind,
  CommissionMilestone,
  CommissionPlan,
  CommissionPlanBasis,
  CommissionPlanView,
  CommissionRate,
  CommissionStatementLineView,
  CommissionStatementStatus,
  CommissionStatementSummary,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

type Row = Record<string, unknown>;

const DATE = (column: string) => `to_char(${column}, 'YYYY-MM-DD')`;
const iso = (v: unknown) => (v instanceof Date ? v.toISOString() : v === null ? null : String(v));

export interface PlanRow extends CommissionPlan {
  id: string;
  branchId: string | null;
  name: string;
  effectiveFrom: string;
  active: boolean;
}

export interface NewPlan {
  branchId: string | null;
  name: string;
  basis: CommissionPlanBasis;
  rate: CommissionRate;
  firstMilestonePct: string;
  effectiveFrom: string;
  active: boolean;
  createdBy: string;
}

/** A contract with every fact the commission rules read. */
export interface CommissionContract {
  id: string;
  branchId: string;
  leadId: string;
  jobId: string | null;
  salespersonId: string | null;
  homeownerName: string;
  timeZone: string;
  /** Net price excluding sales tax: the contract price less the tax inside it. */
  netPrice: string;
  /** Every cost the contractor bears (net − gross profit of the signed option). */
  cost: string;
  signedAt: Date;
  signedOn: string;
  lastDayToCancel: string;
  cancelledAt: Date | null;
  depositAmount: string;
  depositReceivedAt: Date | null;
  completedAt: Date | null;
}

export interface SplitRow {
  salespersonId: string;
  salespersonName: string;
  sharePct: string;
  monthVolumeBefore: string;
  planId: string;
  position: number;
}

export interface NewSplit {
  salespersonId: string;
  sharePct: string;
  monthVolumeBefore: string;
  position: number;
}

export interface LineRow {
  id: string;
  salespersonId: string;
  branchId: string;
  milestone: CommissionMilestone;
  kind: CommissionLineKind;
  /** Positive, as stored. */
  amount: string;
  effectiveOn: string;
  statementId: string | null;
}

export interface NewLine {
  idempotencyKey: string;
  contractId: string;
  salespersonId: string;
  branchId: string;
  milestone: CommissionMilestone;
  kind: CommissionLineKind;
  amount: string;
  effectiveOn: string;
  journalEntryId: string;
}

export interface StatementRow {
  id: string;
  salespersonId: string;
  branchId: string;
  periodStart: string;
  periodEnd: string;
  status: CommissionStatementStatus;
  earned: string;
  clawedBack: string;
  carriedIn: string;
  net: string;
  payable: string;
}

export interface StatementTotals {
  earned: string;
  clawedBack: string;
  carriedIn: string;
  net: string;
  payable: string;
}

export interface StatementFilter {
  branchId?: string;
  salespersonId?: string;
  periodStart?: string;
  status?: CommissionStatementStatus;
}

/** Who may see which statements: every one (null), some branches, or one salesperson's own. */
export type StatementScope = { branchIds: string[] | null; salespersonId: string | null };

function planFrom(r: Row): PlanRow {
  return {
    id: r.id as string,
    branchId: (r.branch_id as string | null) ?? null,
    name: r.name as string,
    basis: r.basis as CommissionPlanBasis,
    rate: r.rate as CommissionRate,
    firstMilestonePct: r.first_milestone_pct as string,
    effectiveFrom: r.effective_from as string,
    active: r.active as boolean,
  };
}

const PLAN_COLUMNS = [
  'p.id',
  'p.branch_id',
  'p.name',
  'p.basis',
  'p.rate',
  'p.first_milestone_pct',
  'p.active',
  'p.created_at',
  'p.updated_at',
];

function statementSummaryFrom(r: Row): CommissionStatementSummary {
  const net = r.net as string;
  return {
    id: r.id as string,
    branchId: r.branch_id as string,
    branchCode: r.branch_code as string,
    salespersonId: r.salesperson_id as string,
    salespersonName: r.salesperson_name as string,
    periodStart: r.period_start as string,
    periodEnd: r.period_end as string,
    status: r.status as CommissionStatementStatus,
    earned: r.earned as string,
    clawedBack: r.clawed_back as string,
    carriedIn: r.carried_in as string,
    net,
    payable: r.payable as string,
    carriedOut: r.carried_out as string,
    lineCount: Number(r.line_count),
    approvedAt: iso(r.approved_at) as string | null,
    approvedByName: (r.approved_by_name as string | null) ?? null,
    paidAt: iso(r.paid_at) as string | null,
    paidOn: (r.paid_on as string | null) ?? null,
    paidReference: (r.paid_reference as string | null) ?? null,
    paidByName: (r.paid_by_name as string | null) ?? null,
    paidJournalEntryId: (r.paid_journal_entry_id as string | null) ?? null,
  };
}

@Injectable()
export class CommissionsRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  // ---- plans ------------------------------------------------------------------------------------------

  async plans(db: Db = this.knex): Promise<CommissionPlanView[]> {
    const rows = (await db('commission_plans as p')
      .leftJoin('branches as b', 'b.id', 'p.branch_id')
      .select(PLAN_COLUMNS)
      .select('b.code as branch_code')
      .select(db.raw(`${DATE('p.effective_from')} as effective_from`))
      .select(db.raw('exists (select 1 from contract_commission_splits s where s.plan_id = p.id) as in_use'))
      .orderByRaw('p.branch_id is not null, b.code, p.effective_from desc, p.created_at')) as Row[];
    return rows.map((r) => this.planView(r));
  }

  planView(r: Row): CommissionPlanView {
    const p = planFrom(r);
    return {
      id: p.id,
      branchId: p.branchId,
      branchCode: (r.branch_code as string | null) ?? null,
      name: p.name,
      basis: p.basis,
      rate: p.rate,
      firstMilestonePct: p.firstMilestonePct,
      effectiveFrom: p.effectiveFrom,
      active: p.active,
      inUse: r.in_use as boolean,
      createdAt: iso(r.created_at) as string,
      updatedAt: iso(r.updated_at) as string,
    };
  }

  async planViewById(id: string, db: Db = this.knex): Promise<CommissionPlanView | null> {
    const r = (await db('commission_plans as p')
      .leftJoin('branches as b', 'b.id', 'p.branch_id')
      .where('p.id', id)
      .first(PLAN_COLUMNS)
      .select('b.code as branch_code')
      .select(db.raw(`${DATE('p.effective_from')} as effective_from`))
      .select(
        db.raw('exists (select 1 from contract_commission_splits s where s.plan_id = p.id) as in_use'),
      )) as Row | undefined;
    return r ? this.planView(r) : null;
  }

  async plan(id: string, db: Db = this.knex): Promise<PlanRow | null> {
    const r = (await db('commission_plans as p')
      .where('p.id', id)
      .first(PLAN_COLUMNS)
      .select(db.raw(`${DATE('p.effective_from')} as effective_from`))) as Row | undefined;
    return r ? planFrom(r) : null;
  }

  async insertPlan(p: NewPlan, db: Db = this.knex): Promise<string> {
    const [row] = await db('commission_plans')
      .insert({
        branch_id: p.branchId,
        name: p.name,
        basis: p.basis,
        rate: JSON.stringify(p.rate),
        first_milestone_pct: p.firstMilestonePct,
        effective_from: p.effectiveFrom,
        active: p.active,
        created_by: p.createdBy,
      })
      .returning('id');
    return row.id as string;
  }

  async updatePlan(id: string, p: Omit<NewPlan, 'createdBy'>, db: Db = this.knex): Promise<void> {
    await db('commission_plans')
      .where({ id })
      .update({
        branch_id: p.branchId,
        name: p.name,
        basis: p.basis,
        rate: JSON.stringify(p.rate),
        first_milestone_pct: p.firstMilestonePct,
        effective_from: p.effectiveFrom,
        active: p.active,
      });
  }

  async planInUse(id: string, db: Db = this.knex): Promise<boolean> {
    return !!(await db('contract_commission_splits').where({ plan_id: id }).first('id'));
  }

  /**
   * The plan for a contract of `branchId` signed on `signedOn`: the branch's own active plan with the
   * latest start on or before that day, else the company-wide default chosen the same way.
   */
  async applicablePlan(branchId: string, signedOn: string, db: Db = this.knex): Promise<PlanRow | null> {
    const r = (await db('commission_plans as p')
      .where('p.active', true)
      .where('p.effective_from', '<=', signedOn)
      .where((q) => q.where('p.branch_id', branchId).orWhereNull('p.branch_id'))
      .orderByRaw('p.branch_id is null, p.effective_from desc')
      .first(PLAN_COLUMNS)
      .select(db.raw(`${DATE('p.effective_from')} as effective_from`))) as Row | undefined;
    return r ? planFrom(r) : null;
  }

  async branchExists(id: string, db: Db = this.knex): Promise<boolean> {
    return !!(await db('branches').where({ id }).first('id'));
  }

  // ---- contracts and splits ---------------------------------------------------------------------------

  private contractQuery(db: Db) {
    return db('contracts as c')
      .join('branches as b', 'b.id', 'c.branch_id')
      .join('leads as l', 'l.id', 'c.lead_id')
      .join('proposal_options as o', 'o.id', 'c.option_id')
      .leftJoin('jobs as j', 'j.contract_id', 'c.id')
      .select(
        'c.id',
        'c.branch_id',
        'c.lead_id',
        'c.salesperson_id',
        'c.signed_at',
        'c.cancelled_at',
        'c.deposit_amount',
        'c.deposit_received_at',
        'b.timezone',
        'l.homeowner_name',
        'j.id as job_id',
        'j.completed_at',
      )
      .select(
        db.raw('(c.price - c.tax)::text as net_price'),
        db.raw('(o.net_total - o.gross_profit)::text as cost'),
        db.raw(`${DATE('c.signed_on')} as signed_on`),
        db.raw(`${DATE('c.last_day_to_cancel')} as last_day_to_cancel`),
      );
  }

  private contractFrom(r: Row): CommissionContract {
    return {
      id: r.id as string,
      branchId: r.branch_id as string,
      leadId: r.lead_id as string,
      jobId: (r.job_id as string | null) ?? null,
      salespersonId: (r.salesperson_id as string | null) ?? null,
      homeownerName: r.homeowner_name as string,
      timeZone: r.timezone as string,
      netPrice: r.net_price as string,
      cost: r.cost as string,
      signedAt: r.signed_at as Date,
      signedOn: r.signed_on as string,
      lastDayToCancel: r.last_day_to_cancel as string,
      cancelledAt: (r.cancelled_at as Date | null) ?? null,
      depositAmount: r.deposit_amount as string,
      depositReceivedAt: (r.deposit_received_at as Date | null) ?? null,
      completedAt: (r.completed_at as Date | null) ?? null,
    };
  }

  async contract(id: string, db: Db = this.knex): Promise<CommissionContract | null> {
    const r = (await this.contractQuery(db).where('c.id', id).first()) as Row | undefined;
    return r ? this.contractFrom(r) : null;
  }

  /**
   * The contract, its row locked for the rest of the transaction: one earning check or split change
   * per contract at a time.
   */
  async lockedContract(id: string, trx: Knex.Transaction): Promise<CommissionContract | null> {
    await trx.raw('select id from contracts where id = ? for update', [id]);
    return this.contract(id, trx);
  }

  /** When a refund that unwinds the sale was made: every payment received has been refunded. */
  async refundedAt(contractId: string, db: Db = this.knex): Promise<Date | null> {
    const r = (await db.raw(
      `select (select max(r.created_at) from refunds r
                where r.contract_id = :id and r.status = 'succeeded') as last_refund,
              coalesce((select sum(amount) from refunds r
                         where r.contract_id = :id and r.status = 'succeeded'), 0)
                >= coalesce((select sum(amount) from payments p where p.contract_id = :id), 0)
              and exists (select 1 from payments p where p.contract_id = :id) as all_refunded`,
      { id: contractId },
    )) as { rows: { last_refund: Date | null; all_refunded: boolean }[] };
    const row = r.rows[0];
    return row && row.all_refunded ? row.last_refund : null;
  }

  async splits(contractId: string, db: Db = this.knex): Promise<SplitRow[]> {
    const rows = (await db('contract_commission_splits as s')
      .join('users as u', 'u.id', 's.salesperson_id')
      .where('s.contract_id', contractId)
      .orderBy('s.position')
      .select(
        's.salesperson_id',
        'u.name',
        's.share_pct',
        's.month_volume_before',
        's.plan_id',
        's.position',
      )) as Row[];
    return rows.map((r) => ({
      salespersonId: r.salesperson_id as string,
      salespersonName: r.name as string,
      sharePct: r.share_pct as string,
      monthVolumeBefore: r.month_volume_before as string,
      planId: r.plan_id as string,
      position: r.position as number,
    }));
  }

  async replaceSplits(
    contract: { id: string; branchId: string },
    planId: string,
    splits: NewSplit[],
    setBy: string | null,
    trx: Knex.Transaction,
  ): Promise<void> {
    await trx('contract_commission_splits').where({ contract_id: contract.id }).delete();
    await trx('contract_commission_splits').insert(
      splits.map((s) => ({
        contract_id: contract.id,
        branch_id: contract.branchId,
        salesperson_id: s.salespersonId,
        position: s.position,
        share_pct: s.sharePct,
        month_volume_before: s.monthVolumeBefore,
        plan_id: planId,
        set_by: setBy,
      })),
    );
  }

  async hasLines(contractId: string, db: Db = this.knex): Promise<boolean> {
    return !!(await db('commission_lines').where({ contract_id: contractId }).first('id'));
  }

  async eligibleSalespeople(branchId: string, db: Db = this.knex): Promise<{ id: string; name: string }[]> {
    const rows = (await db('users as u')
      .join('user_branches as ub', 'ub.user_id', 'u.id')
      .where({ 'ub.branch_id': branchId, 'u.active': true })
      .whereIn('u.role', ['salesperson', 'branch_manager', 'owner'])
      .orderBy('u.name')
      .select('u.id', 'u.name')) as Row[];
    return rows.map((r) => ({ id: r.id as string, name: r.name as string }));
  }

  async userNames(ids: string[], db: Db = this.knex): Promise<Map<string, string>> {
    if (ids.length === 0) return new Map();
    const rows = (await db('users').whereIn('id', ids).select('id', 'name')) as Row[];
    return new Map(rows.map((r) => [r.id as string, r.name as string]));
  }

  /**
   * The net price credited to the salesperson (net × their share) on the branch's contracts signed
   * earlier in the same calendar month (contracts.signed_on, the branch's date) and not cancelled by the
   * time this one was signed — so the figure is the same whenever it is computed. A contract whose split
   * is not stored yet credits its own salesperson 100%.
   */
  async monthVolumeBefore(c: CommissionContract, salespersonId: string, db: Db = this.knex): Promise<string> {
    const r = (await db.raw(
      `select round(coalesce(sum((c2.price - c2.tax) * coalesce(s.share_pct, 100) / 100), 0), 2)::text as volume
         from contracts c2
         left join contract_commission_splits s on s.contract_id = c2.id and s.salesperson_id = :sp
        where c2.branch_id = :branch and c2.id <> :id
          and date_trunc('month', c2.signed_on::timestamp) = date_trunc('month', cast(:signedOn as date)::timestamp)
          and c2.signed_at < :signedAt
          and (c2.cancelled_at is null or c2.cancelled_at > :signedAt)
          and (s.id is not null
               or (c2.salesperson_id = :sp
                   and not exists (select 1 from contract_commission_splits s2 where s2.contract_id = c2.id)))`,
      { sp: salespersonId, branch: c.branchId, id: c.id, signedOn: c.signedOn, signedAt: c.signedAt },
    )) as { rows: { volume: string }[] };
    return r.rows[0]?.volume ?? '0.00';
  }

  // ---- lines ------------------------------------------------------------------------------------------

  /**
   * Contracts the earning check looks at: those not cancelled whose completion milestone is not yet
   * earned, and those with an earning not yet clawed back (a cancellation or refund may have come).
   */
  async earningCandidates(db: Db = this.knex): Promise<string[]> {
    const r = (await db.raw(
      `select c.id from contracts c
        where c.cancelled_at is null
          and (c.salesperson_id is not null
               or exists (select 1 from contract_commission_splits s where s.contract_id = c.id))
          and not exists (select 1 from commission_lines l
                           where l.contract_id = c.id and l.milestone = 'job_completed' and l.kind = 'earning')
       union
       select e.contract_id from commission_lines e
        where e.kind = 'earning'
          and not exists (select 1 from commission_lines k
                           where k.contract_id = e.contract_id and k.salesperson_id = e.salesperson_id
                             and k.milestone = e.milestone and k.kind = 'clawback')
       order by 1`,
    )) as { rows: { id: string }[] };
    return r.rows.map((x) => x.id);
  }

  /** Commission lines with the columns lineFrom reads. */
  private lineQuery(db: Db) {
    return db('commission_lines').select(
      'id',
      'salesperson_id',
      'branch_id',
      'milestone',
      'kind',
      'amount',
      'statement_id',
      db.raw(`${DATE('effective_on')} as effective_on`),
    );
  }

  async lines(contractId: string, db: Db = this.knex): Promise<LineRow[]> {
    const rows = (await this.lineQuery(db).where({ contract_id: contractId }).orderBy('created_at')) as Row[];
    return rows.map(lineFrom);
  }

  /** Writes the line once: false when its key was already there. */
  async insertLine(l: NewLine, db: Db = this.knex): Promise<boolean> {
    const rows = (await db('commission_lines')
      .insert({
        idempotency_key: l.idempotencyKey,
        contract_id: l.contractId,
        salesperson_id: l.salespersonId,
        branch_id: l.branchId,
        milestone: l.milestone,
        kind: l.kind,
        amount: l.amount,
        effective_on: l.effectiveOn,
        journal_entry_id: l.journalEntryId,
      })
      .onConflict('idempotency_key')
      .ignore()
      .returning('id')) as Row[];
    return rows.length > 0;
  }

  // ---- statements -------------------------------------------------------------------------------------

  /** The (salesperson, branch) pairs with lines not yet on a statement, dated up to `upTo`. */
  async groupsWithUnplacedLines(
    upTo: string,
    db: Db = this.knex,
  ): Promise<{ salespersonId: string; branchId: string }[]> {
    const rows = (await db('commission_lines')
      .whereNull('statement_id')
      .where('effective_on', '<=', upTo)
      .distinct('salesperson_id', 'branch_id')
      .orderBy(['branch_id', 'salesperson_id'])) as Row[];
    return rows.map((r) => ({ salespersonId: r.salesperson_id as string, branchId: r.branch_id as string }));
  }

  async unplacedLines(
    salespersonId: string,
    branchId: string,
    upTo: string,
    db: Db = this.knex,
  ): Promise<LineRow[]> {
    const rows = (await this.lineQuery(db)
      .where({ salesperson_id: salespersonId, branch_id: branchId })
      .whereNull('statement_id')
      .where('effective_on', '<=', upTo)
      .orderBy(['effective_on', 'created_at'])) as Row[];
    return rows.map(lineFrom);
  }

  async linesOnStatements(ids: string[], db: Db = this.knex): Promise<LineRow[]> {
    if (ids.length === 0) return [];
    const rows = (await this.lineQuery(db)
      .whereIn('statement_id', ids)
      .orderBy(['effective_on', 'created_at'])) as Row[];
    return rows.map(lineFrom);
  }

  /** The salesperson's statements in the branch, oldest first, locked for the build. */
  async groupStatements(
    salespersonId: string,
    branchId: string,
    trx: Knex.Transaction,
  ): Promise<StatementRow[]> {
    const rows = (await trx('commission_statements')
      .where({ salesperson_id: salespersonId, branch_id: branchId })
      .orderBy('period_start')
      .forUpdate()
      .select(
        'id',
        'salesperson_id',
        'branch_id',
        'status',
        'earned',
        'clawed_back',
        'carried_in',
        'net',
        'payable',
        trx.raw(`${DATE('period_start')} as period_start`),
        trx.raw(`${DATE('period_end')} as period_end`),
      )) as Row[];
    return rows.map(statementRowFrom);
  }

  async statementRow(id: string, db: Db = this.knex, lock = false): Promise<StatementRow | null> {
    const q = db('commission_statements')
      .where({ id })
      .first(
        'id',
        'salesperson_id',
        'branch_id',
        'status',
        'earned',
        'clawed_back',
        'carried_in',
        'net',
        'payable',
        db.raw(`${DATE('period_start')} as period_start`),
        db.raw(`${DATE('period_end')} as period_end`),
      );
    const r = (await (lock ? q.forUpdate() : q)) as Row | undefined;
    return r ? statementRowFrom(r) : null;
  }

  async insertDraft(
    s: { salespersonId: string; branchId: string; periodStart: string; periodEnd: string } & StatementTotals,
    db: Db = this.knex,
  ): Promise<string> {
    const [row] = await db('commission_statements')
      .insert({
        salesperson_id: s.salespersonId,
        branch_id: s.branchId,
        period_start: s.periodStart,
        period_end: s.periodEnd,
        earned: s.earned,
        clawed_back: s.clawedBack,
        carried_in: s.carriedIn,
        net: s.net,
        payable: s.payable,
      })
      .returning('id');
    return row.id as string;
  }

  async updateDraftTotals(id: string, t: StatementTotals, db: Db = this.knex): Promise<void> {
    await db('commission_statements').where({ id, status: 'draft' }).update({
      earned: t.earned,
      clawed_back: t.clawedBack,
      carried_in: t.carriedIn,
      net: t.net,
      payable: t.payable,
    });
  }

  async placeLines(lineIds: string[], statementId: string, db: Db = this.knex): Promise<void> {
    if (lineIds.length === 0) return;
    await db('commission_lines').whereIn('id', lineIds).whereNull('statement_id').update({
      statement_id: statementId,
    });
  }

  /** An earlier statement of the same salesperson and branch still in draft. */
  async earlierDraft(s: StatementRow, db: Db = this.knex): Promise<string | null> {
    const r = (await db('commission_statements')
      .where({ salesperson_id: s.salespersonId, branch_id: s.branchId, status: 'draft' })
      .where('period_start', '<', s.periodStart)
      .first(db.raw(`${DATE('period_start')} as period_start`))) as Row | undefined;
    return r ? (r.period_start as string) : null;
  }

  async approve(id: string, userId: string, db: Db = this.knex): Promise<void> {
    await db('commission_statements')
      .where({ id, status: 'draft' })
      .update({ status: 'approved', approved_by: userId, approved_at: db.fn.now() });
  }

  async markPaid(
    id: string,
    p: { userId: string; paidOn: string; reference: string | null; journalEntryId: string | null },
    db: Db = this.knex,
  ): Promise<void> {
    await db('commission_statements').where({ id, status: 'approved' }).update({
      status: 'paid',
      paid_by: p.userId,
      paid_at: db.fn.now(),
      paid_on: p.paidOn,
      paid_reference: p.reference,
      paid_journal_entry_id: p.journalEntryId,
    });
  }

  private summaryQuery(db: Db) {
    return db('commission_statements as s')
      .join('branches as b', 'b.id', 's.branch_id')
      .join('users as u', 'u.id', 's.salesperson_id')
      .leftJoin('users as ab', 'ab.id', 's.approved_by')
      .leftJoin('users as pb', 'pb.id', 's.paid_by')
      .select(
        's.id',
        's.branch_id',
        'b.code as branch_code',
        's.salesperson_id',
        'u.name as salesperson_name',
        's.status',
        's.earned',
        's.clawed_back',
        's.carried_in',
        's.net',
        's.payable',
        's.approved_at',
        'ab.name as approved_by_name',
        's.paid_at',
        's.paid_reference',
        'pb.name as paid_by_name',
        's.paid_journal_entry_id',
      )
      .select(
        db.raw(`${DATE('s.period_start')} as period_start`),
        db.raw(`${DATE('s.period_end')} as period_end`),
        db.raw(`${DATE('s.paid_on')} as paid_on`),
        db.raw('least(s.net, 0)::numeric(14,2)::text as carried_out'),
        db.raw('(select count(*) from commission_lines l where l.statement_id = s.id) as line_count'),
      );
  }

  async statementSummary(id: string, db: Db = this.knex): Promise<CommissionStatementSummary | null> {
    const r = (await this.summaryQuery(db).where('s.id', id).first()) as Row | undefined;
    return r ? statementSummaryFrom(r) : null;
  }

  async statementSummaries(ids: string[], db: Db = this.knex): Promise<CommissionStatementSummary[]> {
    if (ids.length === 0) return [];
    const rows = (await this.summaryQuery(db)
      .whereIn('s.id', ids)
      .orderBy(['b.code', 'u.name', 's.period_start'])) as Row[];
    return rows.map(statementSummaryFrom);
  }

  async listStatements(
    scope: StatementScope,
    f: StatementFilter,
    db: Db = this.knex,
  ): Promise<CommissionStatementSummary[]> {
    const q = this.summaryQuery(db);
    if (scope.branchIds) q.whereIn('s.branch_id', scope.branchIds);
    if (scope.salespersonId) q.where('s.salesperson_id', scope.salespersonId);
    if (f.branchId) q.where('s.branch_id', f.branchId);
    if (f.salespersonId) q.where('s.salesperson_id', f.salespersonId);
    if (f.periodStart) q.where('s.period_start', f.periodStart);
    if (f.status) q.where('s.status', f.status);
    const rows = (await q.orderBy([
      { column: 's.period_start', order: 'desc' },
      { column: 'b.code' },
      { column: 'u.name' },
    ])) as Row[];
    return rows.map(statementSummaryFrom);
  }

  async statementLineViews(statementId: string, db: Db = this.knex): Promise<CommissionStatementLineView[]> {
    const rows = (await db('commission_lines as cl')
      .join('contracts as c', 'c.id', 'cl.contract_id')
      .join('leads as l', 'l.id', 'c.lead_id')
      .where('cl.statement_id', statementId)
      .orderBy(['cl.effective_on', 'cl.created_at'])
      .select(
        'cl.id',
        'cl.contract_id',
        'c.lead_id',
        'l.homeowner_name',
        'cl.milestone',
        'cl.kind',
        'cl.amount',
        'cl.journal_entry_id',
        db.raw(`${DATE('cl.effective_on')} as effective_on`),
      )) as Row[];
    return rows.map((r) => ({
      id: r.id as string,
      contractId: r.contract_id as string,
      leadId: r.lead_id as string,
      homeownerName: r.homeowner_name as string,
      milestone: r.milestone as CommissionMilestone,
      kind: r.kind as CommissionLineKind,
      amount: r.kind === 'clawback' ? `-${r.amount as string}` : (r.amount as string),
      effectiveOn: r.effective_on as string,
      journalEntryId: r.journal_entry_id as string,
    }));
  }
}

function lineFrom(r: Row): LineRow {
  return {
    id: r.id as string,
    salespersonId: r.salesperson_id as string,
    branchId: r.branch_id as string,
    milestone: r.milestone as CommissionMilestone,
    kind: r.kind as CommissionLineKind,
    amount: r.amount as string,
    effectiveOn: r.effective_on as string,
    statementId: (r.statement_id as string | null) ?? null,
  };
}

function statementRowFrom(r: Row): StatementRow {
  return {
    id: r.id as string,
    salespersonId: r.salesperson_id as string,
    branchId: r.branch_id as string,
    periodStart: r.period_start as string,
    periodEnd: r.period_end as string,
    status: r.status as CommissionStatementStatus,
    earned: r.earned as string,
    clawedBack: r.clawed_back as string,
    carriedIn: r.carried_in as string,
    net: r.net as string,
    payable: r.payable as string,
  };
}
