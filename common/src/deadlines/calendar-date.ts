// Plain calendar dates written 'YYYY-MM-DD'. No time of day and no time zone: a date is a day
// number (days since 1970-01-01) computed with UTC, so the machine's zone can never shift it.
import { InputCollector } from '../calculators/input';

export type IsoDate = string;

/** Dates outside these years are refused: the holiday rules here are checked for recent years only. */
export const DEADLINE_MIN_YEAR = 2000;
export const DEADLINE_MAX_YEAR = 2100;

export const WEEKDAY_NAMES = [
  'Sunday',
  'Monday',
  'Tuesday',
  'Wednesday',
  'Thursday',
  'Friday',
  'Saturday',
] as const;

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const MS_PER_DAY = 86_400_000;

/** The day number of a valid 'YYYY-MM-DD', or null when it is not a real calendar date. */
export function calendarDayNumber(value: string): number | null {
  const match = ISO_DATE.exec(value);
  if (!match) return null;
  const year = Number(match[1]);
  const month = Number(match[2]);
  const day = Number(match[3]);
  const ms = Date.UTC(year, month - 1, day);
  const check = new Date(ms);
  if (check.getUTCFullYear() !== year || check.getUTCMonth() !== month - 1 || check.getUTCDate() !== day)
    return null;
  return ms / MS_PER_DAY;
}

export function calendarDateFromDayNumber(dayNumber: number): IsoDate {
  return new Date(dayNumber * MS_PER_DAY).toISOString().slice(0, 10);
}

export function addCalendarDays(date: IsoDate, days: number): IsoDate {
  return calendarDateFromDayNumber(requireDayNumber(date) + days);
}

/** 0 = Sunday … 6 = Saturday. */
export function calendarWeekday(date: IsoDate): number {
  return new Date(requireDayNumber(date) * MS_PER_DAY).getUTCDay();
}

export function calendarYear(date: IsoDate): number {
  return Number(date.slice(0, 4));
}

/**
 * The weekday on which a holiday that falls on a weekend is observed: Saturday → the Friday before,
 * Sunday → the Monday after (the federal practice of Executive Order 11582 / OPM). null on a weekday.
 */
export function weekendObservedDate(date: IsoDate): IsoDate | null {
  const weekday = calendarWeekday(date);
  if (weekday === 6) return addCalendarDays(date, -1);
  if (weekday === 0) return addCalendarDays(date, 1);
  return null;
}

/** Read a required 'YYYY-MM-DD' field; records a problem and returns undefined when invalid. */
export function readCalendarDate(
  v: InputCollector,
  field: string,
  label: string,
  value: unknown,
): IsoDate | undefined {
  if (value === undefined || value === null) {
    v.add(field, `${label} is required.`);
    return undefined;
  }
  if (typeof value !== 'string' || !ISO_DATE.test(value)) {
    v.add(field, `${label} must be a date written YYYY-MM-DD, such as "2026-07-02".`);
    return undefined;
  }
  if (calendarDayNumber(value) === null) {
    v.add(field, `${label} "${value}" is not a real calendar date.`);
    return undefined;
  }
  const year = calendarYear(value);
  if (year < DEADLINE_MIN_YEAR || year > DEADLINE_MAX_YEAR) {
    v.add(field, `${label} must be between ${DEADLINE_MIN_YEAR} and ${DEADLINE_MAX_YEAR}.`);
    return undefined;
  }
  return value;
}

function requireDayNumber(date: IsoDate): number {
  const n = calendarDayNumber(date);
  if (n === null) throw new Error(`not a calendar date: ${date}`);
  return n;
}
