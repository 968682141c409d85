// A preview of the salesperson's commission on an option, before the commission plans of issue #5 exist.
// The rate is the branch's default (branches.commission_rate_pct). The amount is a preview only: a
// commission is earned later (after the right to cancel has passed, see REFERENCE-VALUES.md), not here.
import { money, MoneyDecimal, toCents } from '../money';

export const COMMISSION_BASES = ['net', 'margin'] as const;
export type CommissionBasis = (typeof COMMISSION_BASES)[number];

/** A placeholder default rate, % — our assumption for the demo, not a published or trade figure. */
export const DEFAULT_COMMISSION_RATE_PCT = '8';

export interface CommissionPreviewInput {
  netTotal: string;
  grossProfit: string;
  ratePct: string;
  /** 'net': a share of the net price; 'margin': a share of the gross profit (none on a loss). */
  basis: CommissionBasis;
}

/** rate × base, rounded to cents once (half-up). Never negative. */
export function commissionPreview(input: CommissionPreviewInput): string {
  const base = money(input.basis === 'margin' ? input.grossProfit : input.netTotal);
  const rate = money(input.ratePct);
  if (rate.isNegative()) throw new RangeError('A commission rate cannot be negative.');
  if (base.isNegative() || base.isZero()) return '0.00';
  return toCents(base.times(rate).dividedBy(new MoneyDecimal(100))).toFixed(2);
}
