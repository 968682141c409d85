// Commission plans and what one contract pays under them.
//
// Sales commissions are an incremental cost of obtaining a contract (ASC 340-40-25-1 and 25-2, published;
// REFERENCE-VALUES.md "Money"); this file only says how much. When it is earned is earning.ts.
//
// BASIS — what the rate is a percentage of:
//   'net_price'     the contract's net price, excluding sales tax (pricing's netTotal);
//   'gross_margin'  net price − cost, where cost is every cost the contractor bears on the job, including
//                   sales tax it pays itself on materials (pricing's netTotal − grossProfit). A loss pays
//                   nothing: the base is never below 0.
//
// RATE — a flat percentage, or tiers. A tier is { from, ratePct }: the band runs from `from` (inclusive)
// up to the next tier's `from` (exclusive); the last band is open-ended; below the first tier's `from`
// the rate is 0 (so "nothing under 20% margin" is a first tier at "20"). Tiers are measured on one of:
//   'monthly_volume'  the salesperson's sold net price in the calendar month of signing (branch clock),
//                     counted up to and including this contract: volume before it (`monthVolumeBefore`,
//                     the net price credited to the salesperson — net × share — of contracts signed earlier
//                     in that month) plus this contract's credited net price. The backend computes
//                     `monthVolumeBefore` once at signing and keeps it, so a contract's rate never moves
//                     afterwards (a later sale or cancellation does not re-rate an earned commission).
//   'margin_band'     the contract's gross margin percent as printed on it: (net − cost) / net × 100,
//                     rounded half-up to 2 decimals (pricing's grossMarginPct); no margin when net is 0.
//
// MODE — how a tier's rate applies (plan field `mode`):
//   'step'     the rate of the band the measure falls in applies to the WHOLE base. The measure is the
//              volume including this contract, or the margin percent. At exactly a band's `from`, that
//              band applies.
//   'bracket'  marginal, like income-tax brackets. Monthly volume: the contract's credited net price
//              occupies the slice [volume before, volume before + credited net) of the month; each part of
//              the slice is paid at its band's rate, and the resulting blended rate applies to the base.
//              Margin band: the margin percent is sliced from 0 up to the contract's margin; each slice is
//              paid at its band's rate. With basis 'gross_margin' this is exactly "the first 30 points of
//              margin at 4%, the next 10 at 6%…" on the margin dollars; with 'net_price' the same blended
//              rate applies to the net price.
//   blended rate = Σ (width of slice in band × band rate) / width of the whole slice
//
// SPLITS — when salespeople share a contract, each one's part is computed exactly (their share of the
// base at their own rate — rates differ only on monthly-volume plans, where each has their own month),
// the whole is the exact sum rounded half-up to cents ONCE, and the whole is divided back into parts by
// the largest remainder (splits.ts). So the parts always add up to the whole to the cent.
//
// MILESTONES — `firstMilestonePct` of each salesperson's part (rounded half-up to cents) is earned at
// 'deposit_cleared_window_closed'; the rest of the part (part − first, exact) at 'job_completed'.
import { isDecimalString, money, MoneyDecimal, toCents, toMoneyString, type Money } from '../money';
import { throwIfIssues, type CommissionIssue } from './errors';
import { allocateByLargestRemainder, validateSplits, type CommissionSplitShare } from './splits';

export const COMMISSION_PLAN_BASES = ['net_price', 'gross_margin'] as const;
export type CommissionPlanBasis = (typeof COMMISSION_PLAN_BASES)[number];

export const COMMISSION_TIER_MEASURES = ['monthly_volume', 'margin_band'] as const;
export type CommissionTierMeasure = (typeof COMMISSION_TIER_MEASURES)[number];

export const COMMISSION_TIER_MODES = ['step', 'bracket'] as const;
export type CommissionTierMode = (typeof COMMISSION_TIER_MODES)[number];

