// The rules of a field job (issue #4): when it may start, the due dates it must keep, and crews booked
// twice. Plain calendar dates ('YYYY-MM-DD', the branch's own calendar) in and out; no clock is read
// here — callers pass "today" from the server's Clock.
import { money } from '../money';
import { addCalendarDays, calendarDayNumber, type IsoDate } from '../deadlines/calendar-date';
import { depositRules } from '../deadlines/deposit-rules';
import { findStateRulePack } from '../deadlines/state-packs';
import type { JobClock, StartBlocker } from './api-types';

/** A clock turns "due soon" this many days before its last day (common practice: a working week's notice). */
export const DUE_SOON_DAYS = 7;

/**
 * How long an 811 locate ticket stays good, by state, in calendar days from the day it was filed.
 * Florida: 30 calendar days (F.S. 556.105 — memory; check the current statute and the one-call centre's
 * rules). A state missing here has no default: the expiry must be typed from the ticket.
 */
export const LOCATE_TICKET_VALID_DAYS: Readonly<Record<string, { days: number; source: string }>> = {
  FL: {
    days: 30,
    source:
      'F.S. 556.105: a locate ticket is good for 30 calendar days from its filing (memory; check the ticket)',
  },
};

/** The ticket's default expiry under the state's rule, or null when Loambook has none for the state. */
export function defaultLocateExpiry(
  state: string,
  filedOn: IsoDate,
): { expiresOn: IsoDate; source: string } | null {
  const rule = Object.prototype.hasOwnProperty.call(LOCATE_TICKET_VALID_DAYS, state)
    ? LOCATE_TICKET_VALID_DAYS[state]
    : undefined;
  return rule ? { expiresOn: addCalendarDays(filedOn, rule.days), source: rule.source } : null;
}

/** Whole calendar days from `from` to `to` (negative when `to` is earlier). */
export function daysBetween(from: IsoDate, to: IsoDate): number {
  const a = calendarDayNumber(from);
  const b = calendarDayNumber(to);
  if (a === null || b === null) throw new Error(`not a calendar date: ${a === null ? from : to}`);
  return b - a;
}

/** The last day of a run of `durationDays` consecutive calendar days starting on `startOn`. */
export function jobEndOn(startOn: IsoDate, durationDays: number): IsoDate {
  return addCalendarDays(startOn, Math.max(1, durationDays) - 1);
}

// ---- may it start? --------------------------------------------------------------------------------

export const JOB_BLOCKER_CODES = {
  window: 'JOB.INSIDE_CANCELLATION_WINDOW',
  digDate: 'JOB.BEFORE_DIG_DATE',
  noTicket: 'JOB.NO_LOCATE_TICKET',
  expired: 'JOB.LOCATE_EXPIRED',
  deposit: 'JOB.DEPOSIT_NOT_RECEIVED',
} as const;

export interface StartBlockersInput {
  /** The day the work would start. */
  day: IsoDate;
  /** 'schedule': the rules for putting a start day on the calendar (the window and the dig date);
   *  'start': everything, as when the crew starts the work. */
  purpose: 'schedule' | 'start';
  lastDayToCancel: IsoDate;
  /** The homeowner waived the window for a bona fide emergency (16 CFR 429.1(e)). */
  windowWaived: boolean;
  locate: { ticketNumber: string | null; earliestDigOn: IsoDate | null; expiresOn: IsoDate | null };
  /** Deposit the contract asks for (decimal string); "0.00" when none. */
  depositAmount: string;
  depositReceived: boolean;
}

/**
 * Why the job cannot start on `day`, each with its code (the 409s of POST /jobs/:id/start and PUT
 * /jobs/:id/schedule). Empty: it may.
 *  - 16 CFR 429.1: the buyer may cancel until midnight of the third business day; no work before the
 *    day after the last day to cancel unless the buyer waived the right for a bona fide emergency
 *    (429.1(e): a separate, dated and signed statement in the buyer's own words). The default is to wait.
 *  - The 811 ticket: no digging before its earliest dig date (F.S. 556.105(1)(a) in Florida), nor on a
 *    ticket that has expired; starting needs a ticket on file.
 *  - The deposit the contract asks for has been received (a contract asking none needs nothing).
 */
