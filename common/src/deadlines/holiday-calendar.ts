// A set of holidays, computed by the date-holidays package and held as plain calendar dates.
//
// For each holiday we keep its own date ("actual") and, when it falls on a weekend, the weekday on
// which it is observed ("observed": Saturday → Friday before, Sunday → Monday after). Observed days
// come from two places, merged: the package's own substitute days, and the weekend rule applied to
// the actual date. The tests check that the two agree; merging means a gap in either can only add a
// day off, never remove one.
import Holidays from 'date-holidays';
import { IsoDate, calendarDayNumber, calendarYear, weekendObservedDate } from './calendar-date';

export type HolidayKind = 'actual' | 'observed';

export interface HolidayMark {
  date: IsoDate;
  name: string;
  kind: HolidayKind;
}

export interface HolidayCalendarSpec {
  /** Build the date-holidays instance (called once, on first use). */
  create: () => Holidays;
  /** Map a package holiday name to the name we use, or null to ignore that holiday. */
  accept: (packageName: string) => string | null;
  /** Names that must be present in a year; a missing one is an error, not a silent gap. */
  expectedNames: (year: number) => readonly string[];
  /** Whether to add the weekday on which a weekend holiday is observed. */
  addObservedWeekdays: boolean;
  /**
   * Language of the names, passed to getHolidays. It matters: for 'US', 'en-us' gives "Labor Day" and
   * 'en' gives "Labour Day".
   */
  language: string;
}

const SUBSTITUTE_SUFFIX = ' (substitute day)';

export class HolidayCalendar {
  private instance: Holidays | undefined;
  private readonly byYear = new Map<number, HolidayMark[]>();

  constructor(private readonly spec: HolidayCalendarSpec) {}

  /** Every mark that the holidays of `year` produce (an observed day may fall in the year before or after). */
  marksOfYear(year: number): HolidayMark[] {
    const cached = this.byYear.get(year);
    if (cached) return cached;
    this.instance ??= this.spec.create();
    const marks: HolidayMark[] = [];
    const add = (mark: HolidayMark) => {
      if (!marks.some((m) => m.date === mark.date && m.name === mark.name && m.kind === mark.kind))
        marks.push(mark);
    };
    for (const holiday of this.instance.getHolidays(year, this.spec.language)) {
      const isSubstitute = holiday.substitute === true || holiday.name.endsWith(SUBSTITUTE_SUFFIX);
      const baseName = holiday.name.endsWith(SUBSTITUTE_SUFFIX)
        ? holiday.name.slice(0, -SUBSTITUTE_SUFFIX.length)
        : holiday.name;
      const name = this.spec.accept(baseName);
      if (name === null) continue;
      const date = holiday.date.slice(0, 10);
      if (calendarDayNumber(date) === null)
        throw new Error(`date-holidays returned an unreadable date: ${holiday.date}`);
      if (isSubstitute) {
        if (this.spec.addObservedWeekdays) add({ date, name, kind: 'observed' });
        continue;
      }
      add({ date, name, kind: 'actual' });
      const observed = this.spec.addObservedWeekdays ? weekendObservedDate(date) : null;
      if (observed) add({ date: observed, name, kind: 'observed' });
    }
    for (const expected of this.spec.expectedNames(year)) {
      if (!marks.some((m) => m.kind === 'actual' && m.name === expected && calendarYear(m.date) === year)) {
        throw new Error(
          `Holiday data is incomplete: no "${expected}" found for ${year}. Check the date-holidays package.`,
        );
      }
    }
    marks.sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));
    this.byYear.set(year, marks);
    return marks;
  }

  /** The marks on one date (empty when it is an ordinary day). */
  marksOn(date: IsoDate): HolidayMark[] {
    const year = calendarYear(date);
    return this.marksBetween(date, date, [year - 1, year, year + 1]);
  }

  /** The marks from `from` to `to`, both included, in date order, each once. */
  marksBetween(from: IsoDate, to: IsoDate, years?: number[]): HolidayMark[] {
    const span: number[] = years ?? [];
    if (!years) for (let y = calendarYear(from) - 1; y <= calendarYear(to) + 1; y++) span.push(y);
    // A weekend holiday near New Year can be produced by two years' lists (2028-01-01 gives 2027-12-31).
    const unique = new Map<string, HolidayMark>();
    for (const mark of span.flatMap((y) => this.marksOfYear(y))) {
      if (mark.date >= from && mark.date <= to) unique.set(`${mark.date}|${mark.kind}|${mark.name}`, mark);
    }
    return [...unique.values()].sort((a, b) =>
      a.date !== b.date
        ? a.date < b.date
          ? -1
          : 1
        : a.name !== b.name
          ? a.name < b.name
            ? -1
            : 1
          : a.kind < b.kind
            ? -1
            : 1,
    );
  }
}

/** Words for why a day is skipped, e.g. "Independence Day (observed)". */
export function describeHolidayMarks(marks: readonly HolidayMark[]): string[] {
  return marks.map((m) => (m.kind === 'observed' ? `${m.name} (observed)` : m.name));
}
