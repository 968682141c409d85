import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import {
  money,
  MoneyDecimal,
  reasonLabel,
  type AccountType,
  type JournalEntry,
  type JournalLine,
  type LedgerAccount,
  type Side,
  type SourceKind,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

/** Which branches' ledgers a query may read: null means every branch. */
export type BranchIds = string[] | null;

export interface JournalFilter {
  branchId?: string;
  from?: string;
  to?: string;
  reasonCode?: string;
}

export interface NewEntry {
  branchId: string;
  reasonCode: string;
  sourceKind: SourceKind;
  sourceRef: string;
  idempotencyKey: string;
  reversesEntryId: string | null;
  memo: string | null;
  effectiveOn: string;
  postedBy: string | null;
  leadId: string | null;
  contractId: string | null;
  jobId: string | null;
}

export interface NewLine {
  accountId: string;
  side: Side;
  amount: string;
  salespersonId: string | null;
}

export interface AccountRow extends LedgerAccount {
  branchCode: string;
}

export interface AccountLineRow {
  entryId: string;
  lineId: string;
  effectiveOn: string;
  postedAt: string;
  reasonCode: string;
  memo: string | null;
  side: Side;
  amount: string;
  salespersonId: string | null;
  salespersonName: string | null;
  balance: string;
}

export interface AccountTotalsRow {
  accountId: string | null;
  code: string;
  name: string;
  type: AccountType;
  normalSide: Side;
  debitTotal: string;
  creditTotal: string;
}

type Row = Record<string, unknown>;

const DATE = (column: string) => `to_char(${column}, 'YYYY-MM-DD')`;

function toAccount(r: Row): AccountRow {
  return {
    id: r.id as string,
    branchId: r.branch_id as string,
    branchCode: r.branch_code as string,
    code: r.code as string,
    name: r.name as string,
    type: r.type as AccountType,
    normalSide: r.normal_side as Side,
    salespersonSubledger: Boolean(r.salesperson_subledger),
  };
}

function toLine(r: Row): JournalLine {
  return {
    id: r.id as string,
    accountId: r.account_id as string,
    accountCode: r.account_code as string,
    accountName: r.account_name as string,
    side: r.side as Side,
    amount: r.amount as string,
    salespersonId: (r.salesperson_id as string | null) ?? null,
    salespersonName: (r.salesperson_name as string | null) ?? null,
  };
}

function toEntry(r: Row, lines: JournalLine[]): JournalEntry {
  const total = lines
    .filter((l) => l.side === 'debit')
    .reduce((s, l) => s.plus(money(l.amount)), new MoneyDecimal(0));
  return {
    id: r.id as string,
    branchId: r.branch_id as string,
    branchCode: r.branch_code as string,
    reasonCode: r.reason_code as string,
    reasonLabel: reasonLabel(r.reason_code as string),
    sourceKind: r.source_kind as SourceKind,
    sourceRef: r.source_ref as string,
    memo: (r.memo as string | null) ?? null,
    effectiveOn: r.effective_on_text as string,
    postedAt: (r.posted_at as Date).toISOString(),
    postedBy: (r.posted_by as string | null) ?? null,
    postedByName: (r.posted_by_name as string | null) ?? null,
    leadId: (r.lead_id as string | null) ?? null,
    contractId: (r.contract_id as string | null) ?? null,
    jobId: (r.job_id as string | null) ?? null,
    reversesEntryId: (r.reverses_entry_id as string | null) ?? null,
    reversedByEntryId: (r.reversed_by as string | null) ?? null,
    total: total.toFixed(2),
    lines,
  };
}

/** The only file of the ledger that touches Knex. */
@Injectable()
export class LedgerRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  // ---- accounts ---------------------------------------------------------------------------------------

  async accounts(branchId: string, db: Db = this.knex): Promise<AccountRow[]> {
    const rows = (await db('ledger_accounts as a')
      .join('branches as b', 'b.id', 'a.branch_id')
      .where('a.branch_id', branchId)
      .select('a.*', 'b.code as branch_code')
      .orderBy('a.code')) as Row[];
    return rows.map(toAccount);
  }

  async account(id: string, db: Db = this.knex): Promise<AccountRow | null> {
    const r = (await db('ledger_accounts as a')
      .join('branches as b', 'b.id', 'a.branch_id')
      .where('a.id', id)
      .first('a.*', 'b.code as branch_code')) as Row | undefined;
    return r ? toAccount(r) : null;
  }

  async branchExists(id: string, db: Db = this.knex): Promise<{ timezone: string } | null> {
    const r = (await db('branches').where({ id }).first('timezone')) as { timezone: string } | undefined;
    return r ?? null;
  }

  /** The time zones of some branches (null: all). */
  async timezones(branches: BranchIds, db: Db = this.knex): Promise<string[]> {
    const q = db('branches').distinct('timezone');
    if (branches) q.whereIn('id', branches);
    return ((await q) as { timezone: string }[]).map((r) => r.timezone);
  }

  /** The branches of the lead, contract and job an entry names (null when the record does not exist). */
  async recordBranches(
    refs: { leadId: string | null; contractId: string | null; jobId: string | null },
    db: Db = this.knex,
  ): Promise<{ lead: string | null; contract: string | null; job: string | null }> {
    const one = async (table: string, id: string | null) =>
      id
        ? ((((await db(table).where({ id }).first('branch_id')) as Row | undefined)?.branch_id as string) ??
          null)
        : null;
    return {
      lead: await one('leads', refs.leadId),
      contract: await one('contracts', refs.contractId),
      job: await one('jobs', refs.jobId),
    };
  }

  // ---- posting ----------------------------------------------------------------------------------------

  async entryIdByKey(key: string, db: Db = this.knex): Promise<string | null> {
    const r = (await db('journal_entries').where({ idempotency_key: key }).first('id')) as Row | undefined;
    return (r?.id as string | undefined) ?? null;
  }

  /**
   * Inserts the entry unless its idempotency key is taken; returns the new id, or null when another
   * transaction posted that key first (ON CONFLICT waits for it to commit, then does nothing).
   */
  async insertEntry(e: NewEntry, db: Db): Promise<string | null> {
    const rows = (await db('journal_entries')
      .insert({
        branch_id: e.branchId,
        reason_code: e.reasonCode,
        source_kind: e.sourceKind,
        source_ref: e.sourceRef,
        idempotency_key: e.idempotencyKey,
        reverses_entry_id: e.reversesEntryId,
        memo: e.memo,
        effective_on: e.effectiveOn,
        posted_by: e.postedBy,
        lead_id: e.leadId,
        contract_id: e.contractId,
        job_id: e.jobId,
      })
      .onConflict('idempotency_key')
      .ignore()
      .returning('id')) as { id: string }[];
    return rows[0]?.id ?? null;
  }

  async insertLines(entryId: string, branchId: string, lines: NewLine[], db: Db): Promise<void> {
    await db('journal_lines').insert(
      lines.map((l, i) => ({
        entry_id: entryId,
        position: i + 1,
        account_id: l.accountId,
        branch_id: branchId,
        side: l.side,
        amount: l.amount,
        salesperson_id: l.salespersonId,
      })),
    );
  }

  // ---- reading entries --------------------------------------------------------------------------------

  private entryQuery(db: Db) {
    return db('journal_entries as e')
      .join('branches as b', 'b.id', 'e.branch_id')
      .leftJoin('users as u', 'u.id', 'e.posted_by')
      .leftJoin('journal_entries as r', 'r.reverses_entry_id', 'e.id')
      .select(
        'e.id',
        'e.branch_id',
        'b.code as branch_code',
        'e.reason_code',
        'e.source_kind',
        'e.source_ref',
        'e.memo',
        db.raw(`${DATE('e.effective_on')} as effective_on_text`),
        'e.posted_at',
        'e.posted_by',
        'u.name as posted_by_name',
        'e.lead_id',
        'e.contract_id',
        'e.job_id',
        'e.reverses_entry_id',
        'r.id as reversed_by',
      );
  }

  private async linesOf(entryIds: string[], db: Db): Promise<Map<string, JournalLine[]>> {
    const byEntry = new Map<string, JournalLine[]>(entryIds.map((id) => [id, []]));
    if (entryIds.length === 0) return byEntry;
    const rows = (await db('journal_lines as l')
      .join('ledger_accounts as a', 'a.id', 'l.account_id')
      .leftJoin('users as s', 's.id', 'l.salesperson_id')
      .whereIn('l.entry_id', entryIds)
      .select(
        'l.id',
        'l.entry_id',
        'l.account_id',
        'a.code as account_code',
        'a.name as account_name',
        'l.side',
        'l.amount',
        'l.salesperson_id',
        's.name as salesperson_name',
      )
      .orderBy([{ column: 'l.entry_id' }, { column: 'l.position' }])) as Row[];
    for (const r of rows) byEntry.get(r.entry_id as string)!.push(toLine(r));
    return byEntry;
  }

  async entry(id: string, db: Db = this.knex): Promise<JournalEntry | null> {
    const r = (await this.entryQuery(db).where('e.id', id).first()) as Row | undefined;
    if (!r) return null;
    const lines = await this.linesOf([id], db);
    return toEntry(r, lines.get(id) ?? []);
  }

  private applyJournalFilter(q: Knex.QueryBuilder, branches: BranchIds, f: JournalFilter) {
    if (branches) q.whereIn('e.branch_id', branches);
    if (f.branchId) q.where('e.branch_id', f.branchId);
    if (f.from) q.where('e.effective_on', '>=', f.from);
    if (f.to) q.where('e.effective_on', '<=', f.to);
    if (f.reasonCode) q.where('e.reason_code', f.reasonCode);
    return q;
  }

  /** A page of entries, newest first, with their lines. */
  async journal(
    branches: BranchIds,
    f: JournalFilter,
    page: { limit: number; offset: number },
    db: Db = this.knex,
  ): Promise<{ items: JournalEntry[]; total: number }> {
    const rowsQ = this.applyJournalFilter(this.entryQuery(db), branches, f)
      .orderBy([
        { column: 'e.effective_on', order: 'desc' },
        { column: 'e.posted_at', order: 'desc' },
        { column: 'e.id', order: 'desc' },
      ])
      .limit(page.limit)
      .offset(page.offset);
    const countQ = this.applyJournalFilter(db('journal_entries as e'), branches, f).count({ n: '*' });
    const [rows, [count]] = (await Promise.all([rowsQ, countQ])) as [Row[], { n: string }[]];
    const lines = await this.linesOf(
      rows.map((r) => r.id as string),
      db,
    );
    return {
      items: rows.map((r) => toEntry(r, lines.get(r.id as string) ?? [])),
      total: Number(count?.n ?? 0),
    };
  }

  /** Every line matching the filter, oldest first (the CSV export); at most `limit` + 1 lines are read. */
  async journalLines(branches: BranchIds, f: JournalFilter, limit: number, db: Db = this.knex) {
    const q = this.applyJournalFilter(
      db('journal_entries as e')
        .join('branches as b', 'b.id', 'e.branch_id')
        .join('journal_lines as l', 'l.entry_id', 'e.id')
        .join('ledger_accounts as a', 'a.id', 'l.account_id')
        .leftJoin('users as s', 's.id', 'l.salesperson_id')
        .select(
          'e.id as entry_id',
          db.raw(`${DATE('e.effective_on')} as effective_on`),
          'e.posted_at',
          'b.code as branch_code',
          'e.reason_code',
          'e.memo',
          'e.source_kind',
          'e.source_ref',
          'e.reverses_entry_id',
          'l.position',
          'a.code as account_code',
          'a.name as account_name',
          'l.side',
          'l.amount',
          's.name as salesperson_name',
        ),
      branches,
      f,
    )
      .orderBy([
        { column: 'e.effective_on' },
        { column: 'e.posted_at' },
        { column: 'e.id' },
        { column: 'l.position' },
      ])
      .limit(limit + 1);
    return (await q) as Row[];
  }

  // ---- account ledger ---------------------------------------------------------------------------------

  /**
   * The lines of one account in date order, each with the balance after it on the account's normal side.
   * The running sum is taken over every line up to `to`, then the page is cut from the lines from `from`
   * on, so that the first line's balance already includes the opening balance.
   */
  async accountLines(
    account: { id: string; normalSide: Side },
    range: { from?: string; to?: string },
    page: { limit: number; offset: number } | null,
    db: Db = this.knex,
  ): Promise<{ lines: AccountLineRow[]; total: number }> {
    const inner = db('journal_lines as l')
      .join('journal_entries as e', 'e.id', 'l.entry_id')
      .leftJoin('users as s', 's.id', 'l.salesperson_id')
      .where('l.account_id', account.id)
      .select(
        'l.id as line_id',
        'l.entry_id',
        'e.effective_on',
        'e.posted_at',
        'e.reason_code',
        'e.memo',
        'l.side',
        'l.amount',
        'l.salesperson_id',
        's.name as salesperson_name',
        'l.position',
        db.raw(
          `sum(case when l.side = ? then l.amount else -l.amount end)
             over (order by e.effective_on, e.posted_at, l.entry_id, l.position rows unbounded preceding) as balance`,
          [account.normalSide],
        ),
      );
    if (range.to) inner.where('e.effective_on', '<=', range.to);
    const outer = db
      .from(inner.as('x'))
      .select(
        'x.line_id',
        'x.entry_id',
        db.raw(`${DATE('x.effective_on')} as effective_on`),
        'x.posted_at',
        'x.reason_code',
        'x.memo',
        'x.side',
        'x.amount',
        'x.salesperson_id',
        'x.salesperson_name',
        'x.balance',
      )
      .orderBy([
        { column: 'x.effective_on' },
        { column: 'x.posted_at' },
        { column: 'x.entry_id' },
        { column: 'x.position' },
      ]);
    if (range.from) outer.where('x.effective_on', '>=', range.from);
    const countQ = db('journal_lines as l')
      .join('journal_entries as e', 'e.id', 'l.entry_id')
      .where('l.account_id', account.id)
      .count({ n: '*' });
    if (range.from) countQ.where('e.effective_on', '>=', range.from);
    if (range.to) countQ.where('e.effective_on', '<=', range.to);
    if (page) outer.limit(page.limit).offset(page.offset);
    const [rows, [count]] = (await Promise.all([outer, countQ])) as [Row[], { n: string }[]];
    return {
      total: Number(count?.n ?? 0),
      lines: rows.map((r) => ({
        entryId: r.entry_id as string,
        lineId: r.line_id as string,
        effectiveOn: r.effective_on as string,
        postedAt: (r.posted_at as Date).toISOString(),
        reasonCode: r.reason_code as string,
        memo: (r.memo as string | null) ?? null,
        side: r.side as Side,
        amount: r.amount as string,
        salespersonId: (r.salesperson_id as string | null) ?? null,
        salespersonName: (r.salesperson_name as string | null) ?? null,
        balance: money(r.balance as string).toFixed(2),
      })),
    };
  }

  /** Debit and credit totals of one account over a date range (either end open). */
  async accountTotals(
    accountId: string,
    range: { from?: string; to?: string; before?: string },
    db: Db = this.knex,
  ): Promise<{ debits: string; credits: string }> {
    const q = db('journal_lines as l')
      .join('journal_entries as e', 'e.id', 'l.entry_id')
      .where('l.account_id', accountId)
      .first(
        db.raw(`coalesce(sum(l.amount) filter (where l.side = 'debit'), 0)::text as debits`),
        db.raw(`coalesce(sum(l.amount) filter (where l.side = 'credit'), 0)::text as credits`),
      );
    if (range.from) q.where('e.effective_on', '>=', range.from);
    if (range.to) q.where('e.effective_on', '<=', range.to);
    if (range.before) q.where('e.effective_on', '<', range.before);
    const r = (await q) as { debits: string; credits: string };
    return { debits: r.debits, credits: r.credits };
  }

  // ---- trial balance ----------------------------------------------------------------------------------

  /**
   * Debit and credit totals per account up to a date. With one branch, per account of that branch; with
   * several, like accounts (the same code) added together.
   */
  async accountTotalsAsOf(
    branches: BranchIds,
    branchId: string | null,
    asOf: string,
    db: Db = this.knex,
  ): Promise<AccountTotalsRow[]> {
    const sums = db('journal_lines as l')
      .join('journal_entries as e', 'e.id', 'l.entry_id')
      .where('e.effective_on', '<=', asOf)
      .groupBy('l.account_id')
      .select(
        'l.account_id',
        db.raw(`sum(l.amount) filter (where l.side = 'debit') as debits`),
        db.raw(`sum(l.amount) filter (where l.side = 'credit') as credits`),
      );
    if (branches) sums.whereIn('e.branch_id', branches);
    if (branchId) sums.where('e.branch_id', branchId);
    const q = db('ledger_accounts as a')
      .leftJoin(sums.as('t'), 't.account_id', 'a.id')
      .select(
        'a.code',
        'a.type',
        'a.normal_side',
        db.raw('min(a.name) as name'),
        db.raw(`coalesce(sum(t.debits), 0)::text as debit_total`),
        db.raw(`coalesce(sum(t.credits), 0)::text as credit_total`),
        db.raw(branchId ? 'min(a.id::text) as account_id' : 'null as account_id'),
      )
      .groupBy('a.code', 'a.type', 'a.normal_side')
      .orderBy('a.code');
    if (branches) q.whereIn('a.branch_id', branches);
    if (branchId) q.where('a.branch_id', branchId);
    const rows = (await q) as Row[];
    return rows.map((r) => ({
      accountId: (r.account_id as string | null) ?? null,
      code: r.code as string,
      name: r.name as string,
      type: r.type as AccountType,
      normalSide: r.normal_side as Side,
      debitTotal: r.debit_total as string,
      creditTotal: r.credit_total as string,
    }));
  }

  /** A salesperson's balance on a sub-ledger account (debits − credits), for the commission statements. */
  async salespersonNet(
    accountCode: string,
    salespersonId: string,
    branchId: string | null,
    asOf: string | null,
    db: Db = this.knex,
  ): Promise<string> {
    const q = db('journal_lines as l')
      .join('ledger_accounts as a', 'a.id', 'l.account_id')
      .join('journal_entries as e', 'e.id', 'l.entry_id')
      .where('a.code', accountCode)
      .where('l.salesperson_id', salespersonId)
      .first(
        db.raw(`coalesce(sum(case when l.side = 'debit' then l.amount else -l.amount end), 0)::text as net`),
      );
    if (branchId) q.where('l.branch_id', branchId);
    if (asOf) q.where('e.effective_on', '<=', asOf);
    const r = (await q) as { net: string };
    return money(r.net).toFixed(2);
  }
}