export function startBlockers(i: StartBlockersInput): StartBlocker[] {
  const out: StartBlocker[] = [];
  if (!i.windowWaived && i.day <= i.lastDayToCancel) {
    out.push({
      code: JOB_BLOCKER_CODES.window,
      message:
        `The homeowner may cancel until midnight at the end of ${i.lastDayToCancel} (16 CFR 429.1(a)): ` +
        `work may start on ${addCalendarDays(i.lastDayToCancel, 1)} at the earliest, unless the homeowner waives the ` +
        'right for a bona fide emergency in a separate signed and dated statement in their own words (16 CFR 429.1(e)).',
    });
  }
  const ticket = i.locate.ticketNumber?.trim() ? i.locate : null;
  if (!ticket) {
    if (i.purpose === 'start') {
      out.push({
        code: JOB_BLOCKER_CODES.noTicket,
        message:
          'No 811 locate ticket is on file: call 811, record the ticket and wait for the marks before digging.',
      });
    }
  } else {
    if (ticket.earliestDigOn && i.day < ticket.earliestDigOn) {
      out.push({
        code: JOB_BLOCKER_CODES.digDate,
        message:
          `The 811 ticket ${ticket.ticketNumber} allows digging from ${ticket.earliestDigOn}: the utilities have until ` +
          'then to mark their lines.',
      });
    }
    if (i.purpose === 'start' && ticket.expiresOn && i.day > ticket.expiresOn) {
      out.push({
        code: JOB_BLOCKER_CODES.expired,
        message: `The 811 ticket ${ticket.ticketNumber} expired on ${ticket.expiresOn}: file a new ticket and wait again.`,
      });
    }
  }
  if (i.purpose === 'start' && money(i.depositAmount).greaterThan(0) && !i.depositReceived) {
    out.push({
      code: JOB_BLOCKER_CODES.deposit,
      message: 'The deposit the contract asks for has not been received.',
    });
  }
  return out;
}

// ---- clocks ---------------------------------------------------------------------------------------

export interface JobClocksInput {
  today: IsoDate;
  state: string;
  contractPrice: string;
  depositAmount: string;
  /** The day the deposit (the initial payment) was received, on the branch's calendar. */
  depositReceivedOn: IsoDate | null;
  lastDayToCancel: IsoDate;
  windowWaived: boolean;
  permit: { needed: boolean | null; appliedOn: IsoDate | null; issuedOn: IsoDate | null };
  locate: { ticketNumber: string | null; expiresOn: IsoDate | null };
  /** The day work started, if it has. */
  startedOn: IsoDate | null;
}

/**
 * A clock's state on `today`: done by its last day → met, done after it → overdue (daysLeft fixed on the
 * day it was done, negative); not done → by the days left (0 on the last day itself, still in time).
 */
export function clockState(
  today: IsoDate,
  dueOn: IsoDate | null,
  doneOn: IsoDate | null,
): { state: JobClock['state']; daysLeft: number | null; doneOn: IsoDate | null } {
  if (dueOn === null) return { state: doneOn ? 'met' : 'not_started', daysLeft: null, doneOn };
  if (doneOn) {
    return { state: doneOn <= dueOn ? 'met' : 'overdue', daysLeft: daysBetween(doneOn, dueOn), doneOn };
  }
  const daysLeft = daysBetween(today, dueOn);
  if (daysLeft < 0) return { state: 'overdue', daysLeft, doneOn: null };
  return { state: daysLeft <= DUE_SOON_DAYS ? 'due_soon' : 'running', daysLeft, doneOn: null };
}

/**
 * The due dates the job must keep, with their state on `today`:
 *  - FTC_429_WINDOW: the homeowner's cancellation window (16 CFR 429.1(a)) — running while open, met once
 *    closed or waived; it is a wait, never "overdue".
 *  - FL_489_126_PERMIT / FL_489_126_START (Florida pack, F.S. 489.126(2)(a)): after an initial payment of
 *    MORE than 10% of the contract price, apply for the permits within 30 days after the payment and start
 *    the work within 90 days after the permits are issued. Not listed when the payment is 10% or less, nor
 *    the permit clock when the job needs no permit. The statute's exceptions (just cause, the owner's
 *    written agreement to a longer period) are for the office to record: the clock does not know them.
 *  - LOCATE_EXPIRY: the 811 ticket must still be good on the day the work starts.
 * "Due soon" from DUE_SOON_DAYS days before the last day (common practice); "overdue" from the day after.
 */
