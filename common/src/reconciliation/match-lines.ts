// Matching ledger-side lines (processor payouts, commission payments) to bank lines.
//
// THE RULE (one-to-one; each line is in at most one match):
//   1. A pair has exactly the same amount in integer cents and dates at most `windowDays` calendar days
//      apart (either way).
//   2. Closest dates first: every pair 0 days apart is settled before any pair 1 day apart, and so on.
//   3. At the same distance, a bank line dated AFTER the ledger line is preferred to one dated before it
//      (money reaches the bank after the payout is sent; common practice).
//   4. Then input order: among the remaining ledger lines of one amount and date, the first given takes
//      the first given remaining bank line of the counterpart date.
// This equals the greedy over all candidate pairs sorted by (distance, bank-before-ledger, ledger index,
// bank index) — the test checks it against that brute force — so the result is deterministic and does
// not depend on how the inputs were grouped.
//
// COST: lines are bucketed by amount (a Map on the cents string), each bucket's lines sorted by date, and
// candidate pairs are formed only between date groups of one bucket that lie within the window. Lines
// with a unique amount are settled with one comparison. O(n log n) for n lines plus the candidate group
// pairs (≤ (2 × windowDays + 1) per ledger date group), not O(n²).
import { calendarDayNumber, type IsoDate } from '../deadlines/calendar-date';
import { centsKey, type CentsInput } from './cents';
import { ReconciliationError } from './errors';

export interface MatchableLine {
  id: string;
  /** Integer cents, signed: a bigint or a string of digits ("123456", "-1200"). */
  amountCents: CentsInput;
  /** 'YYYY-MM-DD'. */
  date: IsoDate;
}

export interface MatchOptions {
  /** Largest allowed distance between the two dates, whole calendar days, 0–366. */
  windowDays: number;
}

export interface LineMatch<L extends MatchableLine, B extends MatchableLine> {
  ledger: L;
  bank: B;
  /** The common amount, canonical integer cents. */
  amountCents: string;
  /** Bank date − ledger date, in days (positive: the bank line is later). */
  daysApart: number;
}

export interface MatchLinesResult<L extends MatchableLine, B extends MatchableLine> {
  /** In ledger input order. */
  matches: LineMatch<L, B>[];
  /** In input order. */
  unmatchedLedger: L[];
  unmatchedBank: B[];
}

export const MAX_MATCH_WINDOW_DAYS = 366;

interface Bucket {
  key: string;
  ledger: number[];
  bank: number[];
}

interface DateGroup {
  day: number;
  /** Positions [next, end) in the bucket's date-sorted index list; `next` advances as lines are matched. */
  next: number;
  end: number;
}

function groupByDay(indexes: number[], days: Int32Array): DateGroup[] {
  // Stable: equal days keep input order.
  indexes.sort((a, b) => (days[a] as number) - (days[b] as number) || a - b);
  const groups: DateGroup[] = [];
  for (let p = 0; p < indexes.length; p++) {
    const day = days[indexes[p] as number] as number;
    const last = groups[groups.length - 1];
    if (last && last.day === day) last.end = p + 1;
    else groups.push({ day, next: p, end: p + 1 });
  }
  return groups;
}

/**
 * Match ledger-side lines to bank lines by amount and date window under the rule above. Throws
 * ReconciliationError on a malformed window, amount or date.
 */
