// What one option of a proposal costs, lists at, nets and earns.
//
// Rounding rule (stated once, tested in price-option.test.ts): line extensions (quantity × unit amount)
// are never rounded. Each total is computed at full precision (decimal.js, 40 significant digits) from
// the exact line sums or from the printed totals above it, and rounded to cents ONCE, half away from
// zero (toCents, ROUND_HALF_UP):
//   costTotal      = toCents(Σ quantity × unitCost)
//   listTotal      = toCents(Σ quantity × unitPrice)
//   discountTotal  = toCents(listTotal × percent / 100)   or the amount itself (never more than listTotal)
//   netTotal       = listTotal − discountTotal            (a difference of cents: exact, nothing to round)
//   'invoice':        taxTotal = toCents(netTotal × rate / 100), charged to the homeowner
//   'materials_cost': taxTotal = toCents(materialsCostTotal × rate / 100), paid by the contractor
//   customerTotal  = netTotal + taxTotal ('invoice') or netTotal ('materials_cost')
//   grossProfit    = netTotal − costTotal − (taxTotal when the contractor bears it)
// So every printed figure can be checked with a calculator from the printed figures above it, and no
// figure gains or loses a cent against the others. The discount and the invoice tax are taken on the
// printed list and net (the price the homeowner is quoted), not on sub-cent remainders.
// Percentages (grossMarginPct = grossProfit / netTotal, markupPct = grossProfit / costTotal, discountPct =
// discountTotal / listTotal) are rounded half-up to two decimals; they are null when their denominator is 0.
import Decimal from 'decimal.js';
import type { SalesTaxTreatment } from '../branches/branch-rules';
import { isDecimalString, money, MoneyDecimal, toCents, type Money } from '../money';
import { MATERIALS_CATEGORIES } from './price-book';

export const DISCOUNT_KINDS = ['none', 'percent', 'amount'] as const;
export type DiscountKind = (typeof DISCOUNT_KINDS)[number];

export interface OptionDiscount {
  kind: DiscountKind;
  /** Percent of the list total ('percent', 0–100) or dollars ('amount'); ignored for 'none'. */
  value: string;
}

export interface OptionTax {
  treatment: SalesTaxTreatment;
  ratePct: string;
}

export interface PriceLineInput {
  quantity: string;
  unitCost: string;
  unitPrice: string;
  /**
   * The price-book category. A line without one is treated as materials under 'materials_cost' (the
   * cautious reading: it can only lower the margin shown).
   */
  category?: string;
}

export interface PriceOptionInput {
  lines: readonly PriceLineInput[];
  discount: OptionDiscount;
  tax: OptionTax;
  /** Categories taxed as materials under 'materials_cost'. Default MATERIALS_CATEGORIES. */
  materialsCategories?: readonly string[];
}

export interface OptionTotals {
  costTotal: string;
  listTotal: string;
  discountTotal: string;
  /** The discount as a percentage of the list total: the typed percent, or amount / list (half-up, 2 dp). */
  discountPct: string;
  netTotal: string;
  /** The cost of the lines taken as materials (used only by the 'materials_cost' treatment). */
  materialsCostTotal: string;
  taxTotal: string;
  /** Who pays taxTotal: the homeowner on the invoice, or the contractor on its materials. */
  taxBorneBy: 'homeowner' | 'contractor';
  customerTotal: string;
  grossProfit: string;
  grossMarginPct: string | null;
  markupPct: string | null;
}

export type PricingErrorCode = 'PRICING.INVALID_NUMBER' | 'PRICING.DISCOUNT_EXCEEDS_LIST';

/** A figure the pricing refuses, with the field at fault (`lines.2.quantity`, `discount.value`). */
export class PricingError extends Error {
  constructor(
    readonly code: PricingErrorCode,
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'PricingError';
  }
}

const HUNDRED = new MoneyDecimal(100);

function amount(value: unknown, field: string, { positive = false } = {}): Money {
  if (!isDecimalString(value)) {
    throw new PricingError(
      'PRICING.INVALID_NUMBER',
      field,
      `${field} must be a decimal written as a string.`,
    );
  }
  const v = money(value);
  if (v.isNegative() || (positive && v.isZero())) {
    throw new PricingError(
      'PRICING.INVALID_NUMBER',
      field,
      `${field} must be ${positive ? 'greater than 0' : 'zero or more'}.`,
    );
  }
  return v;
}

/** Two decimals, half-up; "-0.00" never appears. */
export function formatPct(value: Money): string {
  const r = value.toDecimalPlaces(2, Decimal.ROUND_HALF_UP);
  return (r.isZero() ? new MoneyDecimal(0) : r).toFixed(2);
}

const cents = (v: Money) => (v.isZero() ? new MoneyDecimal(0) : v).toFixed(2);

