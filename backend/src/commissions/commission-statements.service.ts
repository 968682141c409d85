import { Inject, Injectable } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import {
  asSubject,
  branchScope,
  commissionPaid,
  money,
  nextPayPeriod,
  payPeriodFor,
  statementLines,
  type BuildStatementsResult,
  type ClosedStatementRef,
  type CommissionStatementDetail,
  type CommissionStatementStatus,
  type CommissionStatementSummary,
  type PayStatementInput,
  type StatementLineInput,
  toMoneyString,
} from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import { conflict, DomainError, notFound } from '../common/domain-error';
import { LedgerService } from '../ledger/ledger.service';
import { rethrowCommissionError } from './commission-errors';
import {
  CommissionsRepository,
  type LineRow,
  type StatementRow,
  type StatementScope,
} from './commissions.repository';

const statementNotFound = () => notFound('commission statement');

interface PlacedLine extends StatementLineInput {
  id: string;
  statementId: string | null;
}

export interface StatementsQuery {
  branchId?: string;
  salespersonId?: string;
  period?: string;
  status?: CommissionStatementStatus;
}

/**
 * Semi-monthly commission statements per salesperson per branch (statement.ts in common has the rules):
 * the bookkeeper builds them from the lines earned and clawed back, reviews, approves and marks them paid
 * (commissions payable → bank for the payable amount). A negative statement pays nothing and carries into
 * the next one. Approved and paid statements are locked.
 */
