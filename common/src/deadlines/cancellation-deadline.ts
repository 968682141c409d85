// The buyer's right to cancel a sale made at home: US FTC Cooling-Off Rule, 16 CFR Part 429.
//
// The buyer may cancel "at any time prior to midnight of the third business day after the date of
// the transaction" (16 CFR 429.1(a), published). A business day is any calendar day except Sunday or a
// federal holiday (16 CFR 429.0, memory); Saturday counts (FTC guidance, secondary). Federal holidays
// are those of 5 U.S.C. 6103(a) (published).
//
// Where the rule is silent (a federal holiday on a weekend), we protect the buyer: BOTH the holiday's
// own date and the weekday on which it is observed are skipped. That can only lengthen the window.
import { InputCollector, requireInputObject } from '../calculators/input';
import { IsoDate, WEEKDAY_NAMES, addCalendarDays, calendarWeekday, readCalendarDate } from './calendar-date';
import { describeHolidayMarks } from './holiday-calendar';
import { federalHolidaysOn } from './federal-holidays';

export const FTC_COOLING_OFF_BUSINESS_DAYS = 3;
export const FTC_COOLING_OFF_SOURCE =
  '16 CFR 429.1(a) (cancel before midnight of the third business day after the transaction); business day per ' +
  '16 CFR 429.0: every day except Sundays and federal holidays (5 U.S.C. 6103(a))';

export interface SkippedDay {
  date: IsoDate;
  reason: string;
}

export interface CancellationDeadlineInput {
  /** The date of the transaction (the day the buyer signed), 'YYYY-MM-DD'. */
  signedOn: string;
}

export interface CancellationDeadlineResult {
  signedOn: IsoDate;
  /** The buyer may cancel until midnight at the end of this date. */
  lastDayToCancel: IsoDate;
  lastDayWeekday: string;
  businessDaysCounted: IsoDate[];
  skipped: SkippedDay[];
  source: string;
  notes: string[];
}

export function cancellationDeadline(input: CancellationDeadlineInput): CancellationDeadlineResult {
  const fields = requireInputObject(input, 'The cancellation deadline');
  const v = new InputCollector();
  const signedOn = readCalendarDate(v, 'signedOn', 'Date signed', fields.signedOn);
  v.throwIfAny();
  if (!signedOn) throw new Error('unreachable');

  const counted: IsoDate[] = [];
  const skipped: SkippedDay[] = [];
  let day = signedOn;
  while (counted.length < FTC_COOLING_OFF_BUSINESS_DAYS) {
    day = addCalendarDays(day, 1);
    const reasons = ftcNonBusinessDayReasons(day);
    if (reasons.length === 0) counted.push(day);
    else skipped.push({ date: day, reason: reasons.join('; ') });
  }
  const lastDayToCancel = counted[counted.length - 1] as IsoDate;
  return {
    signedOn,
    lastDayToCancel,
    lastDayWeekday: WEEKDAY_NAMES[calendarWeekday(lastDayToCancel)] as string,
    businessDaysCounted: counted,
    skipped,
    source: FTC_COOLING_OFF_SOURCE,
    notes: [
      `The buyer may cancel until midnight at the end of ${lastDayToCancel}.`,
      'The day of signing does not count. Saturdays count as business days; Sundays and federal holidays do not.',
      'When a federal holiday falls on a weekend, both its date and the weekday on which it is observed are skipped: ' +
        'the rule does not say, and this reading gives the buyer the longer window.',
      'State law may give the buyer a longer window or more rights; the longer one applies.',
    ],
  };
}

/** Why a date is not a business day under 16 CFR 429 (empty when it is one). */
export function ftcNonBusinessDayReasons(date: IsoDate): string[] {
  const reasons: string[] = [];
  if (calendarWeekday(date) === 0) reasons.push('Sunday');
  for (const name of describeHolidayMarks(federalHolidaysOn(date))) reasons.push(`federal holiday: ${name}`);
  return reasons;
}