export function jobClocks(i: JobClocksInput): JobClock[] {
  const clocks: JobClock[] = [];
  const windowDone = i.windowWaived || i.today > i.lastDayToCancel;
  clocks.push({
    code: 'FTC_429_WINDOW',
    title: i.windowWaived ? 'Cancellation window (waived by the homeowner)' : 'Cancellation window closes',
    dueOn: i.lastDayToCancel,
    state: windowDone ? 'met' : 'running',
    daysLeft: windowDone ? null : daysBetween(i.today, i.lastDayToCancel),
    source: i.windowWaived ? '16 CFR 429.1(e)' : '16 CFR 429.1(a)',
  });

  const pack = findStateRulePack(i.state);
  if (pack?.contract) {
    const rules = depositRules({
      state: i.state,
      contractPrice: i.contractPrice,
      deposit: i.depositAmount,
      ...(i.depositReceivedOn ? { paidOn: i.depositReceivedOn } : {}),
      ...(i.permit.issuedOn ? { permitIssuedOn: i.permit.issuedOn } : {}),
    });
    // Before the deposit is in, the permit clock has not started (the statute counts from the payment).
    const permitClock = rules.clocks.find((c) => c.code === 'FL_489_126_PERMIT');
    if (permitClock && i.permit.needed !== false) {
      const dueOn = permitClock.dueOn ?? null;
      clocks.push({
        code: permitClock.code,
        title: 'Apply for the permits',
        dueOn,
        ...clockState(i.today, dueOn, i.permit.appliedOn),
        source: permitClock.source,
      });
    }
    const startClock = rules.clocks.find((c) => c.code === 'FL_489_126_START');
    if (startClock && i.permit.needed !== false) {
      const dueOn = startClock.dueOn ?? null;
      clocks.push({
        code: startClock.code,
        title: 'Start the work (after the permits are issued)',
        dueOn,
        ...clockState(i.today, dueOn, i.startedOn),
        source: startClock.source,
      });
    }
  }

  if (i.locate.ticketNumber?.trim()) {
    const dueOn = i.locate.expiresOn;
    clocks.push({
      code: 'LOCATE_EXPIRY',
      title: `811 ticket ${i.locate.ticketNumber} expires`,
      dueOn,
      ...clockState(i.today, dueOn, i.startedOn),
      source: 'The one-call ticket (state one-call law)',
    });
  }
  return clocks;
}

/** The worst clock still to keep (clocks met or done late no longer count), for lists. */
export function jobRisk(clocks: readonly JobClock[]): 'none' | 'due_soon' | 'overdue' {
  const open = clocks.filter((c) => !c.doneOn);
  if (open.some((c) => c.state === 'overdue')) return 'overdue';
  return open.some((c) => c.state === 'due_soon') ? 'due_soon' : 'none';
}

// ---- crews booked twice ---------------------------------------------------------------------------

export interface ScheduledRun {
  id: string;
  crewId: string | null;
  startOn: IsoDate | null;
  durationDays: number;
}

/**
 * For each job, the other jobs of the same crew whose days overlap its own (runs of consecutive calendar
 * days, start and end included). Jobs without a crew or a day are never in conflict. Flagged, not refused:
 * the office may book a crew twice on purpose (a half day at each house).
 */
export function scheduleConflicts(runs: readonly ScheduledRun[]): Map<string, string[]> {
  const out = new Map<string, string[]>();
  const byCrew = new Map<string, { id: string; from: number; to: number }[]>();
  for (const r of runs) {
    if (!r.crewId || !r.startOn) continue;
    const from = calendarDayNumber(r.startOn);
    if (from === null) throw new Error(`not a calendar date: ${r.startOn}`);
    const list = byCrew.get(r.crewId) ?? [];
    list.push({ id: r.id, from, to: from + Math.max(1, r.durationDays) - 1 });
    byCrew.set(r.crewId, list);
  }
  for (const list of byCrew.values()) {
    for (const a of list) {
      const others = list.filter((b) => b.id !== a.id && a.from <= b.to && b.from <= a.to).map((b) => b.id);
      if (others.length) out.set(a.id, others);
    }
  }
  return out;
}