@Injectable()
export class CommissionStatementsService {
  constructor(
    private readonly repo: CommissionsRepository,
    private readonly ledger: LedgerService,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  /** Everyone a person may see: the bookkeeper and owner all, a manager their branches, a salesperson theirs. */
  private scope(user: SessionUser): StatementScope {
    if (user.role === 'salesperson') return { branchIds: null, salespersonId: user.id };
    return { branchIds: branchScope(user, 'money'), salespersonId: null };
  }

  private visible(user: SessionUser, s: { branchId: string; salespersonId: string }): boolean {
    const scope = this.scope(user);
    return (
      (scope.branchIds === null || scope.branchIds.includes(s.branchId)) &&
      (scope.salespersonId === null || scope.salespersonId === s.salespersonId) &&
      user.ability.can(
        'read',
        asSubject('CommissionStatement', { branchId: s.branchId, salespersonId: s.salespersonId }),
      )
    );
  }

  async list(user: SessionUser, q: StatementsQuery): Promise<CommissionStatementSummary[]> {
    let periodStart: string | undefined;
    try {
      periodStart = q.period ? payPeriodFor(q.period).start : undefined;
    } catch (e) {
      rethrowCommissionError(e);
    }
    return this.repo.listStatements(this.scope(user), {
      branchId: q.branchId,
      salespersonId: q.salespersonId,
      periodStart,
      status: q.status,
    });
  }

  async get(user: SessionUser, id: string): Promise<CommissionStatementDetail> {
    const s = await this.repo.statementSummary(id);
    if (!s || !this.visible(user, s)) throw statementNotFound();
    return { ...s, lines: await this.repo.statementLineViews(id) };
  }

  private async detail(id: string, db: Knex | Knex.Transaction): Promise<CommissionStatementDetail> {
    const s = (await this.repo.statementSummary(id, db))!;
    return { ...s, lines: await this.repo.statementLineViews(id, db) };
  }

  /**
   * Puts every line not yet on a statement and dated up to the end of `period`'s pay period on its
   * salesperson's draft statement: the period of its date, or the first later one still open when that
   * one is approved or paid (so a clawback after approval lands in the next statement). Drafts are
   * recomputed, carry-forward included. Never places a line at or before a closed statement: the carry
   * chain of approved statements stays as it was approved.
   */
  async build(user: SessionUser, periodDate: string): Promise<BuildStatementsResult> {
    let period;
    try {
      period = payPeriodFor(periodDate);
    } catch (e) {
      rethrowCommissionError(e);
    }
    return inTransaction(this.knex, async (trx) => {
      // One build at a time: two would place the same lines.
      await trx.raw(`select pg_advisory_xact_lock(hashtext('loambook.commission_statements.build'))`);
      const groups = await this.repo.groupsWithUnplacedLines(period.end, trx);
      const touched: string[] = [];
      let linesPlaced = 0;
      for (const g of groups) {
        ForbiddenError.from(user.ability).throwUnlessCan(
          'create',
          asSubject('CommissionStatement', { branchId: g.branchId, salespersonId: g.salespersonId }),
        );
        const { ids, placed } = await this.buildGroup(g.salespersonId, g.branchId, period.end, trx);
        touched.push(...ids);
        linesPlaced += placed;
      }
      return {
        period: { start: period.start, end: period.end },
        linesPlaced,
        statements: await this.repo.statementSummaries([...new Set(touched)], trx),
      };
    });
  }

  private async buildGroup(
    salespersonId: string,
    branchId: string,
    upTo: string,
    trx: Knex.Transaction,
  ): Promise<{ ids: string[]; placed: number }> {
    const statements = await this.repo.groupStatements(salespersonId, branchId, trx);
    const closed = statements.filter((s) => s.status !== 'draft');
    const drafts = statements.filter((s) => s.status === 'draft');
    const latestClosed = closed[closed.length - 1];
    const unplaced = await this.repo.unplacedLines(salespersonId, branchId, upTo, trx);
    const onDrafts = await this.repo.linesOnStatements(
      drafts.map((d) => d.id),
      trx,
    );
    const draftStart = new Map(drafts.map((d) => [d.id, d.periodStart]));
    const signed = (l: LineRow) =>
      l.kind === 'clawback' ? toMoneyString(money(l.amount).negated()) : l.amount;
    const input: PlacedLine[] = [
      ...onDrafts.map((l) => ({
        id: l.id,
        statementId: l.statementId,
        salespersonId,
        kind: l.kind,
        amount: signed(l),
        effectiveOn: l.effectiveOn,
        periodStart: draftStart.get(l.statementId!) ?? null,
      })),
      ...unplaced.map((l) => ({
        id: l.id,
        statementId: null,
        salespersonId,
        kind: l.kind,
        amount: signed(l),
        effectiveOn: l.effectiveOn,
        periodStart: null,
      })),
    ];
    if (input.length === 0) return { ids: [], placed: 0 };
    const closedPeriods = this.closedUpTo(salespersonId, latestClosed, unplaced);
    let result;
    try {
      result = statementLines(input, {
        closedPeriods,
        openingCarry: {
          [salespersonId]: latestClosed
            ? money(latestClosed.net).isNegative()
              ? latestClosed.net
              : '0.00'
            : '0.00',
        },
      });
    } catch (e) {
      rethrowCommissionError(e);
    }
    const ids: string[] = [];
    let placed = 0;
    for (const st of result) {
      const totals = {
        earned: st.earned,
        clawedBack: st.clawedBack,
        carriedIn: st.carriedIn,
        net: st.net,
        payable: st.payable,
      };
      let id = drafts.find((d) => d.periodStart === st.period.start)?.id;
      if (id) {
        await this.repo.updateDraftTotals(id, totals, trx);
      } else {
        id = await this.repo.insertDraft(
          { salespersonId, branchId, periodStart: st.period.start, periodEnd: st.period.end, ...totals },
          trx,
        );
      }
      const fresh = st.lines.filter((l) => l.statementId === null).map((l) => l.id);
      await this.repo.placeLines(fresh, id, trx);
      placed += fresh.length;
      ids.push(id);
    }
    return { ids, placed };
  }

  /**
   * Every pay period from the earliest unplaced line's up to the latest closed statement counts as closed
   * for placing: a late line goes after the last approved statement, never into a new draft before it.
   */
  private closedUpTo(
    salespersonId: string,
    latestClosed: StatementRow | undefined,
    unplaced: LineRow[],
  ): ClosedStatementRef[] {
    if (!latestClosed || unplaced.length === 0) return [];
    const earliest = unplaced.map((l) => l.effectiveOn).sort()[0]!;
    const refs: ClosedStatementRef[] = [];
    for (let p = payPeriodFor(earliest); p.start <= latestClosed.periodStart; p = nextPayPeriod(p)) {
      refs.push({ salespersonId, periodStart: p.start });
    }
    return refs;
  }

  private async lockedVisible(user: SessionUser, id: string, trx: Knex.Transaction): Promise<StatementRow> {
    const s = await this.repo.statementRow(id, trx, true);
    if (!s || !this.visible(user, s)) throw statementNotFound();
    return s;
  }

  async approve(user: SessionUser, id: string): Promise<CommissionStatementDetail> {
    return inTransaction(this.knex, async (trx) => {
      const s = await this.lockedVisible(user, id, trx);
      ForbiddenError.from(user.ability).throwUnlessCan(
        'approve',
        asSubject('CommissionStatement', { branchId: s.branchId, salespersonId: s.salespersonId }),
      );
      if (s.status !== 'draft') {
        throw conflict('COMMISSION.STATEMENT_LOCKED', `This statement is already ${s.status}.`);
      }
      const earlier = await this.repo.earlierDraft(s, trx);
      if (earlier) {
        throw conflict(
          'COMMISSION.EARLIER_STATEMENT_OPEN',
          `Approve the statement of the period starting ${earlier} first: this one carries its balance.`,
          { periodStart: earlier },
        );
      }
      await this.repo.approve(id, user.id, trx);
      return this.detail(id, trx);
    });
  }

  /**
   * Marks an approved statement paid on `paidOn`, posting commissions payable (the salesperson's) / bank
   * for the payable amount. A statement whose net is 0 or negative pays 0.00 and posts nothing; its
   * shortfall is already carried into the next statement.
   */
  async pay(user: SessionUser, id: string, input: PayStatementInput): Promise<CommissionStatementDetail> {
    return inTransaction(this.knex, async (trx) => {
      const s = await this.lockedVisible(user, id, trx);
      ForbiddenError.from(user.ability).throwUnlessCan(
        'update',
        asSubject('CommissionStatement', { branchId: s.branchId, salespersonId: s.salespersonId }),
      );
      if (s.status === 'paid') {
        throw conflict('COMMISSION.STATEMENT_LOCKED', 'This statement is already paid.');
      }
      if (s.status !== 'approved') {
        throw conflict('COMMISSION.STATEMENT_NOT_APPROVED', 'Approve the statement before paying it.');
      }
      if (input.paidOn < s.periodStart) {
        throw new DomainError(
          'rule',
          'COMMISSION.PAID_BEFORE_PERIOD',
          'The payment date is before the pay period begins.',
          [{ field: 'paidOn', message: `Pay on ${s.periodStart} or later.` }],
        );
      }
      const reference = input.reference?.trim() || null;
      let journalEntryId: string | null = null;
      if (money(s.payable).greaterThan(0)) {
        const { entry } = await this.ledger.post(
          commissionPaid({
            amount: s.payable,
            salespersonId: s.salespersonId,
            memo: `Commission paid — statement ${s.periodStart} to ${s.periodEnd}${reference ? ` (${reference})` : ''}`,
          }),
          {
            branchId: s.branchId,
            idempotencyKey: `commission-statement:${s.id}:paid`,
            source: { kind: 'user', userId: user.id },
            effectiveOn: input.paidOn,
          },
          trx,
        );
        journalEntryId = entry.id;
      }
      await this.repo.markPaid(id, { userId: user.id, paidOn: input.paidOn, reference, journalEntryId }, trx);
      return this.detail(id, trx);
    });
  }
}
