import { Inject, Injectable } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import {
  ACCOUNTS,
  asSubject,
  assertBalanced,
  balanceOnNormalSide,
  branchScope,
  LedgerError,
  money,
  reasonLabel,
  reversalOf,
  todayInZone,
  trialBalance,
  type AccountCode,
  type AccountLedger,
  type JournalEntry,
  type JournalPage,
  type LedgerAccount,
  type Posting,
  type SourceKind,
  type TrialBalance,
  toMoneyString,
} from '@loambook/common';
import { APP_CONFIG, type AppConfig } from '../config/config';
import { KNEX } from '../database/database.module';
import { inTransaction, type Db } from '../database/transaction';
import { conflict, DomainError, invalid, notFound } from '../common/domain-error';
import type { SessionUser } from '../auth/session-user';
import { toCsv } from './csv';
import { LedgerRepository, type BranchIds, type JournalFilter, type NewLine } from './ledger.repository';

/** Who or what posts an entry: a processor event (its id), a scheduled job (its name), or a person. */
export type PostSource =
  { kind: 'event'; ref: string } | { kind: 'system'; ref: string } | { kind: 'user'; userId: string };

export interface PostContext {
  branchId: string;
  /** One entry per key, ever: the processor event id for a webhook, a stable name for anything else. */
  idempotencyKey: string;
  source: PostSource;
  /** The business date of the movement (YYYY-MM-DD). */
  effectiveOn: string;
  leadId?: string | null;
  contractId?: string | null;
  jobId?: string | null;
}

export interface PostResult {
  entry: JournalEntry;
  /** false: the key had been posted before and nothing was written. */
  created: boolean;
}

export interface ReversalOptions {
  source: PostSource;
  reason: string;
  /** Defaults to today in the branch's time zone. */
  effectiveOn?: string;
  /** Defaults to `reversal:<entry id>` (an entry is reversed once). */
  idempotencyKey?: string;
}

export interface JournalQueryInput extends JournalFilter {
  page?: string;
  pageSize?: string;
}

export interface AccountLinesQueryInput {
  from?: string;
  to?: string;
  page?: string;
  pageSize?: string;
}

export interface Csv {
  filename: string;
  body: string;
}

/** The most lines one CSV export carries: narrow the dates for more. */
export const CSV_MAX_LINES = 100_000;

const entryNotFound = () => notFound('journal entry');
const accountNotFound = () => notFound('ledger account');
const branchNotFound = () => notFound('branch');

function ruleFrom(e: unknown): never {
  if (e instanceof LedgerError) throw new DomainError('rule', e.code, e.message);
  throw e;
}

function sourceColumns(s: PostSource): {
  sourceKind: SourceKind;
  sourceRef: string;
  postedBy: string | null;
} {
  return s.kind === 'user'
    ? { sourceKind: 'user', sourceRef: s.userId, postedBy: s.userId }
    : { sourceKind: s.kind, sourceRef: s.ref, postedBy: null };
}

/** The comparable content of a posting: what must agree when a key is posted again. */
function fingerprint(
  reasonCode: string,
  lines: { account: string; side: string; amount: string; sp: string | null }[],
) {
  return JSON.stringify([
    reasonCode,
    lines.map((l) => [l.account, l.side, toMoneyString(l.amount), l.sp ?? null]),
  ]);
}

/** More branches than a contractor has: past it the account cache simply starts again. */
const ACCOUNT_CACHE_BRANCHES = 1000;

/** The posting's lines with their accounts' ids; null when the branch lacks one of the accounts. */
function linesOf(posting: Posting, accounts: Map<string, string>): NewLine[] | null {
  const lines: NewLine[] = [];
  for (const l of posting.lines) {
    const accountId = accounts.get(l.account);
    if (!accountId) return null;
    lines.push({
      accountId,
      side: l.side,
      amount: toMoneyString(l.amount),
      salespersonId: l.salespersonId ?? null,
    });
  }
  return lines;
}

/** Every record an entry names must be in the entry's branch (null: no such record). */
function checkRecords(
  branchId: string,
  refs: { leadId: string | null; contractId: string | null; jobId: string | null },
  found: { lead: string | null; contract: string | null; job: string | null },
) {
  const pairs = [
    ['lead', refs.leadId, found.lead],
    ['contract', refs.contractId, found.contract],
    ['job', refs.jobId, found.job],
  ] as const;
  for (const [what, id, branch] of pairs) {
    if (id && branch !== branchId) {
      throw new DomainError(
        'rule',
        'LEDGER.RECORD_OUTSIDE_BRANCH',
        `The ${what} named by the entry is not in the entry's branch.`,
      );
    }
  }
}

