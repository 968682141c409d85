// When a commission is earned, and when it is clawed back.
//
// A buyer who signed at home may cancel until midnight at the end of the third business day (16 CFR
// 429.1(a), published), and the seller must then refund every payment, the deposit included (FTC guidance,
// secondary; REFERENCE-VALUES.md). So a deposit taken inside the window is not yet the contractor's money,
// and a commission on it is not yet earned. The rules, for each salesperson of the contract:
//
//   'deposit_cleared_window_closed'  earned once the deposit has cleared AND the window has closed: the
//        date on the branch's clock is after `lastDayToCancel` (cancellationWindowOpen is false). While the
//        window is open nothing is earned, whatever was paid.
//   'job_completed'                  the rest, earned once the job is completed (and the window is closed).
//   Each milestone is earned at most once per salesperson (an earning already in `alreadyEarned` is never
//   repeated), and a milestone whose amount is 0.00 produces no line.
//   Cancelled or refunded (whichever comes first, up to `asOf`): nothing more is ever earned, and every
//   milestone earned and not yet clawed back gets one clawback line, equal and opposite to what was earned
//   (the amounts in `alreadyEarned`, not a recomputation), dated the day of the cancellation or refund.
//   statement.ts places it in the salesperson's next open statement.
//
// `effectiveOn` is the date (branch clock) on which the milestone's conditions were all met — not the day
// the scheduled job happened to notice — so a late run gives the same dates and the same statements.
// Facts are instants ('2026-07-02T18:00:00Z') as the database stores them; `asOf` is the clock of the check.
// `refundedAt` means a refund that unwinds the sale (a partial goodwill credit is not a clawback event).
import { money, MoneyDecimal, toMoneyString, type Money } from '../money';
import { addCalendarDays, calendarDayNumber, type IsoDate } from '../deadlines/calendar-date';
import { cancellationWindowOpen, todayInZone } from '../deadlines/zoned-today';
import { throwIfIssues, type CommissionIssue } from './errors';
import {
  computeCommission,
  type CommissionDeal,
  type CommissionMilestone,
  type CommissionPlan,
} from './plan';

export const COMMISSION_LINE_KINDS = ['earning', 'clawback'] as const;
export type CommissionLineKind = (typeof COMMISSION_LINE_KINDS)[number];

export interface CommissionContractFacts extends CommissionDeal {
  contractId: string;
  /** The last day the buyer may cancel ('YYYY-MM-DD', from the contract: cancellationDeadline). */
  lastDayToCancel: IsoDate;
  /** The branch's IANA time zone: the clock the cancellation window is read on. */
  timeZone: string;
  /** ISO-8601 instants, or null while it has not happened. */
  depositClearedAt: string | null;
  completedAt: string | null;
  cancelledAt: string | null;
  refundedAt: string | null;
}

/** A commission line already recorded (what the backend stored from earlier calls). */
export interface CommissionLedgerLine {
  salespersonId: string;
  milestone: CommissionMilestone;
  kind: CommissionLineKind;
  /** Dollars: positive for an earning, negative for a clawback. */
  amount: string;
}

export interface CommissionEvent extends CommissionLedgerLine {
  contractId: string;
  /** The day the line belongs to (branch clock); its pay period follows from it. */
  effectiveOn: IsoDate;
  /** `${contractId}:${salespersonId}:${milestone}:${kind}` — unique: a database constraint keeps it once. */
  idempotencyKey: string;
}

function instantOrIssue(
  value: string | null,
  field: string,
  issues: CommissionIssue[],
): number | null | undefined {
  if (value === null) return null;
  const ms = typeof value === 'string' ? Date.parse(value) : Number.NaN;
  if (Number.isNaN(ms)) {
    issues.push({
      code: 'COMMISSION.FACTS_INVALID',
      field,
      message: `${field} must be an ISO-8601 instant such as "2026-07-02T18:00:00Z", or null.`,
    });
    return undefined;
  }
  return ms;
}

export function commissionEventKey(
  contractId: string,
  salespersonId: string,
  milestone: CommissionMilestone,
  kind: CommissionLineKind,
): string {
  return `${contractId}:${salespersonId}:${milestone}:${kind}`;
}

/**
 * The commission lines due now for one contract: earnings whose milestone has been reached and which are
 * not in `alreadyEarned`, or — after a cancellation or refund — clawbacks of what was earned. Pure and
 * idempotent: feeding its result back in `alreadyEarned` makes the next call return nothing new.
 */
