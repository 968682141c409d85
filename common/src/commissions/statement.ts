// Semi-monthly pay periods and commission statements.
//
// Pay periods: the 1st–15th and the 16th–last day of each month (semi-monthly, the customer's rule in
// issue #5; February ends on the 28th, or the 29th in a Gregorian leap year).
//
// Placing a line: a line goes to the pay period of its `effectiveOn`, unless that salesperson's statement
// for that period is already closed (approved or paid), in which case it goes to the first later period
// that is still open for them. A line the backend has already put on a statement carries that period in
// `periodStart` and stays there. So a clawback after a statement was approved lands in the next statement.
//
// Totals per salesperson per period:
//   earned      = Σ earning lines                    (≥ 0)
//   clawedBack  = Σ |clawback lines|                 (≥ 0)
//   total       = earned − clawedBack                (can be negative)
//   net         = carriedIn + total
//   payable     = max(0, net)                        what the bookkeeper pays (payable → bank)
//   carriedOut  = min(0, net)                        (≤ 0)
// CARRY-FORWARD RULE (our choice): a negative statement pays nothing and asks nothing back; the shortfall
// is carried into the salesperson's next statement as a deduction (`carriedIn` of the next one), and on
// until later earnings absorb it. The first statement's carriedIn is `openingCarry` (default 0.00). Any
// other recovery from a salesperson is the employer's policy under the state's wage-deduction law, not
// something Loambook does by itself.
import { money, MoneyDecimal, type Money } from '../money';
import { calendarDateFromDayNumber, calendarDayNumber, type IsoDate } from '../deadlines/calendar-date';
import { CommissionError, type CommissionIssue } from './errors';
import type { CommissionLineKind } from './earning';

export interface PayPeriod {
  /** First day, 'YYYY-MM-01' or 'YYYY-MM-16'. Identifies the period. */
  start: IsoDate;
  /** Last day, inclusive: 'YYYY-MM-15' or the month's last day. */
  end: IsoDate;
}

function lastDayOfMonth(year: number, month: number): number {
  // Day 0 of the next month is the last day of this one (UTC, so no zone can shift it).
  return new Date(Date.UTC(year, month, 0)).getUTCDate();
}

const pad = (n: number) => String(n).padStart(2, '0');

/** The semi-monthly pay period holding `date` ('YYYY-MM-DD'). */
export function payPeriodFor(date: IsoDate): PayPeriod {
  if (typeof date !== 'string' || calendarDayNumber(date) === null) {
    throw new CommissionError([
      { code: 'COMMISSION.STATEMENT_INVALID', field: 'date', message: `Not a date: ${String(date)}` },
    ]);
  }
  const year = Number(date.slice(0, 4));
  const month = Number(date.slice(5, 7));
  const day = Number(date.slice(8, 10));
  const ym = `${year}-${pad(month)}`;
  return day <= 15
    ? { start: `${ym}-01`, end: `${ym}-15` }
    : { start: `${ym}-16`, end: `${ym}-${pad(lastDayOfMonth(year, month))}` };
}

/** The pay period right after `period`. */
export function nextPayPeriod(period: PayPeriod): PayPeriod {
  return payPeriodFor(calendarDateFromDayNumber((calendarDayNumber(period.end) as number) + 1));
}

export interface StatementLineInput {
  salespersonId: string;
  kind: CommissionLineKind;
  /** Dollars: positive for an earning, negative for a clawback. */
  amount: string;
  effectiveOn: IsoDate;
  /** Set once the line is on a statement (that statement's period start); the line then stays there. */
  periodStart?: IsoDate | null;
}

export interface ClosedStatementRef {
  salespersonId: string;
  /** The start of the closed (approved or paid) period. */
  periodStart: IsoDate;
}

export interface StatementOptions {
  /** Statements already approved or paid: no new line is placed in them. */
  closedPeriods?: readonly ClosedStatementRef[];
  /** Per salesperson: a negative carry (≤ 0) from before the first statement given here. */
  openingCarry?: Readonly<Record<string, string>>;
}

