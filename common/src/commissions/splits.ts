// Splitting one commission between salespeople, to the cent.
//
// Shares are percent strings ("60", "33.34") that must add up to exactly 100 (decimal arithmetic, no
// tolerance). An amount is split by the largest-remainder method (Hamilton's method): each part gets
// the whole cents of its exact share, then the cents still missing go one each to the parts with the
// largest remainders; equal remainders are broken by the order of the salespeople on the contract
// (the first listed wins). So the parts always add up to the whole, none is more than a cent from its
// exact share, and the same input always gives the same cents.
import { isDecimalString, money, MoneyDecimal, toCents, type Money } from '../money';
import { CommissionError, throwIfIssues, type CommissionIssue } from './errors';

export interface CommissionSplitShare {
  salespersonId: string;
  /** Percent of the commission, a decimal string greater than 0 and at most 100. */
  sharePct: string;
}

export interface SplitPart {
  salespersonId: string;
  /** Dollars, two decimals: "123.45". */
  amount: string;
}

const HUNDRED = new MoneyDecimal(100);

/** Every problem with a split, in order; empty when the split is valid. */
export function validateSplits(splits: readonly CommissionSplitShare[], field = 'splits'): CommissionIssue[] {
  const issues: CommissionIssue[] = [];
  if (splits.length === 0) {
    return [{ code: 'COMMISSION.SPLIT_EMPTY', field, message: 'At least one salesperson is needed.' }];
  }
  const seen = new Set<string>();
  let sum = new MoneyDecimal(0);
  let sharesValid = true;
  splits.forEach((s, i) => {
    if (typeof s.salespersonId !== 'string' || s.salespersonId.trim() === '') {
      issues.push({
        code: 'COMMISSION.SPLIT_SHARE_INVALID',
        field: `${field}[${i}].salespersonId`,
        message: 'Choose a salesperson.',
      });
    } else if (seen.has(s.salespersonId)) {
      issues.push({
        code: 'COMMISSION.SPLIT_DUPLICATE_SALESPERSON',
        field: `${field}[${i}].salespersonId`,
        message: 'This salesperson is already in the split.',
      });
    } else {
      seen.add(s.salespersonId);
    }
    if (!isDecimalString(s.sharePct) || money(s.sharePct).lte(0) || money(s.sharePct).gt(HUNDRED)) {
      sharesValid = false;
      issues.push({
        code: 'COMMISSION.SPLIT_SHARE_INVALID',
        field: `${field}[${i}].sharePct`,
        message: 'A share is a percentage greater than 0 and at most 100, such as "50" or "33.34".',
      });
    } else {
      sum = sum.plus(money(s.sharePct));
    }
  });
  if (sharesValid && !sum.eq(HUNDRED)) {
    issues.push({
      code: 'COMMISSION.SPLIT_SUM_NOT_100',
      field,
      message: `The shares add up to ${sum.toString()}%, not 100%.`,
    });
  }
  return issues;
}

/**
 * Largest remainder: `total` (dollars, already whole cents, ≥ 0) in proportion to `exactParts` (dollars,
 * any precision, ≥ 0). The caller makes `total` the rounded sum of the exact parts (or the exact parts
 * add up to it). Returns whole-cent amounts, in the order given, adding up to `total` exactly.
 */
export function allocateByLargestRemainder(total: Money, exactParts: readonly Money[]): Money[] {
  const totalCents = total.times(HUNDRED);
  if (!totalCents.isInteger() || totalCents.isNegative()) {
    throw new RangeError(`The total to allocate must be whole cents, not negative: ${total.toString()}`);
  }
  if (exactParts.length === 0) {
    if (!totalCents.isZero()) throw new RangeError('Nothing to allocate a non-zero total to.');
    return [];
  }
  const floors = exactParts.map((p) => {
    if (p.isNegative()) throw new RangeError(`A part cannot be negative: ${p.toString()}`);
    return p.times(HUNDRED).floor();
  });
  const remainders = exactParts.map((p, i) => p.times(HUNDRED).minus(floors[i] as Money));
  let missing = totalCents.minus(floors.reduce((a, b) => a.plus(b), new MoneyDecimal(0)));
  if (missing.isNegative() || missing.gt(exactParts.length)) {
    throw new RangeError('The total is not the rounded sum of the parts.');
  }
  // Largest remainder first; equal remainders: the earlier part first (a stable, explicit tie-break).
  const order = exactParts
    .map((_, i) => i)
    .sort((a, b) => (remainders[b] as Money).comparedTo(remainders[a] as Money) || a - b);
  const cents = floors.slice();
  for (const i of order) {
    if (missing.lte(0)) break;
    cents[i] = (cents[i] as Money).plus(1);
    missing = missing.minus(1);
  }
  return cents.map((c) => c.dividedBy(HUNDRED));
}

/** Split `amount` (dollars, ≥ 0) by the shares; throws CommissionError on an invalid split. */
export function splitAmount(amount: string, splits: readonly CommissionSplitShare[]): SplitPart[] {
  throwIfIssues(validateSplits(splits));
  if (!isDecimalString(amount) || money(amount).isNegative()) {
    throw new CommissionError([
      { code: 'COMMISSION.FACTS_INVALID', field: 'amount', message: 'The amount must be 0 or more.' },
    ]);
  }
  const whole = toCents(money(amount));
  const exact = splits.map((s) => whole.times(money(s.sharePct)).dividedBy(HUNDRED));
  return allocateByLargestRemainder(whole, exact).map((a, i) => ({
    salespersonId: (splits[i] as CommissionSplitShare).salespersonId,
    amount: a.toFixed(2),
  }));
}
