// What a contract with a deposit must carry, and the clocks the deposit starts.
//
// Federal, every state: the 16 CFR 429 cancellation notice for a sale made at the buyer's home.
// Florida pack: F.S. 489.126(2)(a) (large initial payment → permit and start-of-work clocks),
// F.S. 713.015 (lien-law disclosure), F.S. 489.1425 (recovery fund notice).
//
// A state without a pack does NOT throw here (unlike earliestDigDate): the federal notice still
// applies and must not be lost, so the result lists it with a warning that the state's own rules
// were not checked.
import { CalcDecimal, CalcDecimalValue, formatCalcDecimal } from '../calculators/decimal';
import { InputCollector, requireInputObject } from '../calculators/input';
import { IsoDate, addCalendarDays, readCalendarDate } from './calendar-date';
import { cancellationDeadline } from './cancellation-deadline';
import { ContractPropertyKind, findStateRulePack, readStateCode } from './state-packs';

export const CONTRACT_PROPERTY_KINDS: readonly ContractPropertyKind[] = [
  'dwelling-1-to-4-units',
  'other-residential',
  'non-residential',
];

/** 16 CFR 429.1(a), the statement next to the buyer's signature (published; matched against quotations of the rule). */
export const FTC_429_BUYER_STATEMENT =
  'You, the buyer, may cancel this transaction at any time prior to midnight of the third business day after the ' +
  'date of this transaction. See the attached notice of cancellation form for an explanation of this right.';

export interface ContractNotice {
  code: string;
  title: string;
  source: string;
  /** Exact wording, only where we are sure of it. */
  text?: string;
  /** How it must be set in the contract, where known. */
  format?: string;
  /** Where to take the wording from. */
  wordingFrom: string;
  appliesBecause: string;
}

export interface ContractClock {
  code: string;
  title: string;
  /** Last day (calendar days; no moving off weekends) when the start date is known. */
  dueOn?: IsoDate;
  source: string;
  startsWhen: string;
  rule: string;
}

export interface DepositRulesInput {
  state: string;
  /** Contract price, dollars, e.g. "18500.00". */
  contractPrice: string;
  /** Initial payment (deposit), dollars; "0" when none. */
  deposit: string;
  /** Day the deposit was received, 'YYYY-MM-DD'. */
  paidOn?: string;
  /** Day the permits were issued, 'YYYY-MM-DD'. */
  permitIssuedOn?: string;
  /** Day the buyer signed, 'YYYY-MM-DD': gives the end of the cancellation window. */
  signedOn?: string;
  /** What the work improves. Default 'dwelling-1-to-4-units' (the case with the most notices), with a warning. */
  property?: ContractPropertyKind;
}

export interface DepositRulesResult {
  state: string;
  /** The state pack used, or null when none exists for the state. */
  statePack: string | null;
  /** Deposit as a percent of the contract price, 4 decimals (display only; the rules compare exactly). */
  depositPercent: string;
  /** Whether a state large-initial-payment rule is triggered; null without a state pack. */
  largeInitialPayment: boolean | null;
  notices: ContractNotice[];
  clocks: ContractClock[];
  warnings: string[];
}

