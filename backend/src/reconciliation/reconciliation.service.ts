import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import {
  matchLines,
  payoutBreakdown,
  type BankAccount,
  type CreateMatchRequest,
  type LockBlockers,
  type MatchableLine,
  type MatchView,
  type PayoutBreakdownView,
  type ReconciledPeriod,
  type ReconciliationView,
  type SuggestResult,
} from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { conflict, DomainError, invalid, notFound } from '../common/domain-error';
import { KNEX } from '../database/database.module';
import { inTransaction, type Db } from '../database/transaction';
import { BankStatementsService } from './bank-statements.service';
import { isPgError, mayReconcile, translateError } from './reconciliation-access';
import { ReconciliationRepository, type NewMatch } from './reconciliation.repository';

/** Days either side a bank line may be from its payout or commission payment (issue #5: 3 by default). */
export const DEFAULT_WINDOW_DAYS = 3;
/** The longest range one request looks at. */
export const MAX_RANGE_DAYS = 400;

const matchNotFound = () => notFound('match', 'RECONCILIATION.MATCH_NOT_FOUND');

/** Days since 1970-01-01 of a 'YYYY-MM-DD' already validated by the DTO. */
function calendarDayNumber(day: string): number {
  return (
    Date.UTC(Number(day.slice(0, 4)), Number(day.slice(5, 7)) - 1, Number(day.slice(8, 10))) / 86_400_000
  );
}

function shiftDay(day: string, days: number): string {
  const n = calendarDayNumber(day);
  return new Date((n + days) * 86_400_000).toISOString().slice(0, 10);
}

function daysBetween(from: string, to: string): number {
  return calendarDayNumber(to) - calendarDayNumber(from);
}

/** Days of [from, to] no statement period covers. */
function uncoveredDays(from: string, to: string, periods: { from: string; to: string }[]): number {
  let cursor = calendarDayNumber(from);
  const end = calendarDayNumber(to);
  let missing = 0;
  for (const p of periods) {
    const a = calendarDayNumber(p.from);
    const b = calendarDayNumber(p.to);
    if (b < cursor) continue;
    if (a > end) break;
    if (a > cursor) missing += a - cursor;
    cursor = Math.max(cursor, b + 1);
    if (cursor > end) break;
  }
  if (cursor <= end) missing += end - cursor + 1;
  return missing;
}

/**
 * Matching the books' side (processor payouts by arrival date, paid commission statements by the day they
 * were paid — money out, so a negative bank line) to the bank lines of one account by amount and date window
 * (common/src/reconciliation matchLines), confirming or undoing matches, and locking a reconciled period.
 */
