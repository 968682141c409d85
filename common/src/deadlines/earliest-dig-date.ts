// The earliest day excavation may start after a one-call (811) ticket, from a state rule pack.
import Holidays from 'date-holidays';
import { CAUTION_CALL_811 } from '../calculators/cautions';
import { StatePackMissingError } from '../calculators/errors';
import { InputCollector, requireInputObject } from '../calculators/input';
import { IsoDate, addCalendarDays, calendarWeekday, readCalendarDate, WEEKDAY_NAMES } from './calendar-date';
import { SkippedDay } from './cancellation-deadline';
import { HolidayCalendar, describeHolidayMarks } from './holiday-calendar';
import { OneCallRulePack, StateRulePack, findStateRulePack, readStateCode } from './state-packs';

export interface EarliestDigDateInput {
  /** Two-letter state code, e.g. "FL". */
  state: string;
  /** The day the ticket was filed with the one-call centre, 'YYYY-MM-DD'. */
  filedOn: string;
}

export interface EarliestDigDateResult {
  state: string;
  filedOn: IsoDate;
  earliestDigDate: IsoDate;
  earliestDigWeekday: string;
  /** The full business days of notice, in order. */
  fullBusinessDays: IsoDate[];
  skipped: SkippedDay[];
  source: string;
  readings: string[];
  cautions: string[];
}

export const DIG_CAUTIONS: readonly string[] = [
  CAUTION_CALL_811,
  'The date is the earliest the law allows, not a promise that the site is ready: do not dig until every utility ' +
    'notified has marked its lines or answered that it has none there. If marks are missing or unclear, contact the ' +
    'one-call centre again before digging.',
  'Near a marked line, expose it by hand or with other careful methods as the state law and the utility require.',
];

const calendars = new Map<string, HolidayCalendar>();

function oneCallCalendar(pack: StateRulePack, rules: OneCallRulePack): HolidayCalendar {
  const existing = calendars.get(pack.code);
  if (existing) return existing;
  const names = new Set(rules.holidays.map((h) => h.name));
  const calendar = new HolidayCalendar({
    create: () => {
      const holidays = new Holidays();
      for (const h of rules.holidays) {
        if (!holidays.setHoliday(h.rule, { name: h.name, type: 'public' })) {
          throw new Error(
            `Rule pack ${pack.code}: date-holidays cannot read the rule "${h.rule}" (${h.name}).`,
          );
        }
      }
      return holidays;
    },
    accept: (name) => (names.has(name) ? name : null),
    expectedNames: () => [...names],
    addObservedWeekdays: rules.skipObservedWeekday,
    language: 'en-us', // the names are set as plain strings, so any language returns them
  });
  calendars.set(pack.code, calendar);
  return calendar;
}

/** Why a date is not a one-call business day under the pack (empty when it is one). */
export function oneCallNonBusinessDayReasons(state: string, date: IsoDate): string[] {
  const pack = findStateRulePack(state);
  const rules = pack?.oneCall;
  if (!pack || !rules) throw missingOneCallPack(state);
  const reasons: string[] = [];
  const weekday = calendarWeekday(date);
  if (!rules.businessWeekdays.includes(weekday)) reasons.push(WEEKDAY_NAMES[weekday] as string);
  for (const name of describeHolidayMarks(oneCallCalendar(pack, rules).marksOn(date))) {
    reasons.push(`${pack.code} one-call holiday: ${name}`);
  }
  return reasons;
}

function missingOneCallPack(state: string): StatePackMissingError {
  return new StatePackMissingError(
    state,
    'the notice to give before digging',
    `Follow ${state}'s one-call (811) law: call 811 and wait as long as that law requires before digging.`,
  );
}

export function earliestDigDate(input: EarliestDigDateInput): EarliestDigDateResult {
  const fields = requireInputObject(input, 'The earliest dig date');
  const v = new InputCollector();
  const state = readStateCode(v, 'state', fields.state);
  const filedOn = readCalendarDate(v, 'filedOn', 'Date the ticket was filed', fields.filedOn);
  v.throwIfAny();
  if (!state || !filedOn) throw new Error('unreachable');

  const pack = findStateRulePack(state);
  const rules = pack?.oneCall;
  if (!pack || !rules) {
    throw missingOneCallPack(state);
  }

  const fullBusinessDays: IsoDate[] = [];
  const skipped: SkippedDay[] = [];
  let day = filedOn; // the day of the call does not count
  while (fullBusinessDays.length < rules.noticeFullBusinessDays) {
    day = addCalendarDays(day, 1);
    const reasons = oneCallNonBusinessDayReasons(state, day);
    if (reasons.length === 0) fullBusinessDays.push(day);
    else skipped.push({ date: day, reason: reasons.join('; ') });
  }
  const earliest = addCalendarDays(fullBusinessDays[fullBusinessDays.length - 1] as IsoDate, 1);
  return {
    state,
    filedOn,
    earliestDigDate: earliest,
    earliestDigWeekday: WEEKDAY_NAMES[calendarWeekday(earliest)] as string,
    fullBusinessDays,
    skipped,
    source: rules.source,
    readings: [...rules.readings],
    cautions: [...DIG_CAUTIONS],
  };
}
