import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { earliestDigDate, oneCallNonBusinessDayReasons } from './earliest-dig-date';
import { CalculatorInputError, StatePackMissingError } from '../calculators/errors';

// An independent hand computation of the F.S. 556.102 holiday list (published), with our reading
// for weekends (Saturday → the Friday before too, Sunday → the Monday after too).
const DAY = 86_400_000;
const iso = (y: number, m: number, d: number) => new Date(Date.UTC(y, m - 1, d)).toISOString().slice(0, 10);
const weekdayOf = (date: string) => new Date(`${date}T00:00:00Z`).getUTCDay();
const shift = (date: string, days: number) =>
  new Date(Date.parse(`${date}T00:00:00Z`) + days * DAY).toISOString().slice(0, 10);
const nth = (y: number, m: number, weekday: number, n: number) =>
  iso(y, m, 1 + ((weekday - weekdayOf(iso(y, m, 1)) + 7) % 7) + 7 * (n - 1));
const lastMonday = (y: number, m: number) => {
  const end = new Date(Date.UTC(y, m, 0)).getUTCDate();
  return iso(y, m, end - ((weekdayOf(iso(y, m, end)) - 1 + 7) % 7));
};
function handFloridaDaysOff(fromYear: number, toYear: number): Set<string> {
  const off = new Set<string>();
  for (let y = fromYear; y <= toYear; y++) {
    const thanksgiving = nth(y, 11, 4, 4);
    for (const d of [
      iso(y, 1, 1), // New Year's Day
      nth(y, 1, 1, 3), // Martin Luther King Jr.'s Birthday, third Monday in January
      lastMonday(y, 5), // Memorial Day
      iso(y, 7, 4), // Independence Day
      nth(y, 9, 1, 1), // Labor Day
      thanksgiving, // Thanksgiving Day
      shift(thanksgiving, 1), // the Friday after
      iso(y, 12, 24), // Christmas Eve
      iso(y, 12, 25), // Christmas Day
    ]) {
      off.add(d);
      if (weekdayOf(d) === 6) off.add(shift(d, -1)); // our reading
      if (weekdayOf(d) === 0) off.add(shift(d, 1)); // our reading
    }
  }
  return off;
}
const floridaOff = handFloridaDaysOff(2019, 2041);
const isFloridaBusinessDay = (d: string) => weekdayOf(d) >= 1 && weekdayOf(d) <= 5 && !floridaOff.has(d);

