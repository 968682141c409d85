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
  toMoneyString,
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
    total: toMoneyString(total),
    lines,
  };
}

/** What one posting statement found and did (LedgerRepository.postEntry). */
export interface PostOutcome {
  /** The entry already posted under the key (as the statement's snapshot saw it): nothing was written. */
  existingId: string | null;
  branchExists: boolean;
  /** The branches of the lead, contract and job the entry names (null: not named, or no such record). */
  recordBranches: { lead: string | null; contract: string | null; job: string | null };
  /** The entry written, with its lines; null when nothing was written. */
  entry: JournalEntry | null;
}

const REFS = [
  ['lead', 'leadId', 'leads'],
  ['contract', 'contractId', 'contracts'],
  ['job', 'jobId', 'jobs'],
] as const;

/**
 * The one statement that posts an entry: it looks up the key, the branch and the branches of the records
 * the entry names, and — only when the key is unused, the branch exists and every record named is in it —
 * inserts the entry (ON CONFLICT on the key: a concurrent post of the same key waits for that one to commit,
 * then inserts nothing) and its lines, returning the checks and the entry as read back from what was
 * written. Exported so that the webhook benchmark replays exactly this statement.
 */
export function postEntryStatement(
  e: NewEntry,
  lines: NewLine[],
): { sql: string; bindings: (string | null)[] } {
  const named = REFS.filter(([, field]) => e[field] !== null);
  const bindings: (string | null)[] = [e.branchId, e.idempotencyKey];
  for (const [, field] of named) bindings.push(e[field]);
  bindings.push(
    e.branchId,
    e.reasonCode,
    e.sourceKind,
    e.sourceRef,
    e.idempotencyKey,
    e.reversesEntryId,
    e.memo,
    e.effectiveOn,
    e.postedBy,
    e.leadId,
    e.contractId,
    e.jobId,
  );
  bindings.push(...named.map(() => e.branchId));
  for (const l of lines) bindings.push(l.accountId, l.side, l.amount, l.salespersonId);
  const sql = `with chk as (
    select exists (select 1 from branches where id = ?::uuid) as branch_ok,
      (select id from journal_entries where idempotency_key = ?::text) as existing_id${named
        .map(
          ([what, , table]) =>
            `,\n      (select branch_id from ${table} where id = ?::uuid) as ${what}_branch`,
        )
        .join('')}
  ), e as (
    insert into journal_entries (branch_id, reason_code, source_kind, source_ref, idempotency_key,
      reverses_entry_id, memo, effective_on, posted_by, lead_id, contract_id, job_id)
    select ?::uuid, ?::text, ?::text, ?::text, ?::text, ?::uuid, ?::text, ?::date, ?::uuid, ?::uuid, ?::uuid, ?::uuid
    from chk where chk.branch_ok and chk.existing_id is null${named
      .map(([what]) => ` and chk.${what}_branch = ?::uuid`)
      .join('')}
    on conflict (idempotency_key) do nothing
    returning id, branch_id, reason_code, source_kind, source_ref, memo,
      ${DATE('effective_on')} as effective_on_text, posted_at, posted_by, lead_id, contract_id, job_id,
      reverses_entry_id
  ), l as (
    insert into journal_lines (entry_id, position, account_id, branch_id, side, amount, salesperson_id)
    select e.id, v.position, v.account_id, e.branch_id, v.side, v.amount, v.salesperson_id
    from e, (values ${lines
      .map((_, i) => `(${i + 1}, ?::uuid, ?::text, ?::numeric, ?::uuid)`)
      .join(', ')}) as v (position, account_id, side, amount, salesperson_id)
    returning id, entry_id, position, account_id, side, amount, salesperson_id
  )
  select chk.branch_ok, chk.existing_id${named.map(([what]) => `, chk.${what}_branch`).join('')},
    e.id, e.branch_id, b.code as branch_code, e.reason_code, e.source_kind, e.source_ref, e.memo,
    e.effective_on_text, e.posted_at, e.posted_by, u.name as posted_by_name, e.lead_id, e.contract_id,
    e.job_id, e.reverses_entry_id, null::uuid as reversed_by,
    l.id as line_id, l.account_id, a.code as account_code, a.name as account_name, l.side, l.amount,
    l.salesperson_id, s.name as salesperson_name
  from chk
  left join e on true
  left join l on l.entry_id = e.id
  left join branches b on b.id = e.branch_id
  left join ledger_accounts a on a.id = l.account_id
  left join users u on u.id = e.posted_by
  left join users s on s.id = l.salesperson_id
  order by l.position`;
  return { sql, bindings };
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

  // ---- posting ----------------------------------------------------------------------------------------

  async entryIdByKey(key: string, db: Db = this.knex): Promise<string | null> {
    const r = (await db('journal_entries').where({ idempotency_key: key }).first('id')) as Row | undefined;
    return (r?.id as string | undefined) ?? null;
  }

  /**
   * Posts an entry and its lines in one round trip (postEntryStatement): what the checks found, and the
   * entry written (null when the key was taken, the branch is missing or a record named is elsewhere —
   * then nothing was written).
   */
  async postEntry(e: NewEntry, lines: NewLine[], db: Db): Promise<PostOutcome> {
    const { sql, bindings } = postEntryStatement(e, lines);
    const { rows } = await db.raw<{ rows: Row[] }>(sql, bindings);
    const first = rows[0]!;
    return {
      existingId: (first.existing_id as string | null) ?? null,
      branchExists: first.branch_ok === true,
      recordBranches: {
        lead: (first.lead_branch as string | null | undefined) ?? null,
        contract: (first.contract_branch as string | null | undefined) ?? null,
        job: (first.job_branch as string | null | undefined) ?? null,
      },
      entry: first.id
        ? toEntry(
            first,
            rows.map((r) => toLine({ ...r, id: r.line_id })),
          )
        : null,
    };
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
        balance: toMoneyString(r.balance as string),
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
    return toMoneyString(r.net);
  }
}
