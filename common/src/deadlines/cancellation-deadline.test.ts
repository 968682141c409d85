import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Holidays from 'date-holidays';
import { cancellationDeadline } from './cancellation-deadline';
import { federalHolidaysBetween, FEDERAL_HOLIDAY_NAMES } from './federal-holidays';
import { CalculatorInputError } from '../calculators/errors';

// ---------------------------------------------------------------------------------------------
// An independent hand computation of the federal holidays, 5 U.S.C. 6103(a) (published), with the
// weekend rule of Executive Order 11582 / OPM practice (published): Saturday → Friday before,
// Sunday → Monday after. Written from the statute, not from the date-holidays package.
// ---------------------------------------------------------------------------------------------
const DAY = 86_400_000;
const iso = (y: number, m: number, d: number) => new Date(Date.UTC(y, m - 1, d)).toISOString().slice(0, 10);
const weekdayOf = (date: string) => new Date(`${date}T00:00:00Z`).getUTCDay();
const shift = (date: string, days: number) =>
  new Date(Date.parse(`${date}T00:00:00Z`) + days * DAY).toISOString().slice(0, 10);
/** The n-th given weekday (0 = Sunday) of a month. */
const nth = (y: number, m: number, weekday: number, n: number) => {
  const first = weekdayOf(iso(y, m, 1));
  return iso(y, m, 1 + ((weekday - first + 7) % 7) + 7 * (n - 1));
};
/** The last given weekday of a month. */
const last = (y: number, m: number, weekday: number) => {
  const end = new Date(Date.UTC(y, m, 0)).getUTCDate();
  return iso(y, m, end - ((weekdayOf(iso(y, m, end)) - weekday + 7) % 7));
};
const MON = 1;
const THU = 4;
function handFederalHolidays(y: number): { name: string; date: string }[] {
  const list = [
    { name: "New Year's Day", date: iso(y, 1, 1) }, // January 1
    { name: 'Martin Luther King Jr. Day', date: nth(y, 1, MON, 3) }, // third Monday in January
    { name: "Washington's Birthday", date: nth(y, 2, MON, 3) }, // third Monday in February
    { name: 'Memorial Day', date: last(y, 5, MON) }, // last Monday in May
    { name: 'Juneteenth', date: iso(y, 6, 19) }, // June 19 (since 2021)
    { name: 'Independence Day', date: iso(y, 7, 4) }, // July 4
    { name: 'Labor Day', date: nth(y, 9, MON, 1) }, // first Monday in September
    { name: 'Columbus Day', date: nth(y, 10, MON, 2) }, // second Monday in October
    { name: 'Veterans Day', date: iso(y, 11, 11) }, // November 11
    { name: 'Thanksgiving Day', date: nth(y, 11, THU, 4) }, // fourth Thursday in November
    { name: 'Christmas Day', date: iso(y, 12, 25) }, // December 25
  ];
  return list.filter((h) => h.name !== 'Juneteenth' || y >= 2021);
}
const observedOf = (date: string) =>
  weekdayOf(date) === 6 ? shift(date, -1) : weekdayOf(date) === 0 ? shift(date, 1) : null;
/** Every date that is a federal holiday or the weekday on which one is observed, from the hand computation. */
function handFederalDates(fromYear: number, toYear: number): Set<string> {
  const dates = new Set<string>();
  for (let y = fromYear; y <= toYear; y++) {
    for (const h of handFederalHolidays(y)) {
      dates.add(h.date);
      const observed = observedOf(h.date);
      if (observed) dates.add(observed);
    }
  }
  return dates;
}

describe('the hand computation itself (5 U.S.C. 6103(a)), against dates worked out on a calendar', () => {
  it.each([
    // 5 U.S.C. 6103(a); worked out on a calendar for this test
    [2026, 'Thanksgiving Day', '2026-11-26'], // 4th Thursday of November
    [2026, 'Memorial Day', '2026-05-25'], // last Monday of May
    [2027, 'Memorial Day', '2027-05-31'],
    [2028, 'Martin Luther King Jr. Day', '2028-01-17'], // 3rd Monday of January
    [2028, 'Labor Day', '2028-09-04'], // 1st Monday of September
    [2027, 'Columbus Day', '2027-10-11'], // 2nd Monday of October
    [2028, "Washington's Birthday", '2028-02-21'], // 3rd Monday of February
  ])('%i %s is %s', (year, name, date) => {
    expect(handFederalHolidays(year).find((h) => h.name === name)?.date).toBe(date);
  });
});