export function priceOption(input: PriceOptionInput): OptionTotals {
  const materials = new Set<string>(input.materialsCategories ?? MATERIALS_CATEGORIES);
  let costExact = new MoneyDecimal(0);
  let listExact = new MoneyDecimal(0);
  let materialsExact = new MoneyDecimal(0);
  input.lines.forEach((line, i) => {
    const quantity = amount(line.quantity, `lines.${i}.quantity`, { positive: true });
    const cost = quantity.times(amount(line.unitCost, `lines.${i}.unitCost`));
    costExact = costExact.plus(cost);
    listExact = listExact.plus(quantity.times(amount(line.unitPrice, `lines.${i}.unitPrice`)));
    if (line.category === undefined || materials.has(line.category))
      materialsExact = materialsExact.plus(cost);
  });
  const costTotal = toCents(costExact);
  const listTotal = toCents(listExact);
  const materialsCostTotal = toCents(materialsExact);

  let discountTotal = new MoneyDecimal(0);
  let discountPct: Money | null = new MoneyDecimal(0);
  if (input.discount.kind === 'percent') {
    const pct = amount(input.discount.value, 'discount.value');
    if (pct.greaterThan(HUNDRED)) {
      throw new PricingError(
        'PRICING.DISCOUNT_EXCEEDS_LIST',
        'discount.value',
        'A discount cannot be more than 100% of the list price.',
      );
    }
    discountTotal = toCents(listTotal.times(pct).dividedBy(HUNDRED));
    discountPct = pct;
  } else if (input.discount.kind === 'amount') {
    discountTotal = toCents(amount(input.discount.value, 'discount.value'));
    if (discountTotal.greaterThan(listTotal)) {
      throw new PricingError(
        'PRICING.DISCOUNT_EXCEEDS_LIST',
        'discount.value',
        `A discount cannot be more than the list price (${listTotal.toFixed(2)}).`,
      );
    }
    discountPct = listTotal.isZero() ? null : discountTotal.dividedBy(listTotal).times(HUNDRED);
  } else if (input.discount.kind !== 'none') {
    throw new PricingError('PRICING.INVALID_NUMBER', 'discount.kind', 'Unknown kind of discount.');
  }
  const netTotal = listTotal.minus(discountTotal);

  const rate = amount(input.tax.ratePct, 'tax.ratePct');
  const contractorPays = input.tax.treatment === 'materials_cost';
  const taxTotal = toCents((contractorPays ? materialsCostTotal : netTotal).times(rate).dividedBy(HUNDRED));
  const customerTotal = contractorPays ? netTotal : netTotal.plus(taxTotal);
  const contractorTax = contractorPays ? taxTotal : new MoneyDecimal(0);
  const grossProfit = netTotal.minus(costTotal).minus(contractorTax);

  return {
    costTotal: cents(costTotal),
    listTotal: cents(listTotal),
    discountTotal: cents(discountTotal),
    // A zero list with an amount of zero off is no discount at all.
    discountPct: formatPct(discountPct ?? new MoneyDecimal(0)),
    netTotal: cents(netTotal),
    materialsCostTotal: cents(materialsCostTotal),
    taxTotal: cents(taxTotal),
    taxBorneBy: contractorPays ? 'contractor' : 'homeowner',
    customerTotal: cents(customerTotal),
    grossProfit: cents(grossProfit),
    grossMarginPct: netTotal.isZero() ? null : formatPct(grossProfit.dividedBy(netTotal).times(HUNDRED)),
    markupPct: costTotal.isZero() ? null : formatPct(grossProfit.dividedBy(costTotal).times(HUNDRED)),
  };
}

/**
 * The margin and markup identities (REFERENCE-VALUES.md, "Money": algebraic identities, worked examples
 * published in many pricing guides): price = cost / (1 − margin); markup = margin / (1 − margin);
 * margin = markup / (1 + markup). Percentages in and out, at full precision (no rounding): round for
 * display with formatPct.
 */
type Ratio = string | Decimal;
/** A string must be a plain decimal; a Decimal passes at full precision. */
const ratio = (v: Ratio): Money => (typeof v === 'string' ? money(v) : new MoneyDecimal(v));

export function priceForMargin(cost: Ratio, marginPct: Ratio): Money {
  const m = ratio(marginPct).dividedBy(HUNDRED);
  if (m.greaterThanOrEqualTo(1)) throw new RangeError('A margin of 100% or more has no price.');
  return ratio(cost).dividedBy(new MoneyDecimal(1).minus(m));
}

export function markupFromMargin(marginPct: Ratio): Money {
  const m = ratio(marginPct).dividedBy(HUNDRED);
  if (m.greaterThanOrEqualTo(1)) throw new RangeError('A margin of 100% or more has no markup.');
  return m.dividedBy(new MoneyDecimal(1).minus(m)).times(HUNDRED);
}

export function marginFromMarkup(markupPct: Ratio): Money {
  const k = ratio(markupPct).dividedBy(HUNDRED);
  if (k.lessThanOrEqualTo(-1)) throw new RangeError('A markup of −100% or less has no margin.');
  return k.dividedBy(new MoneyDecimal(1).plus(k)).times(HUNDRED);
}
