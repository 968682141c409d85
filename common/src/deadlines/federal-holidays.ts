// US federal holidays, 5 U.S.C. 6103(a) (published), from the date-holidays package.
//
// date-holidays 3.37 ('US', no state) lists more than the federal holidays (Valentine's Day, Easter,
// Election Day, the day after Thanksgiving, Christmas Eve, ...), with types public / bank / optional /
// observance. We keep the eleven federal ones by name, whatever their type: the package marks the
// substitute for a Saturday Veterans Day as 'bank', not 'public' (seen for 2028-11-10), so filtering
// on type would lose it. The names below were checked against the package's output (language 'en-us')
// for 2000–2101. A year in which one of them is missing is an error, not a silent gap.
import Holidays from 'date-holidays';
import { IsoDate } from './calendar-date';
import { HolidayCalendar, HolidayMark } from './holiday-calendar';

/** The package's names for the holidays of 5 U.S.C. 6103(a), in calendar order. */
export const FEDERAL_HOLIDAY_NAMES = [
  "New Year's Day",
  'Martin Luther King Jr. Day', // "Birthday of Martin Luther King, Jr." in 5 U.S.C. 6103(a)
  "Washington's Birthday",
  'Memorial Day',
  'Juneteenth', // "Juneteenth National Independence Day", a federal holiday since 2021
  'Independence Day',
  'Labor Day',
  'Columbus Day',
  'Veterans Day',
  'Thanksgiving Day',
  'Christmas Day',
] as const;
export type FederalHolidayName = (typeof FEDERAL_HOLIDAY_NAMES)[number];

const FEDERAL_NAME_SET: ReadonlySet<string> = new Set(FEDERAL_HOLIDAY_NAMES);

export const federalHolidayCalendar = new HolidayCalendar({
  create: () => new Holidays('US'),
  accept: (name) => (FEDERAL_NAME_SET.has(name) ? name : null),
  expectedNames: (year) => FEDERAL_HOLIDAY_NAMES.filter((name) => name !== 'Juneteenth' || year >= 2021),
  addObservedWeekdays: true,
  language: 'en-us', // 'en' would name the first Monday in September "Labour Day"
});

/** Federal holidays (their own dates and their observed weekdays) from `from` to `to`, both included. */
export function federalHolidaysBetween(from: IsoDate, to: IsoDate): HolidayMark[] {
  return federalHolidayCalendar.marksBetween(from, to);
}

/** The federal holiday marks on one date; empty when it is not a federal holiday nor an observed one. */
export function federalHolidaysOn(date: IsoDate): HolidayMark[] {
  return federalHolidayCalendar.marksOn(date);
}