describe('earliestDigDate, Florida (F.S. 556.105(1)(a), F.S. 556.102)', () => {
  it.each([
    // filedOn, earliestDigDate, full business days
    // F.S. 556.105(1)(a), F.S. 556.102; REFERENCE-VALUES.md example: Thu 26 Thanksgiving, Fri 27 day after,
    // weekend, Mon 30 and Tue Dec 1 are the 2 full business days
    ['2026-11-25', '2026-12-02', ['2026-11-30', '2026-12-01']],
    // Our own, from the same rules:
    ['2026-03-02', '2026-03-05', ['2026-03-03', '2026-03-04']], // ordinary Monday
    ['2026-03-05', '2026-03-10', ['2026-03-06', '2026-03-09']], // Thursday: Saturday does not count here
    ['2026-03-04', '2026-03-07', ['2026-03-05', '2026-03-06']], // Wednesday: may dig on the Saturday
    ['2026-11-21', '2026-11-25', ['2026-11-23', '2026-11-24']], // filed on a Saturday
    ['2026-10-09', '2026-10-14', ['2026-10-12', '2026-10-13']], // Columbus Day counts in Florida (not on the 556.102 list)
    ['2026-11-10', '2026-11-13', ['2026-11-11', '2026-11-12']], // Veterans Day counts in Florida
    ['2026-06-18', '2026-06-23', ['2026-06-19', '2026-06-22']], // Juneteenth counts in Florida
    ['2026-01-16', '2026-01-22', ['2026-01-20', '2026-01-21']], // MLK Jr.'s Birthday
    ['2026-12-23', '2026-12-30', ['2026-12-28', '2026-12-29']], // Christmas Eve and Christmas Day
    ['2026-07-02', '2026-07-08', ['2026-07-06', '2026-07-07']], // our reading: Fri 07-03 skipped for Sat 07-04
    ['2027-12-30', '2028-01-05', ['2028-01-03', '2028-01-04']], // our reading: Fri 12-31 skipped for Sat 2028-01-01
    ['2022-12-22', '2022-12-29', ['2022-12-27', '2022-12-28']], // our reading: Eve Sat 24 → Fri 23; Christmas Sun 25 → Mon 26
  ])('ticket filed %s → earliest dig %s', (filedOn, earliest, fullBusinessDays) => {
    const result = earliestDigDate({ state: 'FL', filedOn });
    expect(result.earliestDigDate).toBe(earliest);
    expect(result.fullBusinessDays).toEqual(fullBusinessDays);
  });

  it('says why each day was skipped', () => {
    const result = earliestDigDate({ state: 'FL', filedOn: '2026-11-25' });
    expect(result.skipped).toEqual([
      { date: '2026-11-26', reason: 'FL one-call holiday: Thanksgiving Day' },
      { date: '2026-11-27', reason: 'FL one-call holiday: Friday after Thanksgiving' },
      { date: '2026-11-28', reason: 'Saturday' },
      { date: '2026-11-29', reason: 'Sunday' },
    ]);
    expect(result.source).toContain('F.S. 556.105(1)(a)');
    expect(result.source).toContain('F.S. 556.102');
  });

  it('names a day once, with every reason that applies', () => {
    const result = earliestDigDate({ state: 'FL', filedOn: '2027-12-22' });
    expect(result.skipped).toEqual([
      {
        date: '2027-12-24',
        reason: 'FL one-call holiday: Christmas Day (observed); FL one-call holiday: Christmas Eve',
      },
      { date: '2027-12-25', reason: 'Saturday; FL one-call holiday: Christmas Day' },
      { date: '2027-12-26', reason: 'Sunday' },
    ]);
    expect(result.earliestDigDate).toBe('2027-12-28');
  });

  it('names the weekend reading as ours, and carries the 811 cautions', () => {
    const result = earliestDigDate({ state: 'fl', filedOn: '2026-11-25' });
    expect(result.state).toBe('FL');
    expect(result.readings.join(' ')).toContain('our reading');
    expect(result.cautions.join(' ')).toContain('811');
    expect(result.cautions.join(' ')).toContain('marked');
  });

  it('2026–2028: the pack gives exactly the hand-computed days off', () => {
    const packOff: string[] = [];
    const handOff: string[] = [];
    for (let d = '2026-01-01'; d <= '2028-12-31'; d = shift(d, 1)) {
      const wd = weekdayOf(d);
      if (wd === 0 || wd === 6) continue;
      if (oneCallNonBusinessDayReasons('FL', d).length > 0) packOff.push(d);
      if (floridaOff.has(d)) handOff.push(d);
    }
    expect(packOff).toEqual(handOff);
    // 9 listed days a year = 27, less two that coincide once moved off the weekend: Sat 2027-12-25 moves onto
    // Christmas Eve (Fri 24), and Sun 2028-12-24 moves onto Christmas Day (Mon 25).
    expect(packOff).toHaveLength(25);
    expect(packOff).toContain('2027-12-31'); // Sat 2028-01-01 moved to the Friday before, in the year before
  });

  it('the two counted days are business days, the dig date follows the last, and nothing between is skipped wrongly', () => {
    const filedOn = fc
      .integer({ min: Date.UTC(2020, 0, 1) / DAY, max: Date.UTC(2040, 11, 20) / DAY })
      .map((n) => new Date(n * DAY).toISOString().slice(0, 10));
    fc.assert(
      fc.property(filedOn, (date) => {
        const result = earliestDigDate({ state: 'FL', filedOn: date });
        const [first, second] = result.fullBusinessDays;
        if (!first || !second) return false;
        const between: string[] = [];
        for (let d = shift(date, 1); d < second; d = shift(d, 1)) if (d !== first) between.push(d);
        return (
          isFloridaBusinessDay(first) &&
          isFloridaBusinessDay(second) &&
          first > date &&
          result.earliestDigDate === shift(second, 1) &&
          between.every((d) => !isFloridaBusinessDay(d)) &&
          result.earliestDigDate >= shift(date, 3)
        );
      }),
    );
  });

  it.each(['TX', 'ga', 'ZZ'])(
    "has no rule pack for %s: throws StatePackMissingError telling the user to follow that state's one-call law",
    (state) => {
      try {
        earliestDigDate({ state, filedOn: '2026-11-25' });
        expect.unreachable();
      } catch (error) {
        expect(error).toBeInstanceOf(StatePackMissingError);
        const e = error as StatePackMissingError;
        expect(e.code).toBe('CALC.NO_STATE_PACK');
        expect(e.state).toBe(state.toUpperCase());
        expect(e.message).toContain(`No rule pack exists for ${state.toUpperCase()}`);
        expect(e.message).toContain('one-call (811) law');
      }
    },
  );

  it.each([
    [{ state: 'Florida', filedOn: '2026-11-25' }, 'state'],
    [{ state: 'FL', filedOn: '2026-13-01' }, 'filedOn'],
    [{ state: 'FL' }, 'filedOn'],
  ])('refuses %j', (input, field) => {
    try {
      earliestDigDate(input as never);
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(CalculatorInputError);
      expect((error as CalculatorInputError).details.map((d) => d.field)).toContain(field);
    }
  });
});