export function matchLines<L extends MatchableLine, B extends MatchableLine>(
  ledgerSide: readonly L[],
  bankSide: readonly B[],
  options: MatchOptions,
): MatchLinesResult<L, B> {
  const window = options.windowDays;
  if (!Number.isInteger(window) || window < 0 || window > MAX_MATCH_WINDOW_DAYS) {
    throw new ReconciliationError(
      'RECONCILIATION.INVALID_WINDOW',
      'windowDays',
      `The window is a whole number of days from 0 to ${MAX_MATCH_WINDOW_DAYS}.`,
    );
  }
  const dayCache = new Map<string, number>();
  const buckets = new Map<string, Bucket>();
  const read = (side: 'ledgerSide' | 'bankSide', lines: readonly MatchableLine[], days: Int32Array): void => {
    for (let i = 0; i < lines.length; i++) {
      const line = lines[i] as MatchableLine;
      const key = centsKey(line.amountCents);
      if (key === null) {
        throw new ReconciliationError(
          'RECONCILIATION.INVALID_LINE',
          `${side}[${i}].amountCents`,
          `Line ${line.id}: the amount must be integer cents (a bigint or a string of digits).`,
        );
      }
      let day = dayCache.get(line.date);
      if (day === undefined) {
        const n = typeof line.date === 'string' ? calendarDayNumber(line.date) : null;
        if (n === null) {
          throw new ReconciliationError(
            'RECONCILIATION.INVALID_LINE',
            `${side}[${i}].date`,
            `Line ${line.id}: the date must be written YYYY-MM-DD.`,
          );
        }
        dayCache.set(line.date, n);
        day = n;
      }
      days[i] = day;
      let bucket = buckets.get(key);
      if (!bucket) buckets.set(key, (bucket = { key, ledger: [], bank: [] }));
      (side === 'ledgerSide' ? bucket.ledger : bucket.bank).push(i);
    }
  };
  const ledgerDays = new Int32Array(ledgerSide.length);
  const bankDays = new Int32Array(bankSide.length);
  read('ledgerSide', ledgerSide, ledgerDays);
  read('bankSide', bankSide, bankDays);

  const bankOf = new Int32Array(ledgerSide.length).fill(-1);
  const ledgerOf = new Int32Array(bankSide.length).fill(-1);
  const keyOf: string[] = new Array<string>(ledgerSide.length);
  const pair = (l: number, b: number, key: string) => {
    bankOf[l] = b;
    ledgerOf[b] = l;
    keyOf[l] = key;
  };

  for (const bucket of buckets.values()) {
    const { ledger, bank, key } = bucket;
    if (ledger.length === 0 || bank.length === 0) continue;
    if (ledger.length === 1 && bank.length === 1) {
      const l = ledger[0] as number;
      const b = bank[0] as number;
      if (Math.abs((bankDays[b] as number) - (ledgerDays[l] as number)) <= window) pair(l, b, key);
      continue;
    }
    const lGroups = groupByDay(ledger, ledgerDays);
    const bGroups = groupByDay(bank, bankDays);
    // Candidate date-group pairs within the window, ranked (distance, bank-before-ledger).
    const candidates: { rank: number; lg: DateGroup; bg: DateGroup }[] = [];
    let lo = 0;
    for (const lg of lGroups) {
      while (lo < bGroups.length && (bGroups[lo] as DateGroup).day < lg.day - window) lo++;
      for (let j = lo; j < bGroups.length; j++) {
        const bg = bGroups[j] as DateGroup;
        const delta = bg.day - lg.day;
        if (delta > window) break;
        candidates.push({ rank: Math.abs(delta) * 2 + (delta < 0 ? 1 : 0), lg, bg });
      }
    }
    // Pairs of equal rank never share a date group, so their order among themselves does not matter;
    // the sort is stable anyway (ledger date order).
    candidates.sort((a, b) => a.rank - b.rank);
    for (const { lg, bg } of candidates) {
      while (lg.next < lg.end && bg.next < bg.end) {
        pair(ledger[lg.next] as number, bank[bg.next] as number, key);
        lg.next++;
        bg.next++;
      }
    }
  }

  const matches: LineMatch<L, B>[] = [];
  const unmatchedLedger: L[] = [];
  const unmatchedBank: B[] = [];
  for (let l = 0; l < ledgerSide.length; l++) {
    const b = bankOf[l] as number;
    if (b < 0) unmatchedLedger.push(ledgerSide[l] as L);
    else
      matches.push({
        ledger: ledgerSide[l] as L,
        bank: bankSide[b] as B,
        amountCents: keyOf[l] as string,
        daysApart: (bankDays[b] as number) - (ledgerDays[l] as number),
      });
  }
  for (let b = 0; b < bankSide.length; b++)
    if ((ledgerOf[b] as number) < 0) unmatchedBank.push(bankSide[b] as B);
  return { matches, unmatchedLedger, unmatchedBank };
}
