import { Inject, Injectable, Logger } from '@nestjs/common';
import type { Knex } from 'knex';
import {
  commissionClawback,
  commissionEarned,
  commissionEvents,
  money,
  MoneyDecimal,
  type CommissionContractFacts,
  type CommissionLedgerLine,
  type CommissionMilestone,
  type EarningRunResult,
  type Money,
  toMoneyString,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import { LedgerService } from '../ledger/ledger.service';
import { Clock } from '../signing/clock';
import { CommissionSplitsService, dealOf } from './commission-splits.service';
import { CommissionsRepository, type CommissionContract, type LineRow } from './commissions.repository';

const MILESTONE_MEMO: Record<CommissionMilestone, string> = {
  deposit_cleared_window_closed: 'deposit cleared and cancellation window closed',
  job_completed: 'job completed',
};

/** What the earning check did for one contract. */
interface ContractOutcome {
  lines: number;
  earned: Money;
  clawedBack: Money;
  skipped?: 'no_plan' | 'no_salesperson';
}

/** A stored line as the rules read it: a clawback is negative. */
const ledgerLine = (l: LineRow): CommissionLedgerLine => ({
  salespersonId: l.salespersonId,
  milestone: l.milestone,
  kind: l.kind,
  amount: l.kind === 'clawback' ? toMoneyString(money(l.amount).negated()) : l.amount,
});

/**
 * The earning check (issue #5 §5): for each contract, the facts (deposit cleared, cancellation window
 * closed on the branch's clock, job completed, cancelled or refunded) go through commissionEvents(); each
 * new line is posted to the ledger (commission expense / commissions payable on the salesperson, or the
 * reverse for a clawback) and recorded, once, in the contract's own transaction. Run on a schedule
 * (CommissionsScheduler) and on request (POST /api/commissions/run).
 */
@Injectable()
export class CommissionsService {
  private readonly logger = new Logger('Commissions');

  constructor(
    private readonly repo: CommissionsRepository,
    private readonly splits: CommissionSplitsService,
    private readonly ledger: LedgerService,
    private readonly clock: Clock,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  async runEarning(asOf: Date = this.clock.now()): Promise<EarningRunResult> {
    const ids = await this.repo.earningCandidates();
    const result: EarningRunResult = {
      asOf: asOf.toISOString(),
      contractsChecked: ids.length,
      linesWritten: 0,
      earned: '0.00',
      clawedBack: '0.00',
      skipped: [],
      failures: [],
    };
    let earned: Money = new MoneyDecimal(0);
    let clawedBack: Money = new MoneyDecimal(0);
    for (const id of ids) {
      try {
        const outcome = await this.earnContract(id, asOf);
        result.linesWritten += outcome.lines;
        earned = earned.plus(outcome.earned);
        clawedBack = clawedBack.plus(outcome.clawedBack);
        if (outcome.skipped) result.skipped.push({ contractId: id, reason: outcome.skipped });
      } catch (e) {
        const err = e as { code?: unknown; message?: unknown };
        const code = typeof err.code === 'string' && err.code.includes('.') ? err.code : 'INTERNAL';
        result.failures.push({ contractId: id, code, message: String(err.message ?? e) });
        this.logger.error({ err: e, contractId: id }, 'Commission earning check failed for a contract');
      }
    }
    result.earned = toMoneyString(earned);
    result.clawedBack = toMoneyString(clawedBack);
    if (result.linesWritten > 0 || result.failures.length > 0) {
      this.logger.log(
        `Commission earning check as of ${result.asOf}: ${result.linesWritten} line(s), earned ${result.earned}, clawed back ${result.clawedBack}, ${result.failures.length} failure(s)`,
      );
    }
    return result;
  }

  /** One contract, in one transaction with its row locked. */
  async earnContract(contractId: string, asOf: Date): Promise<ContractOutcome> {
    return inTransaction(this.knex, async (trx) => {
      const none: ContractOutcome = {
        lines: 0,
        earned: new MoneyDecimal(0),
        clawedBack: new MoneyDecimal(0),
      };
      const c = await this.repo.lockedContract(contractId, trx);
      if (!c) return none;
      const existing = await this.repo.lines(c.id, trx);
      // A contract cancelled before anything was earned has nothing to earn or claw back.
      if (c.cancelledAt && existing.length === 0) return none;
      const ensured = await this.splits.ensure(c, trx);
      if ('skipped' in ensured) return { ...none, skipped: ensured.skipped };
      const facts = await this.facts(c, trx);
      const events = commissionEvents(
        ensured.plan,
        { ...facts, ...dealOf(c, ensured.splits) },
        existing.map(ledgerLine),
        asOf,
      );
      const outcome = { ...none };
      for (const ev of events) {
        const amount = toMoneyString(money(ev.amount).abs());
        const memo = `${ev.kind === 'earning' ? 'Commission earned' : 'Commission clawed back'} — ${c.homeownerName} (${MILESTONE_MEMO[ev.milestone]})`;
        const posting =
          ev.kind === 'earning'
            ? commissionEarned({ amount, salespersonId: ev.salespersonId, memo })
            : commissionClawback({ amount, salespersonId: ev.salespersonId, memo });
        const { entry } = await this.ledger.post(
          posting,
          {
            branchId: c.branchId,
            idempotencyKey: ev.idempotencyKey,
            source: { kind: 'system', ref: 'commissions.earning' },
            effectiveOn: ev.effectiveOn,
            leadId: c.leadId,
            contractId: c.id,
            jobId: c.jobId,
          },
          trx,
        );
        const written = await this.repo.insertLine(
          {
            idempotencyKey: ev.idempotencyKey,
            contractId: c.id,
            salespersonId: ev.salespersonId,
            branchId: c.branchId,
            milestone: ev.milestone,
            kind: ev.kind,
            amount,
            effectiveOn: ev.effectiveOn,
            journalEntryId: entry.id,
          },
          trx,
        );
        if (!written) continue;
        outcome.lines += 1;
        if (ev.kind === 'earning') outcome.earned = outcome.earned.plus(amount);
        else outcome.clawedBack = outcome.clawedBack.plus(amount);
      }
      return outcome;
    });
  }

  /**
   * The contract's facts as the rules read them. A contract that asks no deposit counts its deposit as
   * cleared when it was signed (as the jobs do: migrations/20261203000000_jobs.ts).
   */
  private async facts(
    c: CommissionContract,
    trx: Knex.Transaction,
  ): Promise<Omit<CommissionContractFacts, 'netPrice' | 'cost' | 'splits'>> {
    const refundedAt = await this.repo.refundedAt(c.id, trx);
    const noDeposit = !money(c.depositAmount).greaterThan(0);
    return {
      contractId: c.id,
      lastDayToCancel: c.lastDayToCancel,
      timeZone: c.timeZone,
      depositClearedAt: c.depositReceivedAt
        ? c.depositReceivedAt.toISOString()
        : noDeposit
          ? c.signedAt.toISOString()
          : null,
      completedAt: c.completedAt ? c.completedAt.toISOString() : null,
      cancelledAt: c.cancelledAt ? c.cancelledAt.toISOString() : null,
      refundedAt: refundedAt ? refundedAt.toISOString() : null,
    };
  }
}