export function commissionEvents(
  plan: CommissionPlan,
  contractFacts: CommissionContractFacts,
  alreadyEarned: readonly CommissionLedgerLine[],
  asOf: Date,
): CommissionEvent[] {
  const f = contractFacts;
  const issues: CommissionIssue[] = [];
  if (typeof f.contractId !== 'string' || f.contractId === '') {
    issues.push({
      code: 'COMMISSION.FACTS_INVALID',
      field: 'contractId',
      message: 'The contract id is missing.',
    });
  }
  if (typeof f.lastDayToCancel !== 'string' || calendarDayNumber(f.lastDayToCancel) === null) {
    issues.push({
      code: 'COMMISSION.FACTS_INVALID',
      field: 'lastDayToCancel',
      message: 'The last day to cancel must be a date written YYYY-MM-DD.',
    });
  }
  try {
    todayInZone(f.timeZone, asOf);
  } catch {
    issues.push({ code: 'COMMISSION.FACTS_INVALID', field: 'timeZone', message: 'Unknown time zone.' });
  }
  if (Number.isNaN(asOf.getTime())) {
    issues.push({ code: 'COMMISSION.FACTS_INVALID', field: 'asOf', message: 'asOf is not a valid instant.' });
  }
  const depositMs = instantOrIssue(f.depositClearedAt, 'depositClearedAt', issues);
  const completedMs = instantOrIssue(f.completedAt, 'completedAt', issues);
  const cancelledMs = instantOrIssue(f.cancelledAt, 'cancelledAt', issues);
  const refundedMs = instantOrIssue(f.refundedAt, 'refundedAt', issues);
  throwIfIssues(issues);

  const now = asOf.getTime();
  const happened = (ms: number | null | undefined): ms is number => typeof ms === 'number' && ms <= now;
  const dayOf = (ms: number): IsoDate => todayInZone(f.timeZone, new Date(ms));

  const recorded = (sp: string, m: CommissionMilestone, kind: CommissionLineKind) =>
    alreadyEarned.filter((l) => l.salespersonId === sp && l.milestone === m && l.kind === kind);

  // Cancelled or refunded: claw back what was earned, earn nothing more.
  const unwoundAt = [cancelledMs, refundedMs].filter(happened).sort((a, b) => a - b)[0];
  if (unwoundAt !== undefined) {
    const effectiveOn = dayOf(unwoundAt);
    const events: CommissionEvent[] = [];
    const seen = new Set<string>();
    for (const line of alreadyEarned) {
      if (line.kind !== 'earning') continue;
      const key = commissionEventKey(f.contractId, line.salespersonId, line.milestone, 'clawback');
      if (seen.has(key)) continue;
      seen.add(key);
      if (recorded(line.salespersonId, line.milestone, 'clawback').length > 0) continue;
      const earned = recorded(line.salespersonId, line.milestone, 'earning').reduce<Money>(
        (a, l) => a.plus(money(l.amount)),
        new MoneyDecimal(0),
      );
      if (earned.isZero()) continue;
      events.push({
        contractId: f.contractId,
        salespersonId: line.salespersonId,
        milestone: line.milestone,
        kind: 'clawback',
        amount: toMoneyString(earned.negated()),
        effectiveOn,
        idempotencyKey: key,
      });
    }
    return events;
  }

  // Nothing is earned while the buyer may still cancel, even if the deposit has cleared.
  if (cancellationWindowOpen({ lastDayToCancel: f.lastDayToCancel, timeZone: f.timeZone, now: asOf })) {
    return [];
  }
  const windowClosedOn = addCalendarDays(f.lastDayToCancel, 1);
  const laterOf = (a: IsoDate, b: IsoDate) => (a > b ? a : b);
  const reached: { milestone: CommissionMilestone; effectiveOn: IsoDate }[] = [];
  if (happened(depositMs)) {
    reached.push({
      milestone: 'deposit_cleared_window_closed',
      effectiveOn: laterOf(dayOf(depositMs), windowClosedOn),
    });
  }
  if (happened(completedMs)) {
    reached.push({ milestone: 'job_completed', effectiveOn: laterOf(dayOf(completedMs), windowClosedOn) });
  }
  if (reached.length === 0) return [];

  const breakdown = computeCommission(plan, f);
  const events: CommissionEvent[] = [];
  for (const part of breakdown.parts) {
    for (const { milestone, effectiveOn } of reached) {
      const amount = part.milestones.find((m) => m.milestone === milestone)?.amount ?? '0.00';
      if (money(amount).isZero()) continue;
      if (recorded(part.salespersonId, milestone, 'earning').length > 0) continue;
      if (recorded(part.salespersonId, milestone, 'clawback').length > 0) continue;
      events.push({
        contractId: f.contractId,
        salespersonId: part.salespersonId,
        milestone,
        kind: 'earning',
        amount,
        effectiveOn,
        idempotencyKey: commissionEventKey(f.contractId, part.salespersonId, milestone, 'earning'),
      });
    }
  }
  return events;
}