/**
 * The ledger: posts balanced entries (idempotently, by key), reverses them, and answers the bookkeeper's
 * questions (journal, account ledger, trial balance). The database checks every entry again at commit.
 * Other features post through post() inside their own transaction.
 */
@Injectable()
export class LedgerService {
  /** Account ids by code, per branch (see accountIds). */
  private readonly accountsByBranch = new Map<string, Map<string, string>>();

  constructor(
    private readonly repo: LedgerRepository,
    @Inject(KNEX) private readonly knex: Knex,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  // ---- posting ----------------------------------------------------------------------------------------

  /**
   * Posts a balanced entry in the branch, once per idempotency key: posting a key again returns the entry
   * already posted and writes nothing (a different posting under a used key is a conflict: a bug).
   * Runs in `trx` when given, so the entry commits or rolls back with the caller's work.
   */
  async post(posting: Posting, ctx: PostContext, trx?: Db): Promise<PostResult> {
    if (posting.reasonCode === 'reversal') {
      throw new DomainError('rule', 'LEDGER.REVERSAL_NEEDS_ORIGINAL', 'Reverse an entry with reverse().');
    }
    return this.write(posting, ctx, null, trx ?? this.knex);
  }

  /** Reverses an entry on behalf of a person who may (bookkeeper, owner). */
  async reverse(entryId: string, user: SessionUser, reason: string): Promise<JournalEntry> {
    const original = await this.readableEntry(user, entryId, this.knex);
    ForbiddenError.from(user.ability).throwUnlessCan(
      'create',
      asSubject('JournalEntry', { branchId: original.branchId }),
    );
    const { entry } = await this.postReversal(entryId, { source: { kind: 'user', userId: user.id }, reason });
    return entry;
  }

  /**
   * The entry that undoes `entryId` (every line on the other side), naming it. An entry is reversed once:
   * a second attempt is a conflict (LEDGER.ALREADY_REVERSED).
   */
  async postReversal(entryId: string, opts: ReversalOptions, trx?: Db): Promise<PostResult> {
    return inTransaction(trx ?? this.knex, async (db) => {
      const original = await this.repo.entry(entryId, db);
      if (!original) throw entryNotFound();
      if (original.reversedByEntryId) {
        throw conflict('LEDGER.ALREADY_REVERSED', 'This entry has already been reversed.', {
          reversedByEntryId: original.reversedByEntryId,
        });
      }
      const reason = opts.reason.trim();
      if (!reason) throw invalid('reason', 'Say why the entry is reversed.');
      const posting = reversalOf(
        {
          reasonCode: original.reasonCode,
          lines: original.lines.map((l) => ({
            account: l.accountCode as AccountCode,
            side: l.side,
            amount: l.amount,
            ...(l.salespersonId ? { salespersonId: l.salespersonId } : {}),
          })),
        },
        reason,
      );
      const effectiveOn = opts.effectiveOn ?? (await this.todayIn(original.branchId, db));
      const result = await this.write(
        posting,
        {
          branchId: original.branchId,
          idempotencyKey: opts.idempotencyKey ?? `reversal:${original.id}`,
          source: opts.source,
          effectiveOn,
          leadId: original.leadId,
          contractId: original.contractId,
          jobId: original.jobId,
        },
        original.id,
        db,
      );
      if (!result.created) {
        throw conflict('LEDGER.ALREADY_REVERSED', 'This entry has already been reversed.', {
          reversedByEntryId: result.entry.id,
        });
      }
      return result;
    });
  }

  private async write(
    posting: Posting,
    ctx: PostContext,
    reversesEntryId: string | null,
    outer: Db,
  ): Promise<PostResult> {
    try {
      assertBalanced(posting);
    } catch (e) {
      ruleFrom(e);
    }
    const key = ctx.idempotencyKey?.trim();
    if (!key || key.length > 255) {
      throw new DomainError(
        'rule',
        'LEDGER.KEY_REQUIRED',
        'Every posting needs an idempotency key (1–255 characters).',
      );
    }
    if (!/^\d{4}-\d{2}-\d{2}$/.test(ctx.effectiveOn ?? '')) {
      throw new DomainError('rule', 'LEDGER.DATE_INVALID', 'The effective date must be YYYY-MM-DD.');
    }
    const refs = {
      leadId: ctx.leadId ?? null,
      contractId: ctx.contractId ?? null,
      jobId: ctx.jobId ?? null,
    };
    return inTransaction(outer, async (db) => {
      const accounts = await this.accountIds(ctx.branchId, posting, db);
      const lines = accounts && linesOf(posting, accounts);
      if (!lines) {
        // No such branch, or it lacks an account: the key is looked at first, as for any posting.
        const existing = await this.repo.entryIdByKey(key, db);
        if (existing) return { entry: await this.checkedRepeat(existing, posting, ctx, db), created: false };
        if (!accounts) throw branchNotFound();
        const missing = posting.lines.find((l) => !accounts.has(l.account))!;
        throw new DomainError(
          'rule',
          'LEDGER.UNKNOWN_ACCOUNT',
          `The branch has no account ${missing.account}.`,
        );
      }
      // One statement: the key, the branch and the records checked, the entry and its lines written.
      const out = await this.repo.postEntry(
        {
          branchId: ctx.branchId,
          reasonCode: posting.reasonCode,
          ...sourceColumns(ctx.source),
          idempotencyKey: key,
          reversesEntryId,
          memo: posting.memo?.slice(0, 500) || null,
          effectiveOn: ctx.effectiveOn,
          ...refs,
        },
        lines,
        db,
      );
      if (out.existingId) {
        return { entry: await this.checkedRepeat(out.existingId, posting, ctx, db), created: false };
      }
      if (!out.branchExists) {
        this.accountsByBranch.delete(ctx.branchId);
        throw branchNotFound();
      }
      checkRecords(ctx.branchId, refs, out.recordBranches);
      if (!out.entry) {
        // Another transaction posted this key while we were getting ready: theirs stands.
        const theirs = await this.repo.entryIdByKey(key, db);
        return { entry: await this.checkedRepeat(theirs!, posting, ctx, db), created: false };
      }
      return { entry: out.entry, created: true };
    });
  }

  /**
   * The branch's account ids by code. They never change (a trigger keeps an account's branch and code,
   * and deletes accounts only with their branch), so they are read once per branch; read again when a
   * posting names a code not yet seen. Null: the branch has no accounts (no such branch).
   */
  private async accountIds(branchId: string, posting: Posting, db: Db): Promise<Map<string, string> | null> {
    let known = this.accountsByBranch.get(branchId);
    if (!known || posting.lines.some((l) => !known!.has(l.account))) {
      known = new Map((await this.repo.accounts(branchId, db)).map((a) => [a.code, a.id]));
      if (this.accountsByBranch.size >= ACCOUNT_CACHE_BRANCHES) this.accountsByBranch.clear();
      if (known.size > 0) this.accountsByBranch.set(branchId, known);
      else this.accountsByBranch.delete(branchId);
    }
    return known.size > 0 ? known : null;
  }

  /** The entry already posted under a key, after checking it is the same posting. */
  private async checkedRepeat(id: string, posting: Posting, ctx: PostContext, db: Db = this.knex) {
    const entry = (await this.repo.entry(id, db))!;
    const same =
      entry.branchId === ctx.branchId &&
      fingerprint(
        entry.reasonCode,
        entry.lines.map((l) => ({
          account: l.accountCode,
          side: l.side,
          amount: l.amount,
          sp: l.salespersonId,
        })),
      ) ===
        fingerprint(
          posting.reasonCode,
          posting.lines.map((l) => ({ ...l, sp: l.salespersonId ?? null })),
        );
    if (!same) {
      throw conflict('LEDGER.KEY_REUSED', 'This idempotency key was used for a different posting.', {
        entryId: entry.id,
      });
    }
    return entry;
  }

  private async todayIn(branchId: string, db: Db): Promise<string> {
    const branch = await this.repo.branchExists(branchId, db);
    return todayInZone(branch?.timezone ?? 'UTC', this.now());
  }

  private now(): Date {
    return this.config.testNow ? new Date(this.config.testNow.getTime()) : new Date();
  }

  // ---- who may read what ------------------------------------------------------------------------------

  private scope(user: SessionUser): BranchIds {
    return branchScope(user, 'money');
  }

  private mayRead(user: SessionUser, branchId: string): boolean {
    const scope = this.scope(user);
    return (
      (scope === null || scope.includes(branchId)) &&
      user.ability.can('read', asSubject('JournalEntry', { branchId }))
    );
  }

  /** A branch named in a filter: one the person may read, or 404. */
  private async readableBranch(user: SessionUser, branchId: string | undefined, db: Db = this.knex) {
    if (!branchId) return null;
    const branch = await this.repo.branchExists(branchId, db);
    if (!branch || !this.mayRead(user, branchId)) throw branchNotFound();
    return branch;
  }

  private async readableEntry(user: SessionUser, id: string, db: Db): Promise<JournalEntry> {
    const entry = await this.repo.entry(id, db);
    if (!entry || !this.mayRead(user, entry.branchId)) throw entryNotFound();
    return entry;
  }

  private checkRange(from?: string, to?: string) {
    if (from && to && from > to) throw invalid('to', 'The end date is before the start date.');
  }

  // ---- reading ----------------------------------------------------------------------------------------

  async entry(user: SessionUser, id: string): Promise<JournalEntry> {
    return this.readableEntry(user, id, this.knex);
  }

  async journal(user: SessionUser, q: JournalQueryInput): Promise<JournalPage> {
    await this.readableBranch(user, q.branchId);
    this.checkRange(q.from, q.to);
    const page = Math.max(1, Number(q.page ?? '1'));
    const pageSize = Number(q.pageSize ?? '50');
    const { items, total } = await this.repo.journal(this.scope(user), q, {
      limit: pageSize,
      offset: (page - 1) * pageSize,
    });
    return { items, total, page, pageSize };
  }

  async journalCsv(user: SessionUser, q: JournalFilter): Promise<Csv> {
    await this.readableBranch(user, q.branchId);
    this.checkRange(q.from, q.to);
    const rows = await this.repo.journalLines(this.scope(user), q, CSV_MAX_LINES);
    if (rows.length > CSV_MAX_LINES) {
      throw new DomainError(
        'rule',
        'LEDGER.EXPORT_TOO_LARGE',
        `More than ${CSV_MAX_LINES.toLocaleString('en-US')} lines: narrow the dates and export again.`,
      );
    }
    const body = toCsv(
      [
        'entry_id',
        'effective_on',
        'posted_at',
        'branch',
        'reason_code',
        'reason',
        'memo',
        'source_kind',
        'source_ref',
        'reverses_entry_id',
        'line',
        'account_code',
        'account_name',
        'debit',
        'credit',
        'salesperson',
      ],
      rows.map((r) => [
        r.entry_id as string,
        r.effective_on as string,
        (r.posted_at as Date).toISOString(),
        r.branch_code as string,
        r.reason_code as string,
        reasonLabel(r.reason_code as string),
        r.memo as string | null,
        r.source_kind as string,
        r.source_ref as string,
        r.reverses_entry_id as string | null,
        String(r.position),
        r.account_code as string,
        r.account_name as string,
        r.side === 'debit' ? (r.amount as string) : '',
        r.side === 'credit' ? (r.amount as string) : '',
        r.salesperson_name as string | null,
      ]),
    );
    return { filename: `journal${this.nameSuffix(q)}.csv`, body };
  }

  async accounts(user: SessionUser, branchId: string): Promise<LedgerAccount[]> {
    await this.readableBranch(user, branchId);
    return (await this.repo.accounts(branchId)).map(({ branchCode: _b, ...a }) => a);
  }

  private async readableAccount(user: SessionUser, id: string) {
    const account = await this.repo.account(id);
    if (!account || !this.mayRead(user, account.branchId)) throw accountNotFound();
    return account;
  }

  async accountLedger(
    user: SessionUser,
    accountId: string,
    q: AccountLinesQueryInput,
  ): Promise<AccountLedger & { total: number; page: number; pageSize: number }> {
    const account = await this.readableAccount(user, accountId);
    this.checkRange(q.from, q.to);
    const page = Math.max(1, Number(q.page ?? '1'));
    const pageSize = Number(q.pageSize ?? '100');
    const [opening, inRange, { lines, total }] = await Promise.all([
      q.from ? this.repo.accountTotals(account.id, { before: q.from }) : { debits: '0', credits: '0' },
      this.repo.accountTotals(account.id, { from: q.from, to: q.to }),
      this.repo.accountLines(account, q, { limit: pageSize, offset: (page - 1) * pageSize }),
    ]);
    const openingBalance = balanceOnNormalSide(account.normalSide, opening.debits, opening.credits);
    const movement = balanceOnNormalSide(account.normalSide, inRange.debits, inRange.credits);
    const closing = money(openingBalance).plus(money(movement));
    return {
      account,
      from: q.from ?? null,
      to: q.to ?? null,
      openingBalance,
      closingBalance: closing.isZero() ? '0.00' : toMoneyString(closing),
      debitTotal: toMoneyString(inRange.debits),
      creditTotal: toMoneyString(inRange.credits),
      lines: lines.map((l) => ({ ...l, reasonLabel: reasonLabel(l.reasonCode) })),
      total,
      page,
      pageSize,
    };
  }

  async accountLedgerCsv(user: SessionUser, accountId: string, q: AccountLinesQueryInput): Promise<Csv> {
    const account = await this.readableAccount(user, accountId);
    this.checkRange(q.from, q.to);
    const { lines, total } = await this.repo.accountLines(account, q, {
      limit: CSV_MAX_LINES + 1,
      offset: 0,
    });
    if (total > CSV_MAX_LINES) {
      throw new DomainError(
        'rule',
        'LEDGER.EXPORT_TOO_LARGE',
        `More than ${CSV_MAX_LINES.toLocaleString('en-US')} lines: narrow the dates and export again.`,
      );
    }
    const body = toCsv(
      [
        'effective_on',
        'posted_at',
        'entry_id',
        'reason',
        'memo',
        'salesperson',
        'debit',
        'credit',
        'balance',
      ],
      lines.map((l) => [
        l.effectiveOn,
        l.postedAt,
        l.entryId,
        reasonLabel(l.reasonCode),
        l.memo,
        l.salespersonName,
        l.side === 'debit' ? l.amount : '',
        l.side === 'credit' ? l.amount : '',
        l.balance,
      ]),
    );
    return { filename: `account-${account.branchCode}-${account.code}${this.nameSuffix(q)}.csv`, body };
  }

  async trialBalance(user: SessionUser, q: { branchId?: string; asOf?: string }): Promise<TrialBalance> {
    await this.readableBranch(user, q.branchId);
    const asOf = q.asOf ?? (await this.defaultAsOf(user, q.branchId));
    const rows = await this.repo.accountTotalsAsOf(this.scope(user), q.branchId ?? null, asOf);
    const figures = trialBalance(rows);
    return {
      branchId: q.branchId ?? null,
      asOf,
      rows: figures.rows.map((r, i) => ({ ...r, accountId: rows[i]!.accountId })),
      totals: figures.totals,
    };
  }

  async trialBalanceCsv(user: SessionUser, q: { branchId?: string; asOf?: string }): Promise<Csv> {
    const tb = await this.trialBalance(user, q);
    const body = toCsv(
      [
        'account_code',
        'account_name',
        'type',
        'total_debits',
        'total_credits',
        'debit_balance',
        'credit_balance',
      ],
      [
        ...tb.rows.map((r) => [
          r.code,
          r.name,
          r.type,
          r.debitTotal,
          r.creditTotal,
          r.debitBalance,
          r.creditBalance,
        ]),
        [
          'TOTAL',
          tb.totals.balanced ? 'balanced' : `OUT OF BALANCE by ${tb.totals.difference}`,
          '',
          tb.totals.debitTotal,
          tb.totals.creditTotal,
          tb.totals.debitBalance,
          tb.totals.creditBalance,
        ],
      ],
    );
    const branch = q.branchId
      ? `-${(await this.repo.accounts(q.branchId))[0]?.branchCode ?? 'branch'}`
      : '-all';
    return { filename: `trial-balance${branch}-${tb.asOf}.csv`, body };
  }

  /** Today, in the branch's zone; for several branches the latest of their todays (nothing is left out). */
  private async defaultAsOf(user: SessionUser, branchId?: string): Promise<string> {
    if (branchId) return this.todayIn(branchId, this.knex);
    const zones = await this.repo.timezones(this.scope(user));
    const now = this.now();
    const days = zones.map((zone) => todayInZone(zone, now));
    return days.sort().at(-1) ?? todayInZone('UTC', now);
  }

  private nameSuffix(q: { from?: string; to?: string }): string {
    return `${q.from ? `-from-${q.from}` : ''}${q.to ? `-to-${q.to}` : ''}`;
  }

  /** A salesperson's balance on commissions payable (credit positive), for the commission statements. */
  async commissionsPayableBalance(
    salespersonId: string,
    opts: { branchId?: string; asOf?: string } = {},
    db: Db = this.knex,
  ): Promise<string> {
    const net = await this.repo.salespersonNet(
      ACCOUNTS.commissionsPayable,
      salespersonId,
      opts.branchId ?? null,
      opts.asOf ?? null,
      db,
    );
    const credit = money(net).negated();
    return credit.isZero() ? '0.00' : toMoneyString(credit);
  }
}