export const COMMISSION_MILESTONES = ['deposit_cleared_window_closed', 'job_completed'] as const;
export type CommissionMilestone = (typeof COMMISSION_MILESTONES)[number];

/**
 * Default share of the commission earned when the deposit has cleared and the cancellation window has
 * closed, % — the customer's default in issue #5 ("part … the rest at completion"); the 50 is our choice,
 * not a published or trade figure. The owner sets it per plan.
 */
export const DEFAULT_FIRST_MILESTONE_PCT = '50';

export interface CommissionTier {
  /** Lower bound, inclusive: dollars for 'monthly_volume' ("50000.00"), percent for 'margin_band' ("30"). */
  from: string;
  /** Percent of the base, 0–100. */
  ratePct: string;
}

export type CommissionRate =
  | { kind: 'flat'; ratePct: string }
  | {
      kind: 'tiered';
      measure: CommissionTierMeasure;
      mode: CommissionTierMode;
      /** Ascending by `from`, strictly; at least one. */
      tiers: readonly CommissionTier[];
    };

export interface CommissionPlan {
  basis: CommissionPlanBasis;
  rate: CommissionRate;
  /** Percent (0–100) of each part earned at the first milestone; the rest at completion. */
  firstMilestonePct: string;
}

export interface CommissionSplit extends CommissionSplitShare {
  /**
   * Monthly-volume plans only: the net price credited to this salesperson (net × share) on contracts
   * signed earlier in the same calendar month, frozen at signing. Dollars, ≥ 0.
   */
  monthVolumeBefore?: string;
}

export interface CommissionDeal {
  /** Contract net price excluding sales tax, dollars, ≥ 0. */
  netPrice: string;
  /** Every cost the contractor bears on the job (materials tax it pays included), dollars, ≥ 0. */
  cost: string;
  /** Salespeople in contract order (the order breaks ties when cents are allocated). */
  splits: readonly CommissionSplit[];
}

export interface CommissionPartBreakdown {
  salespersonId: string;
  sharePct: string;
  /** The blended rate applied to this salesperson's share of the base, % (full precision, for display round it). */
  effectiveRatePct: string;
  /** This salesperson's commission, dollars. */
  amount: string;
  milestones: { milestone: CommissionMilestone; amount: string }[];
}

export interface CommissionBreakdown {
  /** The base the rates apply to (net price, or gross margin floored at 0), dollars. */
  base: string;
  /** Gross margin %, 2 decimals (half-up), or null when the net price is 0. */
  grossMarginPct: string | null;
  /** The whole commission, dollars: the sum of the parts. */
  total: string;
  parts: CommissionPartBreakdown[];
}

const ZERO = new MoneyDecimal(0);
const HUNDRED = new MoneyDecimal(100);

function pctIssue(value: unknown, field: string, label: string): CommissionIssue | null {
  if (!isDecimalString(value) || money(value).isNegative() || money(value).gt(HUNDRED)) {
    return {
      code: 'COMMISSION.PLAN_INVALID',
      field,
      message: `${label} must be a percentage from 0 to 100, written as a string such as "7.5".`,
    };
  }
  return null;
}

