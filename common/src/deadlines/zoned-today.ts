// "Today" where the house is: the calendar date on the clocks of a branch's IANA time zone.
//
// A contract is dated by the day the buyer signed (16 CFR 429.1(a): "the date of this transaction"), and
// the buyer may cancel until midnight at the end of the last day. Both are days on the local clock, not
// in UTC: a contract signed at 22:30 in New York on 2 July is dated 2 July, although it is already 3 July
// in UTC. Every "today" of the signing feature goes through these functions, so a test can pass `now`.
import { utcToZonedLocal, zonedLocalToUtc } from '../inspections/local-time';
import { addCalendarDays, type IsoDate } from './calendar-date';

/** The date ('YYYY-MM-DD') on the clocks of `timeZone` at the instant `now` (default: this moment). */
export function todayInZone(timeZone: string, now: Date = new Date()): IsoDate {
  return utcToZonedLocal(now, timeZone).local.slice(0, 10);
}

/**
 * The instant at which `date` ends in `timeZone`: midnight at the start of the next day, ISO-8601 UTC.
 * Where a zone's clocks jump over midnight (no US zone does), the first instant of the next day is taken.
 */
export function endOfDayInZone(date: IsoDate, timeZone: string): string {
  const next = addCalendarDays(date, 1);
  const midnight = zonedLocalToUtc(`${next}T00:00`, timeZone);
  if (midnight.ok) return midnight.utc;
  const oneAm = zonedLocalToUtc(`${next}T01:00`, timeZone);
  if (oneAm.ok) return new Date(Date.parse(oneAm.utc) - 3_600_000).toISOString();
  throw new RangeError(`No end of ${date} in ${timeZone}: ${midnight.message}`);
}

/**
 * Is the buyer still inside the cancellation window? True through the whole of `lastDayToCancel` on the
 * branch's clock (the window closes at midnight at its end), false from the next day on.
 */
export function cancellationWindowOpen(p: {
  lastDayToCancel: IsoDate;
  timeZone: string;
  now?: Date;
}): boolean {
  return todayInZone(p.timeZone, p.now) <= p.lastDayToCancel;
}
