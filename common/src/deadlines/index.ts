// Deadlines and contract rules: plain calendar dates ('YYYY-MM-DD') in and out. See each file for its sources.
export { CalculatorInputError, StatePackMissingError } from '../calculators/errors';
export {
  DEADLINE_MIN_YEAR,
  DEADLINE_MAX_YEAR,
  WEEKDAY_NAMES,
  addCalendarDays,
  calendarWeekday,
  weekendObservedDate,
} from './calendar-date';
export type { IsoDate } from './calendar-date';
export type { HolidayKind, HolidayMark } from './holiday-calendar';
export { FEDERAL_HOLIDAY_NAMES, federalHolidaysBetween, federalHolidaysOn } from './federal-holidays';
export type { FederalHolidayName } from './federal-holidays';
export {
  cancellationDeadline,
  ftcNonBusinessDayReasons,
  FTC_COOLING_OFF_BUSINESS_DAYS,
  FTC_COOLING_OFF_SOURCE,
} from './cancellation-deadline';
export type {
  CancellationDeadlineInput,
  CancellationDeadlineResult,
  SkippedDay,
} from './cancellation-deadline';
export { FLORIDA_RULE_PACK, STATE_RULE_PACKS, findStateRulePack } from './state-packs';
export type {
  ContractNoticeRule,
  ContractPropertyKind,
  ContractRulePack,
  InitialPaymentRule,
  OneCallRulePack,
  StateHolidayRule,
  StateRulePack,
} from './state-packs';
export { earliestDigDate, oneCallNonBusinessDayReasons, DIG_CAUTIONS } from './earliest-dig-date';
export type { EarliestDigDateInput, EarliestDigDateResult } from './earliest-dig-date';
export { depositRules, CONTRACT_PROPERTY_KINDS, FTC_429_BUYER_STATEMENT } from './deposit-rules';
export type { ContractClock, ContractNotice, DepositRulesInput, DepositRulesResult } from './deposit-rules';
export { cancellationWindowOpen, endOfDayInZone, todayInZone } from './zoned-today';
