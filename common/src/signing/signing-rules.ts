// What signing a contract needs: the notices the contract must carry (and the homeowner acknowledges),
// the safety cautions, the limits on a drawn signature, and how sales tax reads to the homeowner.
import {
  CAUTION_CALL_811,
  CAUTION_ENGINEER,
  CAUTION_ISOCYANATES,
  CAUTION_LIFTING,
} from '../calculators/cautions';
import { depositRules, type ContractClock, type ContractNotice } from '../deadlines/deposit-rules';
import { money } from '../money';
import type { SalesTaxTreatment } from '../branches/branch-rules';

export const SIGNING_CAUTION_CODES = ['CALL_811', 'ISOCYANATES', 'LIFTING', 'ENGINEER'] as const;
export type SigningCautionCode = (typeof SIGNING_CAUTION_CODES)[number];

export interface SigningCaution {
  code: SigningCautionCode;
  text: string;
}

/** Printed on every proposal and contract, and shown before signing (REFERENCE-VALUES.md, "Safety"). */
export const SIGNING_CAUTIONS: readonly SigningCaution[] = [
  { code: 'CALL_811', text: CAUTION_CALL_811 },
  { code: 'ISOCYANATES', text: CAUTION_ISOCYANATES },
  { code: 'LIFTING', text: CAUTION_LIFTING },
  { code: 'ENGINEER', text: CAUTION_ENGINEER },
];

/** Days a signing link works, unless SIGNING_LINK_TTL_DAYS says otherwise. */
export const SIGNING_LINK_DEFAULT_TTL_DAYS = 14;

/** A drawn signature: a PNG of at most 500 KB (decoded bytes), at most 4000 px a side. */
export const SIGNATURE_MAX_BYTES = 500 * 1024;
export const SIGNATURE_MAX_SIDE_PX = 4000;
/**
 * A signature is "blank" below this many ink pixels: pixels that are not transparent (alpha ≥ 32) and
 * darker than paper (luminance < 224 of 255). Our choice: a short initial drawn with a finger leaves
 * hundreds; a stray tap leaves a handful.
 */
export const SIGNATURE_MIN_INK_PIXELS = 20;
export const SIGNATURE_DATA_URL_PREFIX = 'data:image/png;base64,';

export const SIGNER_NAME_MAX_LENGTH = 120;

/** What the contract says where a statute's wording is needed and we do not reproduce it. */
export function statutoryWordingStatement(n: Pick<ContractNotice, 'source' | 'wordingFrom'>): string {
  return (
    `The full statutory wording of this notice, as ${n.source} requires it, must be given with this contract; ` +
    `it is not reproduced here. ${n.wordingFrom}`
  );
}

export interface RequiredNotice extends ContractNotice {
  /** The homeowner must tick it before signing. */
  ackRequired: true;
  /** True when `text` is the notice's exact wording; false when the statute's wording must be taken from it. */
  wordingIncluded: boolean;
  /** For a notice without its wording: the statement printed in its place. */
  wordingStatement: string | null;
}

export interface ContractRules {
  notices: RequiredNotice[];
  /** The state clocks a deposit starts (the federal cancellation clock is shown on its own). */
  depositClocks: ContractClock[];
  largeInitialPayment: boolean | null;
  depositPercent: string;
  warnings: string[];
}

/**
 * The notices and deposit clocks for a contract at `contractPrice` on a property in `state`
 * (depositRules in common/src/deadlines). Every notice listed must be acknowledged when signing: the
 * federal cancellation notice (16 CFR 429.1) and, in a state with a rule pack, the state's notices.
 * A price of 0 (nothing to sign) is treated as the smallest amount, which leaves only the federal notice.
 */
export function contractRules(p: {
  state: string;
  contractPrice: string;
  deposit?: string | null;
}): ContractRules {
  const price = money(p.contractPrice).greaterThan(0) ? p.contractPrice : '0.01';
  const deposit = p.deposit && money(p.deposit).lessThanOrEqualTo(price) ? p.deposit : '0';
  const r = depositRules({ state: p.state, contractPrice: price, deposit });
  return {
    notices: r.notices.map((n) => ({
      ...n,
      ackRequired: true,
      wordingIncluded: n.text !== undefined,
      wordingStatement: n.text === undefined ? statutoryWordingStatement(n) : null,
    })),
    depositClocks: r.clocks.filter((c) => c.code !== 'FTC_429_CANCEL'),
    largeInitialPayment: r.largeInitialPayment,
    depositPercent: r.depositPercent,
    warnings: r.warnings,
  };
}

/** The notices still to acknowledge, and codes given that are not notices of this contract. */
export function checkAcknowledgements(
  required: readonly { code: string }[],
  given: readonly string[],
): { missing: string[]; unknown: string[] } {
  const want = new Set(required.map((n) => n.code));
  const have = new Set(given);
  return {
    missing: [...want].filter((c) => !have.has(c)),
    unknown: [...have].filter((c) => !want.has(c)),
  };
}

export interface TaxForHomeowner {
  treatment: SalesTaxTreatment;
  ratePct: string;
  /** Sales tax added to the price the homeowner pays; "0.00" when the contractor pays tax on its materials. */
  chargedToHomeowner: string;
  /** One line for the printed totals. */
  label: string;
}

/** How an option's sales tax reads to the homeowner (the branch's treatment, frozen on the proposal). */
export function taxForHomeowner(p: {
  treatment: SalesTaxTreatment;
  ratePct: string;
  taxTotal: string;
}): TaxForHomeowner {
  if (p.treatment === 'invoice') {
    return {
      treatment: p.treatment,
      ratePct: p.ratePct,
      chargedToHomeowner: p.taxTotal,
      label: `Sales tax at ${p.ratePct}%`,
    };
  }
  return {
    treatment: p.treatment,
    ratePct: p.ratePct,
    chargedToHomeowner: '0.00',
    label: 'No sales tax is added: the contractor pays the sales tax on the materials it buys',
  };
}
