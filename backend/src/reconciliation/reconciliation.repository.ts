import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import type {
  BankAccount,
  BankCsvMapping,
  BankCsvRowError,
  BankLine,
  BankLineView,
  BankStatement,
  BankStatementLine,
  CommissionPaymentTarget,
  MatchStatus,
  MatchTargetKind,
  MatchView,
  PayoutItemView,
  PayoutTarget,
  ReconciledPeriod,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

/** Which branches' records a query may return: null means every branch. */
export type BranchIds = string[] | null;

type Row = Record<string, unknown>;

const DAY = (column: string) => `to_char(${column}, 'YYYY-MM-DD')`;
/** numeric(14,2) dollars → integer cents as text, in SQL (never through a JavaScript number). */
const CENTS = (column: string) => `((${column}) * 100)::bigint::text`;
const iso = (v: unknown): string => (v instanceof Date ? v.toISOString() : String(v));
const person = (id: unknown, name: unknown) => ({ id: id as string, name: (name as string) ?? '' });

/** Payouts the processor did not send (or took back) are never looked for on the bank. */
export const PAYOUT_STATUSES_NOT_SENT = ['failed', 'canceled', 'cancelled'];

/** The bank accounts a person may see: company-wide ones, and those of their branches. */
function accountScope(q: Knex.QueryBuilder, scope: BranchIds, column = 'a.branch_id') {
  if (scope !== null) q.where((w) => w.whereNull(column).orWhereIn(column, scope));
  return q;
}

function toAccount(r: Row): BankAccount {
  return {
    id: r.id as string,
    branchId: (r.branch_id as string | null) ?? null,
    branchName: (r.branch_name as string | null) ?? null,
    name: r.name as string,
    last4: r.last4 as string,
    receivesPayouts: Boolean(r.receives_payouts),
    csvMapping: (r.csv_mapping as BankCsvMapping | null) ?? null,
    statementCount: Number(r.statement_count ?? 0),
    statementsThrough: (r.statements_through as string | null) ?? null,
    lockedThrough: (r.locked_through as string | null) ?? null,
    createdAt: iso(r.created_at),
  };
}

function toLine(r: Row, prefix = ''): BankLineView {
  const p = (k: string) => r[`${prefix}${k}`];
  return {
    id: p('id') as string,
    statementId: p('statement_id') as string,
    rowNumber: Number(p('row_number')),
    postedOn: p('posted_on_text') as string,
    description: (p('description') as string) ?? '',
    amount: p('amount') as string,
    amountCents: p('amount_cents') as string,
    locked: Boolean(p('locked')),
  };
}

function toPayout(r: Row, prefix = ''): PayoutTarget {
  const p = (k: string) => r[`${prefix}${k}`];
  return {
    id: p('id') as string,
    processorPayoutId: p('processor_payout_id') as string,
    arrivalDate: p('arrival_date_text') as string,
    amount: p('amount') as string,
    amountCents: p('amount_cents') as string,
    currency: p('currency') as string,
    status: p('status') as string,
  };
}

function toCommission(r: Row, prefix = ''): CommissionPaymentTarget {
  const p = (k: string) => r[`${prefix}${k}`];
  return {
    id: p('id') as string,
    salespersonId: p('salesperson_id') as string,
    salespersonName: (p('salesperson_name') as string) ?? '',
    branchId: p('branch_id') as string,
    branchName: (p('branch_name') as string) ?? '',
    periodStart: p('period_start_text') as string,
    periodEnd: p('period_end_text') as string,
    paidOn: p('paid_on_text') as string,
    payable: p('payable') as string,
    bankAmountCents: p('bank_amount_cents') as string,
  };
}

function toStatement(r: Row): BankStatement {
  return {
    id: r.id as string,
    bankAccountId: r.bank_account_id as string,
    bankAccountName: r.bank_account_name as string,
    fileName: r.file_name as string,
    sha256: r.file_sha256 as string,
    periodFrom: r.period_from_text as string,
    periodTo: r.period_to_text as string,
    rowCount: Number(r.row_count),
    lineCount: Number(r.line_count),
    skippedRows: (r.skipped_rows as BankCsvRowError[]) ?? [],
    mapping: r.mapping as BankCsvMapping,
    moneyIn: (r.money_in as string) ?? '0.00',
    moneyOut: (r.money_out as string) ?? '0.00',
    matchedCount: Number(r.matched_count ?? 0),
    uploadedBy: person(r.uploaded_by, r.uploaded_by_name),
    uploadedAt: iso(r.uploaded_at),
  };
}

export interface NewStatement {
  bankAccountId: string;
  fileName: string;
  sha256: string;
  fileBytes: number;
  periodFrom: string;
  periodTo: string;
  rowCount: number;
  mapping: BankCsvMapping;
  skippedRows: BankCsvRowError[];
  uploadedBy: string;
}

export interface NewMatch {
  bankLineId: string;
  targetKind: MatchTargetKind;
  targetId: string | null;
  note: string | null;
  amountCents: string;
  daysApart: number | null;
  status: MatchStatus;
  createdBy: string;
}

/** A line or target as the matcher sees it. */
export interface MatchCandidate {
  id: string;
  amountCents: string;
  date: string;
}

export interface PayoutItemRow extends PayoutItemView {
  amountCents: string;
  feeCents: string;
  netCents: string;
}

const LINE_COLUMNS = (alias: string, prefix = '') => [
  `${alias}.id as ${prefix}id`,
  `${alias}.statement_id as ${prefix}statement_id`,
  `${alias}.row_number as ${prefix}row_number`,
  `${alias}.description as ${prefix}description`,
  `${alias}.amount as ${prefix}amount`,
  `${alias}.amount_cents as ${prefix}amount_cents`,
];

@Injectable()
export class ReconciliationRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  // ---- bank accounts ----------------------------------------------------------------------------------

  private accountQuery(db: Db) {
    return db('bank_accounts as a')
      .leftJoin('branches as b', 'b.id', 'a.branch_id')
      .select('a.*', 'b.name as branch_name')
      .select(
        db.raw(
          '(select count(*) from bank_statements s where s.bank_account_id = a.id)::int as statement_count',
        ),
        db.raw(
          `(select ${DAY('max(s.period_to)')} from bank_statements s where s.bank_account_id = a.id) as statements_through`,
        ),
        db.raw(
          `(select ${DAY('max(p.period_end)')} from reconciled_periods p where p.bank_account_id = a.id) as locked_through`,
        ),
      );
  }

  async accounts(scope: BranchIds, db: Db = this.knex): Promise<BankAccount[]> {
    const rows = (await accountScope(this.accountQuery(db), scope)
      .orderByRaw('b.name asc nulls first')
      .orderBy('a.name')) as Row[];
    return rows.map(toAccount);
  }

  async account(
    id: string,
    db: Db = this.knex,
    opts: { forUpdate?: boolean } = {},
  ): Promise<BankAccount | null> {
    if (opts.forUpdate) await db('bank_accounts').where({ id }).forUpdate().first('id');
    const row = (await this.accountQuery(db).where('a.id', id).first()) as Row | undefined;
    return row ? toAccount(row) : null;
  }

  async insertAccount(
    a: { branchId: string | null; name: string; last4: string; receivesPayouts: boolean; createdBy: string },
    db: Db = this.knex,
  ): Promise<string> {
    const [row] = await db('bank_accounts')
      .insert({
        branch_id: a.branchId,
        name: a.name,
        last4: a.last4,
        receives_payouts: a.receivesPayouts,
        created_by: a.createdBy,
      })
      .returning('id');
    return row.id as string;
  }

  async saveMapping(accountId: string, mapping: BankCsvMapping, db: Db = this.knex): Promise<void> {
    await db('bank_accounts')
      .where({ id: accountId })
      .update({ csv_mapping: JSON.stringify(mapping), csv_mapping_updated_at: db.fn.now() });
  }

  async branch(id: string, db: Db = this.knex): Promise<{ id: string; name: string } | null> {
    const row = (await db('branches').where({ id }).first('id', 'name')) as Row | undefined;
    return row ? { id: row.id as string, name: row.name as string } : null;
  }

  // ---- statements -------------------------------------------------------------------------------------

  private statementQuery(db: Db) {
    return db('bank_statements as s')
      .join('bank_accounts as a', 'a.id', 's.bank_account_id')
      .leftJoin('users as u', 'u.id', 's.uploaded_by')
      .select(
        's.id',
        's.bank_account_id',
        'a.name as bank_account_name',
        's.file_name',
        's.file_sha256',
        's.row_count',
        's.line_count',
        's.skipped_rows',
        's.mapping',
        's.uploaded_by',
        'u.name as uploaded_by_name',
        's.uploaded_at',
      )
      .select(
        db.raw(`${DAY('s.period_from')} as period_from_text`),
        db.raw(`${DAY('s.period_to')} as period_to_text`),
        db.raw(`(select coalesce(sum(l.amount) filter (where l.amount > 0), 0)::numeric(14,2)::text
                 from bank_lines l where l.statement_id = s.id) as money_in`),
        db.raw(`(select coalesce(-sum(l.amount) filter (where l.amount < 0), 0)::numeric(14,2)::text
                 from bank_lines l where l.statement_id = s.id) as money_out`),
        db.raw(`(select count(*) from bank_lines l join reconciliation_matches m on m.bank_line_id = l.id
                 where l.statement_id = s.id)::int as matched_count`),
      );
  }

  async statements(
    scope: BranchIds,
    filter: { bankAccountId?: string },
    db: Db = this.knex,
  ): Promise<BankStatement[]> {
    const q = accountScope(this.statementQuery(db), scope);
    if (filter.bankAccountId) q.where('s.bank_account_id', filter.bankAccountId);
    const rows = (await q
      .orderBy('s.period_to', 'desc')
      .orderBy('s.uploaded_at', 'desc')
      .limit(500)) as Row[];
    return rows.map(toStatement);
  }

  async statement(
    id: string,
    db: Db = this.knex,
  ): Promise<(BankStatement & { branchId: string | null }) | null> {
    const row = (await this.statementQuery(db).select('a.branch_id').where('s.id', id).first()) as
      Row | undefined;
    return row ? { ...toStatement(row), branchId: (row.branch_id as string | null) ?? null } : null;
  }

  async statementBySha(
    bankAccountId: string,
    sha256: string,
    db: Db = this.knex,
  ): Promise<{ id: string; fileName: string; uploadedAt: string } | null> {
    const row = (await db('bank_statements')
      .where({ bank_account_id: bankAccountId, file_sha256: sha256 })
      .first('id', 'file_name', 'uploaded_at')) as Row | undefined;
    return row
      ? { id: row.id as string, fileName: row.file_name as string, uploadedAt: iso(row.uploaded_at) }
      : null;
  }

  async statementPeriods(bankAccountId: string, db: Db = this.knex): Promise<{ from: string; to: string }[]> {
    const rows = (await db('bank_statements')
      .where({ bank_account_id: bankAccountId })
      .select(db.raw(`${DAY('period_from')} as "from"`), db.raw(`${DAY('period_to')} as "to"`))
      .orderBy('period_from')) as { from: string; to: string }[];
    return rows;
  }

  async insertStatement(s: NewStatement, lines: BankLine[], db: Db): Promise<string> {
    const [row] = await db('bank_statements')
      .insert({
        bank_account_id: s.bankAccountId,
        file_name: s.fileName,
        file_sha256: s.sha256,
        file_bytes: s.fileBytes,
        period_from: s.periodFrom,
        period_to: s.periodTo,
        row_count: s.rowCount,
        line_count: lines.length,
        mapping: JSON.stringify(s.mapping),
        skipped_rows: JSON.stringify(s.skippedRows),
        uploaded_by: s.uploadedBy,
      })
      .returning('id');
    const statementId = row.id as string;
    const CHUNK = 1000;
    for (let i = 0; i < lines.length; i += CHUNK) {
      await db('bank_lines').insert(
        lines.slice(i, i + CHUNK).map((l) => ({
          statement_id: statementId,
          bank_account_id: s.bankAccountId,
          row_number: l.rowNumber,
          posted_on: l.date,
          description: l.description.slice(0, 500),
          amount: l.amount,
          amount_cents: l.amountCents,
        })),
      );
    }
    return statementId;
  }

  async statementLines(statementId: string, db: Db = this.knex): Promise<BankStatementLine[]> {
    const rows = (await db('bank_lines as l')
      .leftJoin('reconciliation_matches as m', 'm.bank_line_id', 'l.id')
      .where('l.statement_id', statementId)
      .select(...LINE_COLUMNS('l'))
      .select(
        db.raw(`${DAY('l.posted_on')} as posted_on_text`),
        db.raw('reconciliation_is_locked(l.bank_account_id, l.posted_on) as locked'),
        'm.id as match_id',
        'm.status as match_status',
        'm.target_kind as match_target_kind',
        'm.target_id as match_target_id',
      )
      .orderBy('l.row_number')) as Row[];
    return rows.map((r) => ({
      ...toLine(r),
      match: r.match_id
        ? {
            id: r.match_id as string,
            status: r.match_status as MatchStatus,
            targetKind: r.match_target_kind as MatchTargetKind,
            targetId: (r.match_target_id as string | null) ?? null,
          }
        : null,
    }));
  }

  // ---- lines and targets for matching -----------------------------------------------------------------

  private lineQuery(db: Db) {
    return db('bank_lines as l')
      .select(...LINE_COLUMNS('l'))
      .select(
        db.raw(`${DAY('l.posted_on')} as posted_on_text`),
        db.raw('reconciliation_is_locked(l.bank_account_id, l.posted_on) as locked'),
      );
  }

  async bankLine(id: string, db: Db = this.knex): Promise<(BankLineView & { bankAccountId: string }) | null> {
    const row = (await this.lineQuery(db).select('l.bank_account_id').where('l.id', id).first()) as
      Row | undefined;
    return row ? { ...toLine(row), bankAccountId: row.bank_account_id as string } : null;
  }

  async unmatchedBankLines(
    accountId: string,
    from: string,
    to: string,
    db: Db = this.knex,
  ): Promise<BankLineView[]> {
    const rows = (await this.lineQuery(db)
      .where('l.bank_account_id', accountId)
      .whereBetween('l.posted_on', [from, to])
      .whereNotExists(db('reconciliation_matches as m').whereRaw('m.bank_line_id = l.id').select(db.raw('1')))
      .orderBy('l.posted_on')
      .orderBy('l.statement_id')
      .orderBy('l.row_number')) as Row[];
    return rows.map((r) => toLine(r));
  }

  private payoutQuery(db: Db) {
    return db('processor_payouts as p').select(
      'p.id',
      'p.processor_payout_id',
      'p.amount',
      'p.currency',
      'p.status',
      db.raw(`${DAY('p.arrival_date')} as arrival_date_text`),
      db.raw(`${CENTS('p.amount')} as amount_cents`),
    );
  }

  async payout(id: string, db: Db = this.knex): Promise<PayoutTarget | null> {
    const row = (await this.payoutQuery(db).where('p.id', id).first()) as Row | undefined;
    return row ? toPayout(row) : null;
  }

  /** Payouts sent (not failed or cancelled) arriving in [from, to], matched to no bank line. */
  async unmatchedPayouts(from: string, to: string, db: Db = this.knex): Promise<PayoutTarget[]> {
    const rows = (await this.payoutQuery(db)
      .whereBetween('p.arrival_date', [from, to])
      .whereNotIn('p.status', PAYOUT_STATUSES_NOT_SENT)
      .whereNotExists(db('reconciliation_matches as m').whereRaw('m.payout_id = p.id').select(db.raw('1')))
      .orderBy('p.arrival_date')
      .orderBy('p.processor_created_at')) as Row[];
    return rows.map((r) => toPayout(r));
  }

  private commissionQuery(db: Db) {
    return db('commission_statements as c')
      .join('users as u', 'u.id', 'c.salesperson_id')
      .join('branches as b', 'b.id', 'c.branch_id')
      .select(
        'c.id',
        'c.salesperson_id',
        'u.name as salesperson_name',
        'c.branch_id',
        'b.name as branch_name',
        'c.payable',
        'c.status',
        db.raw(`${DAY('c.period_start')} as period_start_text`),
        db.raw(`${DAY('c.period_end')} as period_end_text`),
        db.raw(`${DAY('c.paid_on')} as paid_on_text`),
        db.raw(`(-(c.payable * 100)::bigint)::text as bank_amount_cents`),
      );
  }

  async commissionPayment(
    id: string,
    db: Db = this.knex,
  ): Promise<(CommissionPaymentTarget & { status: string }) | null> {
    const row = (await this.commissionQuery(db).where('c.id', id).first()) as Row | undefined;
    return row ? { ...toCommission(row), status: row.status as string } : null;
  }

  /**
   * Paid commission statements that paid something, paid on a day in [from, to], matched to no bank line;
   * of one branch when the bank account is a branch's.
   */
  async unmatchedCommissionPayments(
    from: string,
    to: string,
    branchId: string | null,
    db: Db = this.knex,
  ): Promise<CommissionPaymentTarget[]> {
    const q = this.commissionQuery(db)
      .where('c.status', 'paid')
      .where('c.payable', '>', 0)
      .whereBetween('c.paid_on', [from, to])
      .whereNotExists(
        db('reconciliation_matches as m').whereRaw('m.commission_statement_id = c.id').select(db.raw('1')),
      );
    if (branchId) q.where('c.branch_id', branchId);
    const rows = (await q.orderBy('c.paid_on').orderBy('u.name')) as Row[];
    return rows.map((r) => toCommission(r));
  }

  // ---- matches ----------------------------------------------------------------------------------------

  private matchQuery(db: Db) {
    return db('reconciliation_matches as m')
      .join('bank_lines as l', 'l.id', 'm.bank_line_id')
      .leftJoin('processor_payouts as p', 'p.id', 'm.payout_id')
      .leftJoin('commission_statements as c', 'c.id', 'm.commission_statement_id')
      .leftJoin('users as cu', 'cu.id', 'c.salesperson_id')
      .leftJoin('branches as cb', 'cb.id', 'c.branch_id')
      .leftJoin('users as mc', 'mc.id', 'm.created_by')
      .leftJoin('users as mm', 'mm.id', 'm.matched_by')
      .select(
        'm.id',
        'm.status',
        'm.target_kind',
        'm.target_id',
        'm.note',
        'm.days_apart',
        'm.created_by',
        'mc.name as created_by_name',
        'm.created_at',
        'm.matched_by',
        'mm.name as matched_by_name',
        'm.matched_at',
        'l.bank_account_id',
        ...LINE_COLUMNS('l', 'l_'),
        'p.id as p_id',
        'p.processor_payout_id as p_processor_payout_id',
        'p.amount as p_amount',
        'p.currency as p_currency',
        'p.status as p_status',
        'c.id as c_id',
        'c.salesperson_id as c_salesperson_id',
        'cu.name as c_salesperson_name',
        'c.branch_id as c_branch_id',
        'cb.name as c_branch_name',
        'c.payable as c_payable',
      )
      .select(
        db.raw(`${DAY('l.posted_on')} as l_posted_on_text`),
        db.raw('reconciliation_is_locked(l.bank_account_id, l.posted_on) as l_locked'),
        db.raw(`${DAY('p.arrival_date')} as p_arrival_date_text`),
        db.raw(`${CENTS('p.amount')} as p_amount_cents`),
        db.raw(`${DAY('c.period_start')} as c_period_start_text`),
        db.raw(`${DAY('c.period_end')} as c_period_end_text`),
        db.raw(`${DAY('c.paid_on')} as c_paid_on_text`),
        db.raw(`(-(c.payable * 100)::bigint)::text as c_bank_amount_cents`),
      );
  }

  private toMatch(r: Row): MatchView & { bankAccountId: string } {
    const bankLine = toLine(r, 'l_');
    return {
      id: r.id as string,
      status: r.status as MatchStatus,
      targetKind: r.target_kind as MatchTargetKind,
      targetId: (r.target_id as string | null) ?? null,
      bankLine,
      payout: r.p_id ? toPayout(r, 'p_') : null,
      commissionPayment: r.c_id ? toCommission(r, 'c_') : null,
      note: (r.note as string | null) ?? null,
      daysApart: r.days_apart === null || r.days_apart === undefined ? null : Number(r.days_apart),
      createdBy: person(r.created_by, r.created_by_name),
      createdAt: iso(r.created_at),
      matchedBy: r.matched_by ? person(r.matched_by, r.matched_by_name) : null,
      matchedAt: r.matched_at ? iso(r.matched_at) : null,
      locked: bankLine.locked,
      bankAccountId: r.bank_account_id as string,
    };
  }

  async match(id: string, db: Db = this.knex): Promise<(MatchView & { bankAccountId: string }) | null> {
    const row = (await this.matchQuery(db).where('m.id', id).first()) as Row | undefined;
    return row ? this.toMatch(row) : null;
  }

  async matchesInRange(
    accountId: string,
    from: string,
    to: string,
    db: Db = this.knex,
  ): Promise<MatchView[]> {
    const rows = (await this.matchQuery(db)
      .where('l.bank_account_id', accountId)
      .whereBetween('l.posted_on', [from, to])
      .orderBy('l.posted_on')
      .orderBy('l.statement_id')
      .orderBy('l.row_number')) as Row[];
    return rows.map((r) => {
      const { bankAccountId: _a, ...m } = this.toMatch(r);
      return m;
    });
  }

  async matchOfPayout(
    payoutId: string,
    db: Db = this.knex,
  ): Promise<(MatchView & { bankAccountId: string }) | null> {
    const row = (await this.matchQuery(db).where('m.payout_id', payoutId).first()) as Row | undefined;
    return row ? this.toMatch(row) : null;
  }

  async insertMatches(matches: NewMatch[], db: Db): Promise<string[]> {
    const ids: string[] = [];
    const CHUNK = 1000;
    for (let i = 0; i < matches.length; i += CHUNK) {
      const rows = await db('reconciliation_matches')
        .insert(
          matches.slice(i, i + CHUNK).map((m) => ({
            bank_line_id: m.bankLineId,
            target_kind: m.targetKind,
            payout_id: m.targetKind === 'payout' ? m.targetId : null,
            commission_statement_id: m.targetKind === 'commission_payment' ? m.targetId : null,
            note: m.note,
            amount_cents: m.amountCents,
            days_apart: m.daysApart,
            status: m.status,
            created_by: m.createdBy,
            matched_by: m.status === 'confirmed' ? m.createdBy : null,
            matched_at: m.status === 'confirmed' ? db.fn.now() : null,
          })),
        )
        .returning('id');
      ids.push(...rows.map((r: { id: string }) => r.id));
    }
    return ids;
  }

  async confirmMatch(id: string, userId: string, db: Db): Promise<boolean> {
    const n = await db('reconciliation_matches')
      .where({ id, status: 'suggested' })
      .update({ status: 'confirmed', matched_by: userId, matched_at: db.fn.now() });
    return n > 0;
  }

  async deleteMatch(id: string, db: Db): Promise<boolean> {
    return (await db('reconciliation_matches').where({ id }).delete()) > 0;
  }

  // ---- periods ----------------------------------------------------------------------------------------

  private periodQuery(db: Db) {
    return db('reconciled_periods as p')
      .leftJoin('users as u', 'u.id', 'p.locked_by')
      .select(
        'p.id',
        'p.bank_account_id',
        'p.locked_by',
        'u.name as locked_by_name',
        'p.locked_at',
        db.raw(`${DAY('p.period_start')} as period_start_text`),
        db.raw(`${DAY('p.period_end')} as period_end_text`),
      );
  }

  private toPeriod(r: Row): ReconciledPeriod {
    return {
      id: r.id as string,
      bankAccountId: r.bank_account_id as string,
      periodStart: r.period_start_text as string,
      periodEnd: r.period_end_text as string,
      lockedBy: person(r.locked_by, r.locked_by_name),
      lockedAt: iso(r.locked_at),
    };
  }

  async periods(accountId: string, range: { from: string; to: string } | null, db: Db = this.knex) {
    const q = this.periodQuery(db).where('p.bank_account_id', accountId);
    if (range) q.where('p.period_start', '<=', range.to).where('p.period_end', '>=', range.from);
    return ((await q.orderBy('p.period_start')) as Row[]).map((r) => this.toPeriod(r));
  }

  async insertPeriod(
    p: { bankAccountId: string; from: string; to: string; lockedBy: string },
    db: Db,
  ): Promise<ReconciledPeriod> {
    const [row] = await db('reconciled_periods')
      .insert({
        bank_account_id: p.bankAccountId,
        period_start: p.from,
        period_end: p.to,
        locked_by: p.lockedBy,
      })
      .returning('id');
    return this.toPeriod((await this.periodQuery(db).where('p.id', row.id).first()) as Row);
  }

  /** Bank lines in the range: how many have no match, and how many only a suggestion. */
  async lineCounts(accountId: string, from: string, to: string, db: Db = this.knex) {
    const row = (await db('bank_lines as l')
      .leftJoin('reconciliation_matches as m', 'm.bank_line_id', 'l.id')
      .where('l.bank_account_id', accountId)
      .whereBetween('l.posted_on', [from, to])
      .first(
        db.raw('count(*)::int as lines'),
        db.raw('(count(*) filter (where m.id is null))::int as unmatched'),
        db.raw(`(count(*) filter (where m.status = 'suggested'))::int as suggested`),
        db.raw(`(count(*) filter (where m.status = 'confirmed'))::int as confirmed`),
        db.raw('coalesce(sum(l.amount) filter (where l.amount > 0), 0)::numeric(14,2)::text as money_in'),
        db.raw('coalesce(-sum(l.amount) filter (where l.amount < 0), 0)::numeric(14,2)::text as money_out'),
      )) as Row;
    return {
      lines: Number(row.lines),
      unmatched: Number(row.unmatched),
      suggested: Number(row.suggested),
      confirmed: Number(row.confirmed),
      moneyIn: row.money_in as string,
      moneyOut: row.money_out as string,
    };
  }

  // ---- payout breakdown -------------------------------------------------------------------------------

  async payoutItems(payoutId: string, db: Db = this.knex): Promise<PayoutItemRow[]> {
    const rows = (await db('processor_payout_items as i')
      .join('branches as b', 'b.id', 'i.branch_id')
      .leftJoin('refunds as r', 'r.id', 'i.refund_id')
      .leftJoin('payments as pm', 'pm.id', db.raw('coalesce(i.payment_id, r.payment_id)'))
      .leftJoin('contracts as k', 'k.id', 'pm.contract_id')
      .leftJoin('leads as ld', 'ld.id', 'k.lead_id')
      .where('i.payout_id', payoutId)
      .select(
        'i.processor_balance_transaction_id',
        'i.type',
        'i.amount',
        'i.fee',
        'i.net',
        'i.branch_id',
        'b.name as branch_name',
        'i.payment_id',
        'i.refund_id',
        'pm.contract_id',
        'k.lead_id',
        'ld.homeowner_name',
        'pm.kind as payment_kind',
        db.raw(`concat_ws(', ', ld.address_line1, ld.city) as address`),
        db.raw(`${DAY('pm.received_on')} as received_on_text`),
        db.raw(`${CENTS('i.amount')} as amount_cents`),
        db.raw(`${CENTS('i.fee')} as fee_cents`),
        db.raw(`${CENTS('i.net')} as net_cents`),
      )
      .orderBy('i.type')
      .orderBy('i.processor_balance_transaction_id')) as Row[];
    return rows.map((r) => ({
      balanceTransactionId: r.processor_balance_transaction_id as string,
      type: r.type as string,
      amount: r.amount as string,
      fee: r.fee as string,
      net: r.net as string,
      branchId: r.branch_id as string,
      branchName: r.branch_name as string,
      paymentId: (r.payment_id as string | null) ?? null,
      refundId: (r.refund_id as string | null) ?? null,
      contractId: (r.contract_id as string | null) ?? null,
      leadId: (r.lead_id as string | null) ?? null,
      homeownerName: (r.homeowner_name as string | null) ?? null,
      address: (r.address as string | null) || null,
      paymentKind: (r.payment_kind as 'deposit' | 'balance' | null) ?? null,
      receivedOn: (r.received_on_text as string | null) ?? null,
      amountCents: r.amount_cents as string,
      feeCents: r.fee_cents as string,
      netCents: r.net_cents as string,
    }));
  }

  async payoutBranches(payoutId: string, db: Db = this.knex) {
    const rows = (await db('processor_payout_branches as pb')
      .join('branches as b', 'b.id', 'pb.branch_id')
      .where('pb.payout_id', payoutId)
      .select('pb.branch_id', 'b.name as branch_name', 'pb.gross', 'pb.fee', 'pb.net', 'pb.item_count')
      .orderBy('b.name')) as Row[];
    return rows.map((r) => ({
      branchId: r.branch_id as string,
      branchName: r.branch_name as string,
      gross: r.gross as string,
      fee: r.fee as string,
      net: r.net as string,
      itemCount: Number(r.item_count),
    }));
  }
}