describe('federal holidays from date-holidays match 5 U.S.C. 6103(a)', () => {
  it('the package names match our list of eleven', () => {
    expect(FEDERAL_HOLIDAY_NAMES).toHaveLength(11);
    const names = new Set(federalHolidaysBetween('2026-01-01', '2026-12-31').map((h) => h.name));
    expect([...names].sort()).toEqual([...FEDERAL_HOLIDAY_NAMES].sort());
  });

  it.each([2026, 2027, 2028])(
    '%i: the holidays themselves match the hand computation (5 U.S.C. 6103(a))',
    (year) => {
      const fromPackage = federalHolidaysBetween(`${year}-01-01`, `${year}-12-31`)
        .filter((h) => h.kind === 'actual')
        .map((h) => `${h.date} ${h.name}`);
      const byHand = handFederalHolidays(year).map((h) => `${h.date} ${h.name}`);
      expect(fromPackage.sort()).toEqual(byHand.sort());
    },
  );

  it.each([
    // observed weekdays, 5 U.S.C. 6103(a) with E.O. 11582: Saturday → Friday, Sunday → Monday
    ['2026-07-03', 'Independence Day'], // Sat 2026-07-04
    ['2027-06-18', 'Juneteenth'], // Sat 2027-06-19
    ['2027-07-05', 'Independence Day'], // Sun 2027-07-04
    ['2027-12-24', 'Christmas Day'], // Sat 2027-12-25
    ['2027-12-31', "New Year's Day"], // Sat 2028-01-01, observed in the year before
    ['2028-11-10', 'Veterans Day'], // Sat 2028-11-11 (the package types this one 'bank', not 'public')
  ])('%s is observed for %s', (date, name) => {
    expect(federalHolidaysBetween(date, date)).toContainEqual({ date, name, kind: 'observed' });
  });

  it('2026–2028: every date off (holiday or observed) matches the hand computation, and nothing else', () => {
    const fromPackage = new Set(federalHolidaysBetween('2026-01-01', '2028-12-31').map((h) => h.date));
    const byHand = [...handFederalDates(2025, 2029)].filter((d) => d >= '2026-01-01' && d <= '2028-12-31');
    expect([...fromPackage].sort()).toEqual(byHand.sort());
  });

  it("2021–2040: the package's substitute days are exactly the weekend rule applied to the holidays", () => {
    const fromPackage = new Set(federalHolidaysBetween('2021-01-01', '2040-12-31').map((h) => h.date));
    const byHand = [...handFederalDates(2020, 2041)].filter((d) => d >= '2021-01-01' && d <= '2040-12-31');
    expect([...fromPackage].sort()).toEqual(byHand.sort());
  });

  it('2021–2040: the raw package output alone (no weekend rule of ours) has each observed day, of type public or bank', () => {
    const raw = new Holidays('US');
    const substitutes = new Set<string>();
    const types = new Set<string>();
    for (let y = 2021; y <= 2040; y++) {
      for (const h of raw.getHolidays(y, 'en-us')) {
        const base = h.name.replace(/ \(substitute day\)$/, '');
        if (!(FEDERAL_HOLIDAY_NAMES as readonly string[]).includes(base) || !h.substitute) continue;
        substitutes.add(h.date.slice(0, 10));
        types.add(h.type);
      }
    }
    const byHand = new Set<string>();
    for (let y = 2021; y <= 2040; y++) {
      for (const h of handFederalHolidays(y)) {
        const observed = observedOf(h.date);
        if (observed) byHand.add(observed);
      }
    }
    expect([...substitutes].sort()).toEqual([...byHand].sort());
    expect([...types].sort()).toEqual(['bank', 'public']); // why we filter by name, not by type
  });

  it('leaves out holidays that are not federal (Easter, Election Day, day after Thanksgiving, Christmas Eve)', () => {
    expect(federalHolidaysBetween('2028-11-07', '2028-11-07')).toEqual([]); // Election Day 2028
    expect(federalHolidaysBetween('2026-11-27', '2026-11-27')).toEqual([]); // day after Thanksgiving
    expect(federalHolidaysBetween('2026-12-24', '2026-12-24')).toEqual([]); // Christmas Eve (Thursday)
    expect(federalHolidaysBetween('2026-04-05', '2026-04-05')).toEqual([]); // Easter Sunday
  });
});

