// State rule packs, as data. A state without a pack has no computed dates or state notices: the
// functions that need one say so (StatePackMissingError, or a warning where a federal rule still applies).
//
// Holiday rules are written in the rule grammar of the date-holidays package ("3rd monday in January"),
// so the package computes the dates and no date is typed by hand.
import { InputCollector } from '../calculators/input';

export interface StateHolidayRule {
  name: string;
  /** date-holidays rule grammar, e.g. '01-01' or '4th thursday in November'. */
  rule: string;
}

export interface OneCallRulePack {
  /** Full business days of notice before excavation; the day of the call does not count. */
  noticeFullBusinessDays: number;
  /** Weekdays that can be business days: 0 = Sunday … 6 = Saturday. */
  businessWeekdays: readonly number[];
  /** Days that are not business days even on a business weekday. */
  holidays: readonly StateHolidayRule[];
  /** true: when a listed day falls on a weekend, the weekday on which it is observed is not a business day either. */
  skipObservedWeekday: boolean;
  source: string;
  /** Where the statute is silent and we chose a reading, in words. */
  readings: readonly string[];
}

export type ContractPropertyKind = 'dwelling-1-to-4-units' | 'other-residential' | 'non-residential';

export interface ContractNoticeRule {
  code: string;
  title: string;
  source: string;
  /** The notice is required when the contract price is strictly over this amount. */
  overContractPrice: string;
  /** The kinds of property it applies to. */
  appliesTo: readonly ContractPropertyKind[];
  /** How the notice must be set in the contract, as far as we know it for sure. */
  format?: string;
  /** Where the exact wording comes from (we do not reproduce wording we cannot vouch for). */
  wordingFrom: string;
}

export interface InitialPaymentRule {
  /** The rule applies when the initial payment is strictly more than this fraction of the contract price. */
  moreThanShareOfPrice: string;
  applyForPermitsWithinDays: number;
  startWorkWithinDaysOfPermit: number;
  source: string;
  exceptions: string;
}

export interface ContractRulePack {
  initialPayment: InitialPaymentRule;
  notices: readonly ContractNoticeRule[];
}

export interface StateRulePack {
  code: string;
  name: string;
  oneCall?: OneCallRulePack;
  contract?: ContractRulePack;
}

export const FLORIDA_RULE_PACK: StateRulePack = {
  code: 'FL',
  name: 'Florida',
  oneCall: {
    noticeFullBusinessDays: 2, // F.S. 556.105(1)(a): not less than 2 full business days (published)
    businessWeekdays: [1, 2, 3, 4, 5], // F.S. 556.102: Monday to Friday (published)
    // F.S. 556.102's own holiday list (published), not the federal list: no Washington's Birthday,
    // Juneteenth, Columbus Day or Veterans Day; adds the Friday after Thanksgiving and Christmas Eve.
    holidays: [
      { name: "New Year's Day", rule: '01-01' },
      { name: "Martin Luther King Jr.'s Birthday", rule: '3rd monday in January' },
      { name: 'Memorial Day', rule: 'monday before 06-01' },
      { name: 'Independence Day', rule: '07-04' },
      { name: 'Labor Day', rule: '1st monday in September' },
      { name: 'Thanksgiving Day', rule: '4th thursday in November' },
      { name: 'Friday after Thanksgiving', rule: 'friday after 4th thursday in November' },
      { name: 'Christmas Eve', rule: '12-24' },
      { name: 'Christmas Day', rule: '12-25' },
    ],
    skipObservedWeekday: true,
    source:
      'F.S. 556.105(1)(a): notify the one-call centre not less than 2 full business days before excavating; ' +
      'business days per F.S. 556.102 (Monday to Friday, less its listed holidays)',
    readings: [
      'The day of the call does not count; the two full business days are the next two business days after it.',
      'When a listed holiday falls on a Saturday, the Friday before is also treated as a non-business day; on a ' +
        'Sunday, the Monday after. The statute lists the days without saying; this is our reading, chosen because ' +
        'a longer wait protects the digger and the utilities. A day moved this way that lands on another listed day ' +
        '(Christmas Eve on a Sunday moves onto Christmas Day) is not moved again.',
      'Digging may start on the day after the second full business day, whatever day of the week that is.',
      "Dates only: a ticket filed after the centre's hours may count as filed on the next business day, which this " +
        'does not model.',
    ],
  },
  contract: {
    initialPayment: {
      moreThanShareOfPrice: '0.10', // F.S. 489.126(2)(a): "more than 10 percent" (published); exactly 10% does not trigger
      applyForPermitsWithinDays: 30,
      startWorkWithinDaysOfPermit: 90,
      source: 'F.S. 489.126(2)(a)',
      exceptions: 'unless the delay has just cause or the owner agrees in writing to a longer period',
    },
    notices: [
      {
        code: 'FL_713_015',
        title: 'Florida construction lien law disclosure',
        source: 'F.S. 713.015',
        overContractPrice: '2500.00',
        appliesTo: ['dwelling-1-to-4-units'],
        format:
          'In the direct contract, in at least 12-point, capitalised, bold type, signed and dated by the owner.',
        wordingFrom:
          'Take the full wording from F.S. 713.015 itself (the current official text); Loambook does not reproduce it.',
      },
      {
        code: 'FL_489_1425',
        title: "Florida Homeowners' Construction Recovery Fund notice",
        source: 'F.S. 489.1425',
        overContractPrice: '2500.00',
        appliesTo: ['dwelling-1-to-4-units', 'other-residential'],
        wordingFrom:
          'Take the full wording and layout from F.S. 489.1425 itself (the current official text); Loambook does not ' +
          'reproduce it.',
      },
    ],
  },
};

export const STATE_RULE_PACKS: Readonly<Record<string, StateRulePack>> = {
  FL: FLORIDA_RULE_PACK,
};

export function findStateRulePack(code: string): StateRulePack | undefined {
  return Object.prototype.hasOwnProperty.call(STATE_RULE_PACKS, code) ? STATE_RULE_PACKS[code] : undefined;
}

/** Read a two-letter state code ("FL", "fl", " Fl "): records a problem and returns undefined when invalid. */
export function readStateCode(v: InputCollector, field: string, value: unknown): string | undefined {
  if (typeof value !== 'string' || !/^[A-Za-z]{2}$/.test(value.trim())) {
    v.add(field, 'State must be a two-letter postal code, such as "FL".');
    return undefined;
  }
  return value.trim().toUpperCase();
}