/** Every problem with a plan, in order; empty when valid. */
export function validateCommissionPlan(plan: CommissionPlan): CommissionIssue[] {
  const issues: CommissionIssue[] = [];
  const push = (i: CommissionIssue | null) => {
    if (i) issues.push(i);
  };
  if (!COMMISSION_PLAN_BASES.includes(plan.basis)) {
    push({
      code: 'COMMISSION.PLAN_INVALID',
      field: 'basis',
      message: 'The basis is the net price or the gross margin.',
    });
  }
  push(pctIssue(plan.firstMilestonePct, 'firstMilestonePct', 'The share earned at the first milestone'));
  const rate = plan.rate;
  if (rate.kind === 'flat') {
    push(pctIssue(rate.ratePct, 'rate.ratePct', 'The rate'));
  } else if (rate.kind === 'tiered') {
    if (!COMMISSION_TIER_MEASURES.includes(rate.measure)) {
      push({
        code: 'COMMISSION.PLAN_INVALID',
        field: 'rate.measure',
        message: 'Tiers are by monthly volume or by margin band.',
      });
    }
    if (!COMMISSION_TIER_MODES.includes(rate.mode)) {
      push({
        code: 'COMMISSION.PLAN_INVALID',
        field: 'rate.mode',
        message: 'A tier applies to the whole amount (step) or to its slice only (bracket).',
      });
    }
    if (rate.tiers.length === 0) {
      push({ code: 'COMMISSION.PLAN_INVALID', field: 'rate.tiers', message: 'Add at least one tier.' });
    }
    let previous: Money | null = null;
    rate.tiers.forEach((t, i) => {
      push(pctIssue(t.ratePct, `rate.tiers[${i}].ratePct`, 'The rate'));
      const max = rate.measure === 'margin_band' ? HUNDRED : null;
      if (!isDecimalString(t.from) || money(t.from).isNegative() || (max && money(t.from).gt(max))) {
        push({
          code: 'COMMISSION.PLAN_INVALID',
          field: `rate.tiers[${i}].from`,
          message:
            rate.measure === 'margin_band'
              ? 'A margin band starts at a percentage from 0 to 100.'
              : 'A volume tier starts at an amount of 0 or more.',
        });
        return;
      }
      const from = money(t.from);
      if (previous && from.lte(previous)) {
        push({
          code: 'COMMISSION.PLAN_INVALID',
          field: `rate.tiers[${i}].from`,
          message: 'Each tier must start above the one before it.',
        });
      }
      previous = from;
    });
  } else {
    push({ code: 'COMMISSION.PLAN_INVALID', field: 'rate.kind', message: 'The rate is flat or tiered.' });
  }
  return issues;
}

function amountIssue(value: unknown, field: string, label: string): CommissionIssue | null {
  if (!isDecimalString(value) || money(value).isNegative()) {
    return { code: 'COMMISSION.FACTS_INVALID', field, message: `${label} must be an amount of 0 or more.` };
  }
  return null;
}

/** Every problem with a deal under a plan (splits, amounts, monthly volumes); empty when valid. */
export function validateCommissionDeal(plan: CommissionPlan, deal: CommissionDeal): CommissionIssue[] {
  const issues: CommissionIssue[] = [];
  for (const i of [
    amountIssue(deal.netPrice, 'netPrice', 'The net price'),
    amountIssue(deal.cost, 'cost', 'The cost'),
  ])
    if (i) issues.push(i);
  issues.push(...validateSplits(deal.splits));
  if (plan.rate.kind === 'tiered' && plan.rate.measure === 'monthly_volume') {
    deal.splits.forEach((s, i) => {
      if (s.monthVolumeBefore === undefined) {
        issues.push({
          code: 'COMMISSION.VOLUME_MISSING',
          field: `splits[${i}].monthVolumeBefore`,
          message: "A monthly-volume plan needs the salesperson's volume earlier in the month.",
        });
      } else {
        const issue = amountIssue(s.monthVolumeBefore, `splits[${i}].monthVolumeBefore`, 'The volume');
        if (issue) issues.push(issue);
      }
    });
  }
  return issues;
}

/** The gross margin percent as printed: (net − cost) / net × 100, half-up to 2 decimals; null when net = 0. */
export function contractGrossMarginPct(netPrice: Money, cost: Money): Money | null {
  if (netPrice.isZero()) return null;
  return netPrice
    .minus(cost)
    .times(HUNDRED)
    .dividedBy(netPrice)
    .toDecimalPlaces(2, MoneyDecimal.ROUND_HALF_UP);
}

/** Rate % of the band `measure` falls in (highest `from` ≤ measure), 0 below the first band. */
function stepRate(tiers: readonly CommissionTier[], measure: Money): Money {
  let rate = ZERO;
  for (const t of tiers) {
    if (money(t.from).lte(measure)) rate = money(t.ratePct);
    else break;
  }
  return rate;
}