describe('cancellationDeadline (16 CFR 429)', () => {
  it.each([
    // signedOn, lastDayToCancel, skipped
    // 16 CFR 429.1(a); REFERENCE-VALUES.md worked example: Fri 07-03 observed Independence Day, Sat 07-04, Sun skipped
    ['2026-07-02', '2026-07-08', ['2026-07-03', '2026-07-04', '2026-07-05']],
    // 16 CFR 429.1(a); REFERENCE-VALUES.md worked example: Sun 22 skipped; Mon, Tue, Wed count
    ['2026-11-21', '2026-11-25', ['2026-11-22']],
    // Our own, from the same rules (16 CFR 429.0 business day; 5 U.S.C. 6103(a)):
    ['2026-03-02', '2026-03-05', []], // ordinary week
    ['2026-03-06', '2026-03-10', ['2026-03-08']], // Saturday counts, Sunday does not
    ['2026-11-25', '2026-11-30', ['2026-11-26', '2026-11-29']], // Thanksgiving; the Friday after is a business day
    ['2026-11-26', '2026-11-30', ['2026-11-29']], // signed on Thanksgiving: the day of signing never counts
    ['2026-12-23', '2026-12-28', ['2026-12-25', '2026-12-27']], // Christmas on a Friday
    ['2027-12-22', '2027-12-28', ['2027-12-24', '2027-12-25', '2027-12-26']], // Christmas Sat: observed Fri 24 and Sat 25 both skipped
    ['2027-12-30', '2028-01-05', ['2027-12-31', '2028-01-01', '2028-01-02']], // Jan 1 2028 is a Saturday: Dec 31 observed
    ['2027-06-17', '2027-06-23', ['2027-06-18', '2027-06-19', '2027-06-20']], // Juneteenth on a Saturday
    ['2027-07-02', '2027-07-07', ['2027-07-04', '2027-07-05']], // Independence Day Sunday, observed Monday
    ['2028-11-09', '2028-11-15', ['2028-11-10', '2028-11-11', '2028-11-12']], // Veterans Day Saturday
    ['2026-01-16', '2026-01-21', ['2026-01-18', '2026-01-19']], // MLK Day
    ['2026-10-10', '2026-10-15', ['2026-10-11', '2026-10-12']], // signed Saturday; Sunday, then Columbus Day Monday
  ])('signed %s → cancel until midnight at the end of %s', (signedOn, lastDayToCancel, skipped) => {
    const result = cancellationDeadline({ signedOn });
    expect(result.lastDayToCancel).toBe(lastDayToCancel);
    expect(result.skipped.map((s) => s.date)).toEqual(skipped);
    expect(result.businessDaysCounted).toHaveLength(3);
    expect(result.businessDaysCounted.at(-1)).toBe(lastDayToCancel);
  });

  it('says why each day was skipped', () => {
    const result = cancellationDeadline({ signedOn: '2026-07-02' });
    expect(result.skipped).toEqual([
      { date: '2026-07-03', reason: 'federal holiday: Independence Day (observed)' },
      { date: '2026-07-04', reason: 'federal holiday: Independence Day' },
      { date: '2026-07-05', reason: 'Sunday' },
    ]);
    expect(result.businessDaysCounted).toEqual(['2026-07-06', '2026-07-07', '2026-07-08']);
    expect(result.lastDayWeekday).toBe('Wednesday');
    expect(result.source).toContain('16 CFR 429.1(a)');
  });

  it('names a day once even when two years of holiday data produce it (Sat 2028-01-01 observed Fri 2027-12-31)', () => {
    expect(cancellationDeadline({ signedOn: '2027-12-30' }).skipped).toEqual([
      { date: '2027-12-31', reason: "federal holiday: New Year's Day (observed)" },
      { date: '2028-01-01', reason: "federal holiday: New Year's Day" },
      { date: '2028-01-02', reason: 'Sunday' },
    ]);
    expect(federalHolidaysBetween('2027-12-31', '2027-12-31')).toEqual([
      { date: '2027-12-31', name: "New Year's Day", kind: 'observed' },
    ]);
  });

  it.each([
    [{ signedOn: '2026-02-30' }, 'not a real calendar date'],
    [{ signedOn: '2026-7-2' }, 'YYYY-MM-DD'],
    [{ signedOn: '2026-07-02T10:00:00Z' }, 'YYYY-MM-DD'],
    [{ signedOn: '1999-12-31' }, 'between 2000 and 2100'],
    [{}, 'required'],
  ])('refuses %j', (input, message) => {
    try {
      cancellationDeadline(input as never);
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(CalculatorInputError);
      expect((error as CalculatorInputError).details[0]?.message).toContain(message);
    }
  });

  const signedOn = fc
    .integer({ min: Date.UTC(2021, 0, 1) / DAY, max: Date.UTC(2039, 11, 20) / DAY })
    .map((n) => new Date(n * DAY).toISOString().slice(0, 10));
  const holidaysByHand = handFederalDates(2020, 2041);

  it('the last day is at least 3 and at most 10 days after signing', () => {
    fc.assert(
      fc.property(signedOn, (date) => {
        const last = cancellationDeadline({ signedOn: date }).lastDayToCancel;
        return last >= shift(date, 3) && last <= shift(date, 10);
      }),
    );
  });

  it('the last day is never a Sunday, nor a federal holiday or observed holiday (checked against the hand computation)', () => {
    fc.assert(
      fc.property(signedOn, (date) => {
        const result = cancellationDeadline({ signedOn: date });
        const allCounted = result.businessDaysCounted.every(
          (d) => weekdayOf(d) !== 0 && !holidaysByHand.has(d),
        );
        const allSkippedRightly = result.skipped.every(
          (s) => weekdayOf(s.date) === 0 || holidaysByHand.has(s.date),
        );
        return (
          weekdayOf(result.lastDayToCancel) !== 0 &&
          !holidaysByHand.has(result.lastDayToCancel) &&
          allCounted &&
          allSkippedRightly
        );
      }),
    );
  });

  it('signing a day later never moves the deadline earlier', () => {
    fc.assert(
      fc.property(signedOn, (date) => {
        return (
          cancellationDeadline({ signedOn: shift(date, 1) }).lastDayToCancel >=
          cancellationDeadline({ signedOn: date }).lastDayToCancel
        );
      }),
    );
  });
});