export interface CommissionStatement<T extends StatementLineInput = StatementLineInput> {
  salespersonId: string;
  period: PayPeriod;
  /** The input lines placed in this statement, in input order. */
  lines: T[];
  earned: string;
  clawedBack: string;
  total: string;
  carriedIn: string;
  net: string;
  payable: string;
  carriedOut: string;
}

function invalid(field: string, message: string): CommissionError {
  const issue: CommissionIssue = { code: 'COMMISSION.STATEMENT_INVALID', field, message };
  return new CommissionError([issue]);
}

/** The period a line belongs to under the placement rule above. */
export function statementPeriodForLine(
  line: Pick<StatementLineInput, 'salespersonId' | 'effectiveOn' | 'periodStart'>,
  closedPeriods: readonly ClosedStatementRef[] = [],
): PayPeriod {
  if (line.periodStart) {
    const p = payPeriodFor(line.periodStart);
    if (p.start !== line.periodStart)
      throw invalid('periodStart', `${line.periodStart} does not start a pay period.`);
    return p;
  }
  const closed = new Set(
    closedPeriods.filter((c) => c.salespersonId === line.salespersonId).map((c) => c.periodStart),
  );
  let period = payPeriodFor(line.effectiveOn);
  while (closed.has(period.start)) period = nextPayPeriod(period);
  return period;
}

/**
 * Commission statements: one per salesperson per pay period that has lines, ordered by salesperson id
 * then period, each with its totals and the carry-forward of a negative balance (rule above).
 */
export function statementLines<T extends StatementLineInput>(
  lines: readonly T[],
  options: StatementOptions = {},
): CommissionStatement<T>[] {
  const closed = options.closedPeriods ?? [];
  const groups = new Map<string, { salespersonId: string; period: PayPeriod; lines: T[] }>();
  lines.forEach((line, i) => {
    let amount: Money;
    try {
      amount = money(line.amount);
    } catch {
      throw invalid(`lines[${i}].amount`, `Not an amount: ${JSON.stringify(line.amount)}`);
    }
    if (line.kind === 'earning' ? amount.isNegative() : line.kind === 'clawback' ? amount.gt(0) : true) {
      throw invalid(`lines[${i}]`, 'An earning is 0 or more and a clawback 0 or less.');
    }
    const period = statementPeriodForLine(line, closed);
    const key = `${line.salespersonId}\u0000${period.start}`;
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { salespersonId: line.salespersonId, period, lines: [] }));
    g.lines.push(line);
  });
  for (const [sp, carry] of Object.entries(options.openingCarry ?? {})) {
    if (money(carry).gt(0)) throw invalid(`openingCarry.${sp}`, 'A carried balance is 0 or negative.');
  }

  const ordered = [...groups.values()].sort((a, b) =>
    a.salespersonId < b.salespersonId
      ? -1
      : a.salespersonId > b.salespersonId
        ? 1
        : a.period.start < b.period.start
          ? -1
          : a.period.start > b.period.start
            ? 1
            : 0,
  );
  const zero = new MoneyDecimal(0);
  const carry = new Map<string, Money>();
  return ordered.map((g) => {
    const earned = g.lines
      .filter((l) => l.kind === 'earning')
      .reduce<Money>((a, l) => a.plus(money(l.amount)), zero);
    const clawedBack = g.lines
      .filter((l) => l.kind === 'clawback')
      .reduce<Money>((a, l) => a.minus(money(l.amount)), zero);
    const carriedIn = carry.get(g.salespersonId) ?? money(options.openingCarry?.[g.salespersonId] ?? '0');
    const total = earned.minus(clawedBack);
    const net = carriedIn.plus(total);
    const carriedOut = MoneyDecimal.min(zero, net);
    carry.set(g.salespersonId, carriedOut);
    return {
      salespersonId: g.salespersonId,
      period: g.period,
      lines: g.lines,
      earned: earned.toFixed(2),
      clawedBack: clawedBack.toFixed(2),
      total: total.toFixed(2),
      carriedIn: carriedIn.toFixed(2),
      net: net.toFixed(2),
      payable: MoneyDecimal.max(zero, net).toFixed(2),
      carriedOut: carriedOut.toFixed(2),
    };
  });
}