@Injectable()
export class ReconciliationService {
  constructor(
    private readonly repo: ReconciliationRepository,
    private readonly statements: BankStatementsService,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  private checkRange(from: string, to: string) {
    if (from > to) throw invalid('to', 'The end date is before the start date.');
    if (daysBetween(from, to) > MAX_RANGE_DAYS) {
      throw invalid('to', `Look at ${MAX_RANGE_DAYS} days at most.`);
    }
  }

  private mayChange(user: SessionUser, account: BankAccount) {
    if (!mayReconcile(user, 'update', account.branchId)) {
      throw new DomainError('forbidden', 'AUTH.FORBIDDEN', 'Your role does not allow this.');
    }
  }

  // ---- suggesting -------------------------------------------------------------------------------------

  async suggest(
    user: SessionUser,
    q: { bankAccountId: string; from: string; to: string; windowDays?: number },
  ): Promise<SuggestResult> {
    this.checkRange(q.from, q.to);
    const windowDays = q.windowDays ?? DEFAULT_WINDOW_DAYS;
    const account = await this.statements.readableAccount(user, q.bankAccountId);
    this.mayChange(user, account);
    try {
      return await inTransaction(this.knex, async (trx) => {
        // One suggestion run per account at a time; a lock waits for it (and it for a lock).
        await this.repo.account(account.id, trx, { forUpdate: true });
        const bank = (await this.repo.unmatchedBankLines(account.id, q.from, q.to, trx)).filter(
          (l) => !l.locked,
        );
        const lo = shiftDay(q.from, -windowDays);
        const hi = shiftDay(q.to, windowDays);
        const targets: (MatchableLine & { kind: 'payout' | 'commission_payment'; targetId: string })[] = [];
        if (account.receivesPayouts) {
          for (const p of await this.repo.unmatchedPayouts(lo, hi, trx)) {
            targets.push({
              id: `payout:${p.id}`,
              kind: 'payout',
              targetId: p.id,
              amountCents: p.amountCents,
              date: p.arrivalDate,
            });
          }
        }
        for (const c of await this.repo.unmatchedCommissionPayments(lo, hi, account.branchId, trx)) {
          targets.push({
            id: `commission:${c.id}`,
            kind: 'commission_payment',
            targetId: c.id,
            amountCents: c.bankAmountCents,
            date: c.paidOn,
          });
        }
        const bankSide = bank.map((l) => ({ id: l.id, amountCents: l.amountCents, date: l.postedOn }));
        const result = matchLines(targets, bankSide, { windowDays });
        const rows: NewMatch[] = result.matches.map((m) => ({
          bankLineId: m.bank.id,
          targetKind: m.ledger.kind,
          targetId: m.ledger.targetId,
          note: null,
          amountCents: m.amountCents,
          daysApart: m.daysApart,
          status: 'suggested',
          createdBy: user.id,
        }));
        await this.repo.insertMatches(rows, trx);
        return {
          windowDays,
          suggested: rows.length,
          bankLinesConsidered: bank.length,
          targetsConsidered: targets.length,
        };
      });
    } catch (e) {
      if (isPgError(e, '23505')) {
        throw conflict(
          'RECONCILIATION.CHANGED_MEANWHILE',
          'Someone matched these lines meanwhile: look again.',
        );
      }
      translateError(e);
    }
  }

  // ---- the workspace ----------------------------------------------------------------------------------

  private async blockers(account: BankAccount, from: string, to: string, db: Db): Promise<LockBlockers> {
    const counts = await this.repo.lineCounts(account.id, from, to, db);
    const payouts = account.receivesPayouts ? await this.repo.unmatchedPayouts(from, to, db) : [];
    const commissions = await this.repo.unmatchedCommissionPayments(from, to, account.branchId, db);
    return {
      unmatchedBankLines: counts.unmatched,
      unconfirmedMatches: counts.suggested,
      unmatchedPayouts: payouts.length,
      unmatchedCommissionPayments: commissions.length,
      uncoveredDays: uncoveredDays(from, to, await this.repo.statementPeriods(account.id, db)),
    };
  }

  async view(
    user: SessionUser,
    q: { bankAccountId: string; from: string; to: string },
  ): Promise<ReconciliationView> {
    this.checkRange(q.from, q.to);
    const account = await this.statements.readableAccount(user, q.bankAccountId);
    const db = this.knex;
    const [
      lockedPeriods,
      matched,
      unmatchedBankLines,
      unmatchedPayouts,
      unmatchedCommissionPayments,
      counts,
    ] = await Promise.all([
      this.repo.periods(account.id, { from: q.from, to: q.to }, db),
      this.repo.matchesInRange(account.id, q.from, q.to, db),
      this.repo.unmatchedBankLines(account.id, q.from, q.to, db),
      account.receivesPayouts ? this.repo.unmatchedPayouts(q.from, q.to, db) : Promise.resolve([]),
      this.repo.unmatchedCommissionPayments(q.from, q.to, account.branchId, db),
      this.repo.lineCounts(account.id, q.from, q.to, db),
    ]);
    const lockBlockers: LockBlockers = {
      unmatchedBankLines: counts.unmatched,
      unconfirmedMatches: counts.suggested,
      unmatchedPayouts: unmatchedPayouts.length,
      unmatchedCommissionPayments: unmatchedCommissionPayments.length,
      uncoveredDays: uncoveredDays(q.from, q.to, await this.repo.statementPeriods(account.id, db)),
    };
    const lockedDays = lockedPeriods.reduce((n, p) => {
      const a = p.periodStart > q.from ? p.periodStart : q.from;
      const b = p.periodEnd < q.to ? p.periodEnd : q.to;
      return n + daysBetween(a, b) + 1;
    }, 0);
    return {
      bankAccount: account,
      from: q.from,
      to: q.to,
      lockedPeriods,
      matched,
      unmatchedBankLines,
      unmatchedPayouts,
      unmatchedCommissionPayments,
      summary: {
        bankLines: counts.lines,
        moneyIn: counts.moneyIn,
        moneyOut: counts.moneyOut,
        suggested: counts.suggested,
        confirmed: counts.confirmed,
      },
      lockBlockers,
      locked: lockedDays === daysBetween(q.from, q.to) + 1,
    };
  }

  // ---- one match --------------------------------------------------------------------------------------

  private async changeableMatch(user: SessionUser, id: string, db: Db) {
    const match = await this.repo.match(id, db);
    if (!match) throw matchNotFound();
    const account = await this.repo.account(match.bankAccountId, db);
    if (!account || !mayReconcile(user, 'read', account.branchId)) throw matchNotFound();
    this.mayChange(user, account);
    return match;
  }

  private strip(m: MatchView & { bankAccountId?: string }): MatchView {
    const { bankAccountId: _a, ...rest } = m;
    return rest;
  }

  /** Confirms a suggestion; confirming a confirmed match changes nothing and answers it again. */
  async confirm(user: SessionUser, id: string): Promise<MatchView> {
    try {
      return await inTransaction(this.knex, async (trx) => {
        const match = await this.changeableMatch(user, id, trx);
        if (match.status === 'suggested') await this.repo.confirmMatch(id, user.id, trx);
        return this.strip((await this.repo.match(id, trx))!);
      });
    } catch (e) {
      translateError(e);
    }
  }

  /** Undoes a match (suggested or confirmed): both sides are unmatched again. Refused in a locked period. */
  async undo(user: SessionUser, id: string): Promise<void> {
    try {
      await inTransaction(this.knex, async (trx) => {
        await this.changeableMatch(user, id, trx);
        await this.repo.deleteMatch(id, trx);
      });
    } catch (e) {
      translateError(e);
    }
  }

  /**
   * A match the bookkeeper makes by hand, confirmed at once: a bank line to a payout or a paid commission
   * statement of the same amount (no date window: the bookkeeper decides), or to "other" with a note.
   */
  async createMatch(user: SessionUser, dto: CreateMatchRequest): Promise<MatchView> {
    try {
      return await inTransaction(this.knex, async (trx) => {
        const line = await this.repo.bankLine(dto.bankLineId, trx);
        if (!line) throw notFound('bank line');
        const account = await this.repo.account(line.bankAccountId, trx);
        if (!account || !mayReconcile(user, 'read', account.branchId)) throw notFound('bank line');
        this.mayChange(user, account);
        if (line.locked) throw translateError({ code: '23001', constraint: 'reconciliation_period_locked' });
        let targetDate: string | null = null;
        let expectedCents: string;
        if (dto.targetKind === 'payout') {
          const payout = await this.repo.payout(dto.targetId!, trx);
          if (!payout) throw notFound('payout');
          targetDate = payout.arrivalDate;
          expectedCents = payout.amountCents;
        } else if (dto.targetKind === 'commission_payment') {
          const statement = await this.repo.commissionPayment(dto.targetId!, trx);
          if (!statement) throw notFound('commission statement');
          if (statement.status !== 'paid') {
            throw new DomainError(
              'rule',
              'RECONCILIATION.NOT_PAID',
              'This commission statement has not been marked paid: there is no payment to match yet.',
            );
          }
          if (account.branchId && statement.branchId !== account.branchId) {
            throw new DomainError(
              'rule',
              'RECONCILIATION.OTHER_BRANCH',
              'This statement belongs to another branch than this bank account.',
            );
          }
          targetDate = statement.paidOn;
          expectedCents = statement.bankAmountCents;
        } else {
          expectedCents = line.amountCents;
        }
        if (expectedCents !== line.amountCents) {
          throw new DomainError(
            'rule',
            'RECONCILIATION.AMOUNT_MISMATCH',
            'The bank line and what it is matched to must be the same amount, to the cent.',
            { bankLineCents: line.amountCents, targetCents: expectedCents },
          );
        }
        let id: string;
        try {
          [id] = await this.repo.insertMatches(
            [
              {
                bankLineId: line.id,
                targetKind: dto.targetKind,
                targetId: dto.targetKind === 'other' ? null : dto.targetId!,
                note: dto.note?.trim() || null,
                amountCents: line.amountCents,
                daysApart: targetDate ? daysBetween(targetDate, line.postedOn) : null,
                status: 'confirmed',
                createdBy: user.id,
              },
            ],
            trx,
          );
        } catch (e) {
          if (isPgError(e, '23505', 'reconciliation_matches_bank_line_id_key')) {
            throw conflict('RECONCILIATION.LINE_ALREADY_MATCHED', 'This bank line is matched already.');
          }
          if (isPgError(e, '23505')) {
            throw conflict(
              'RECONCILIATION.TARGET_ALREADY_MATCHED',
              'This is matched to another bank line already.',
            );
          }
          throw e;
        }
        return this.strip((await this.repo.match(id!, trx))!);
      });
    } catch (e) {
      translateError(e);
    }
  }

  // ---- locking ----------------------------------------------------------------------------------------

  async periods(user: SessionUser, bankAccountId: string): Promise<ReconciledPeriod[]> {
    const account = await this.statements.readableAccount(user, bankAccountId);
    return this.repo.periods(account.id, null);
  }

  /**
   * Locks [from, to] on the account once it is reconciled: every bank line in it has a confirmed match,
   * every payout arriving and every commission payment paid in it is matched, and uploaded statements cover
   * every day. Otherwise 409 RECONCILIATION.PERIOD_NOT_RECONCILED with the counts.
   */
  async lock(
    user: SessionUser,
    dto: { bankAccountId: string; from: string; to: string },
  ): Promise<ReconciledPeriod> {
    this.checkRange(dto.from, dto.to);
    const account = await this.statements.readableAccount(user, dto.bankAccountId);
    this.mayChange(user, account);
    try {
      return await inTransaction(this.knex, async (trx) => {
        await this.repo.account(account.id, trx, { forUpdate: true });
        const overlapping = await this.repo.periods(account.id, { from: dto.from, to: dto.to }, trx);
        if (overlapping.length > 0) {
          throw conflict('RECONCILIATION.PERIOD_OVERLAPS', 'Part of this range is locked already.', {
            periods: overlapping.map((p) => ({
              id: p.id,
              periodStart: p.periodStart,
              periodEnd: p.periodEnd,
            })),
          });
        }
        const blockers = await this.blockers(account, dto.from, dto.to, trx);
        if (Object.values(blockers).some((n) => n > 0)) {
          throw conflict(
            'RECONCILIATION.PERIOD_NOT_RECONCILED',
            'The period is not reconciled yet: match or confirm what is listed, then lock it.',
            { ...blockers },
          );
        }
        return this.repo.insertPeriod(
          { bankAccountId: account.id, from: dto.from, to: dto.to, lockedBy: user.id },
          trx,
        );
      });
    } catch (e) {
      if (isPgError(e, '23P01')) {
        throw conflict('RECONCILIATION.PERIOD_OVERLAPS', 'Part of this range is locked already.');
      }
      translateError(e);
    }
  }

  // ---- payouts ----------------------------------------------------------------------------------------

  /** What a payout is made of (charges, refunds, fees), whether it adds up, and its bank line if matched. */
  async payoutBreakdown(user: SessionUser, payoutId: string): Promise<PayoutBreakdownView> {
    const payout = await this.repo.payout(payoutId);
    // A payout holds the company's charges, whatever their branch: it is read by whoever reconciles the
    // company's accounts.
    if (!payout || !mayReconcile(user, 'read', null)) throw notFound('payout');
    const [items, branches, match] = await Promise.all([
      this.repo.payoutItems(payoutId),
      this.repo.payoutBranches(payoutId),
      this.repo.matchOfPayout(payoutId),
    ]);
    let breakdown;
    try {
      breakdown = payoutBreakdown(
        items.map((i) => ({
          id: i.balanceTransactionId,
          type: i.type,
          amountCents: i.amountCents,
          feeCents: i.feeCents,
          netCents: i.netCents,
        })),
        payout.amountCents,
      );
    } catch (e) {
      translateError(e);
    }
    const view = items.map(({ amountCents: _a, feeCents: _f, netCents: _n, ...rest }) => rest);
    const isCharge = (t: string) => t === 'charge' || t === 'payment';
    const isRefund = (t: string) => t === 'refund' || t === 'payment_refund';
    return {
      payout,
      breakdown,
      branches,
      charges: view.filter((i) => isCharge(i.type)),
      refunds: view.filter((i) => isRefund(i.type)),
      others: view.filter((i) => !isCharge(i.type) && !isRefund(i.type)),
      match: match
        ? { id: match.id, status: match.status, bankLine: match.bankLine, bankAccountId: match.bankAccountId }
        : null,
    };
  }
}