export function depositRules(input: DepositRulesInput): DepositRulesResult {
  const fields = requireInputObject(input, 'The deposit rules');
  const v = new InputCollector();
  const state = readStateCode(v, 'state', fields.state);
  const price = v.decimal('contractPrice', 'Contract price', fields.contractPrice, {
    positive: true,
    maxDecimals: 2,
  });
  const deposit = v.decimal('deposit', 'Deposit', fields.deposit, { maxDecimals: 2 });
  const paidOn =
    fields.paidOn === undefined ? undefined : readCalendarDate(v, 'paidOn', 'Date paid', fields.paidOn);
  const permitIssuedOn =
    fields.permitIssuedOn === undefined
      ? undefined
      : readCalendarDate(v, 'permitIssuedOn', 'Date the permits were issued', fields.permitIssuedOn);
  const signedOn =
    fields.signedOn === undefined
      ? undefined
      : readCalendarDate(v, 'signedOn', 'Date signed', fields.signedOn);
  let property: ContractPropertyKind = 'dwelling-1-to-4-units';
  if (fields.property !== undefined) {
    if (
      typeof fields.property === 'string' &&
      (CONTRACT_PROPERTY_KINDS as readonly string[]).includes(fields.property)
    ) {
      property = fields.property as ContractPropertyKind;
    } else {
      v.add('property', `Property must be one of ${CONTRACT_PROPERTY_KINDS.join(', ')}.`);
    }
  }
  if (price && deposit && deposit.gt(price)) {
    v.add('deposit', 'Deposit cannot be more than the contract price.');
  }
  v.throwIfAny();
  if (!state || !price || !deposit) throw new Error('unreachable');

  const warnings: string[] = [];
  const notices: ContractNotice[] = [ftcNotice(price)];
  const clocks: ContractClock[] = [ftcClock(signedOn)];
  if (price.lt(25)) {
    warnings.push(
      'Below $25 the Cooling-Off Rule does not require the cancellation notice; giving it does no harm.',
    );
  }
  if (deposit.gt(0)) {
    warnings.push(
      "A deposit taken before the cancellation window closes is not yet the contractor's money: after a valid " +
        'cancellation every payment, the deposit included, is refunded within 10 business days (FTC guidance, secondary).',
    );
  }
  if (paidOn && permitIssuedOn && permitIssuedOn < paidOn) {
    warnings.push('The permits are dated before the payment: check both dates.');
  }

  const pack = findStateRulePack(state);
  const rules = pack?.contract;
  if (!pack || !rules) {
    warnings.push(
      `No rule pack exists for ${state}: only the federal cancellation notice is listed. Check ${state}'s own rules ` +
        'on deposits, home-improvement contract notices and lien law before using this contract there.',
    );
    return {
      state,
      statePack: null,
      depositPercent: percentOf(deposit, price),
      largeInitialPayment: null,
      notices,
      clocks,
      warnings,
    };
  }

  if (fields.property === undefined) {
    warnings.push(
      'The kind of property was not given: assumed a dwelling of 1 to 4 units, which needs the most notices.',
    );
  }
  for (const notice of rules.notices) {
    const threshold = new CalcDecimal(notice.overContractPrice);
    if (price.gt(threshold) && notice.appliesTo.includes(property)) {
      notices.push({
        code: notice.code,
        title: notice.title,
        source: notice.source,
        ...(notice.format ? { format: notice.format } : {}),
        wordingFrom: notice.wordingFrom,
        appliesBecause: `Contract price over ${dollars(threshold)} for work on ${describeProperty(property)}.`,
      });
    }
  }

  const rule = rules.initialPayment;
  const large = deposit.gt(price.mul(rule.moreThanShareOfPrice));
  if (large) {
    const share = new CalcDecimal(rule.moreThanShareOfPrice).mul(100).toFixed();
    const ruleText = `Initial payment of more than ${share}% of the contract price; ${rule.exceptions}.`;
    clocks.push({
      code: 'FL_489_126_PERMIT',
      title: 'Apply for the permits',
      ...(paidOn ? { dueOn: addCalendarDays(paidOn, rule.applyForPermitsWithinDays) } : {}),
      source: rule.source,
      startsWhen: `the initial payment is received; due within ${rule.applyForPermitsWithinDays} days after it`,
      rule: ruleText,
    });
    clocks.push({
      code: 'FL_489_126_START',
      title: 'Start the work',
      ...(permitIssuedOn ? { dueOn: addCalendarDays(permitIssuedOn, rule.startWorkWithinDaysOfPermit) } : {}),
      source: rule.source,
      startsWhen: `the permits are issued; due within ${rule.startWorkWithinDaysOfPermit} days after that`,
      rule: ruleText,
    });
    if (!paidOn)
      warnings.push('Give the date the deposit was received to see when the permit application is due.');
    if (!permitIssuedOn)
      warnings.push('Once the permits are issued, give that date to see when work must start.');
  }

  return {
    state,
    statePack: pack.code,
    depositPercent: percentOf(deposit, price),
    largeInitialPayment: large,
    notices,
    clocks,
    warnings,
  };
}

function ftcNotice(price: CalcDecimalValue): ContractNotice {
  return {
    code: 'FTC_429',
    title: "Buyer's right to cancel (FTC Cooling-Off Rule)",
    source: '16 CFR 429.1(a) and (b)',
    text: FTC_429_BUYER_STATEMENT,
    format:
      "Next to the buyer's signature (or on the front page of the receipt), in bold type of at least 10 points and in the " +
      'language of the sales presentation. If the cancellation forms are not attached, change the last sentence to say ' +
      'where they are.',
    wordingFrom:
      'The statement above is from 16 CFR 429.1(a). The notice of cancellation form, completed and given in duplicate, ' +
      'must be taken from 16 CFR 429.1(b).',
    appliesBecause: price.gte(25)
      ? "A sale of $25 or more made at the buyer's residence (16 CFR 429.0(a)). Listed for every contract: Loambook " +
        'does not know where this one is signed, and leaving the notice out when it applies would cost the buyer the right.'
      : 'Listed for every contract; below $25 the rule does not require it.',
  };
}

function ftcClock(signedOn: IsoDate | undefined): ContractClock {
  return {
    code: 'FTC_429_CANCEL',
    title: "Buyer's cancellation window ends (midnight at the end of the day)",
    ...(signedOn ? { dueOn: cancellationDeadline({ signedOn }).lastDayToCancel } : {}),
    source: '16 CFR 429.1(a)',
    startsWhen: 'the contract is signed; ends at midnight of the third business day after that day',
    rule: 'Business days are all days except Sundays and federal holidays.',
  };
}

/** "$2,500.00": for messages only. */
function dollars(amount: CalcDecimalValue): string {
  const [whole = '0', cents = '00'] = formatCalcDecimal(amount, 2).split('.');
  return `$${whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',')}.${cents}`;
}

function percentOf(part: CalcDecimalValue, whole: CalcDecimalValue): string {
  return formatCalcDecimal(part.div(whole).mul(100), 4);
}

function describeProperty(kind: ContractPropertyKind): string {
  switch (kind) {
    case 'dwelling-1-to-4-units':
      return 'a dwelling of 1 to 4 units';
    case 'other-residential':
      return 'residential property';
    case 'non-residential':
      return 'non-residential property';
  }
}