/** Σ (overlap of [start, end) with each band × its rate %): a rate-weighted width. 0 when end ≤ start. */
function bracketWeightedWidth(tiers: readonly CommissionTier[], start: Money, end: Money): Money {
  let sum = ZERO;
  if (end.lte(start)) return sum;
  tiers.forEach((t, i) => {
    const lo = MoneyDecimal.max(money(t.from), start);
    const next = tiers[i + 1];
    const hi = next ? MoneyDecimal.min(money(next.from), end) : end;
    if (hi.gt(lo)) sum = sum.plus(hi.minus(lo).times(money(t.ratePct)));
  });
  return sum;
}

/**
 * The exact (unrounded) commission of one salesperson and the blended rate %: base × share × rate.
 * Everything is multiplied first and divided once, so an exact result stays exact.
 */
function exactPart(
  plan: CommissionPlan,
  deal: CommissionDeal,
  split: CommissionSplit,
  base: Money,
  marginPct: Money | null,
): { exact: Money; ratePct: Money } {
  const share = money(split.sharePct);
  const rate = plan.rate;
  const shareOfBase = base.times(share); // × 100
  if (rate.kind === 'flat') {
    const r = money(rate.ratePct);
    return { exact: shareOfBase.times(r).dividedBy(10_000), ratePct: r };
  }
  let start: Money;
  let end: Money;
  if (rate.measure === 'monthly_volume') {
    start = money(split.monthVolumeBefore ?? '0');
    end = start.plus(money(deal.netPrice).times(share).dividedBy(HUNDRED));
  } else {
    if (marginPct === null) return { exact: ZERO, ratePct: ZERO };
    start = ZERO;
    end = marginPct;
  }
  if (rate.mode === 'step') {
    const r = stepRate(rate.tiers, end);
    return { exact: shareOfBase.times(r).dividedBy(10_000), ratePct: r };
  }
  const width = end.minus(start);
  if (width.lte(0)) return { exact: ZERO, ratePct: ZERO };
  const weighted = bracketWeightedWidth(rate.tiers, start, end);
  return {
    exact: shareOfBase.times(weighted).dividedBy(width.times(10_000)),
    ratePct: weighted.dividedBy(width),
  };
}

/** What the contract pays under the plan: the whole, each salesperson's part and its two milestones. */
export function computeCommission(plan: CommissionPlan, deal: CommissionDeal): CommissionBreakdown {
  throwIfIssues([...validateCommissionPlan(plan), ...validateCommissionDeal(plan, deal)]);
  const net = money(deal.netPrice);
  const cost = money(deal.cost);
  const margin = contractGrossMarginPct(net, cost);
  const base = plan.basis === 'net_price' ? net : MoneyDecimal.max(ZERO, net.minus(cost));
  const exact = deal.splits.map((s) => exactPart(plan, deal, s, base, margin));
  const total = toCents(exact.reduce((a, e) => a.plus(e.exact), ZERO));
  const amounts = allocateByLargestRemainder(
    total,
    exact.map((e) => e.exact),
  );
  const firstPct = money(plan.firstMilestonePct);
  return {
    base: toMoneyString(base),
    grossMarginPct: margin === null ? null : margin.toFixed(2),
    total: total.toFixed(2),
    parts: deal.splits.map((s, i) => {
      const amount = amounts[i] as Money;
      const first = toCents(amount.times(firstPct).dividedBy(HUNDRED));
      return {
        salespersonId: s.salespersonId,
        sharePct: s.sharePct,
        effectiveRatePct: (exact[i] as { ratePct: Money }).ratePct.toString(),
        amount: amount.toFixed(2),
        milestones: [
          { milestone: 'deposit_cleared_window_closed', amount: first.toFixed(2) },
          { milestone: 'job_completed', amount: amount.minus(first).toFixed(2) },
        ],
      };
    }),
  };
}
