import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { money, MoneyDecimal } from '../money';
import { CommissionError } from './errors';
import { allocateByLargestRemainder, splitAmount, validateSplits } from './splits';

const s = (salespersonId: string, sharePct: string) => ({ salespersonId, sharePct });

describe('splitAmount (largest remainder, ties to the first salesperson listed)', () => {
  it.each([
    // amount, shares, parts — computed by hand
    ['100.00', ['60', '40'], ['60.00', '40.00']], // exact
    ['100.01', ['50', '50'], ['50.01', '50.00']], // 50.005 each: floors 50.00 + 50.00, 1 cent left, tie → first
    ['0.01', ['50', '50'], ['0.01', '0.00']], // 0.005 each: tie → first
    // 0.02 × 33.34% = 0.006668, × 33.33% = 0.006666 twice → floors 0; 2 cents left: the largest remainder
    // (0.6668 ¢) first, then the tie 0.6666 ¢ / 0.6666 ¢ → the second salesperson before the third.
    ['0.02', ['33.34', '33.33', '33.33'], ['0.01', '0.01', '0.00']],
    ['100.00', ['33.33', '33.33', '33.34'], ['33.33', '33.33', '33.34']], // exact
    // 10.00 × 33.333% = 3.3333 (twice), × 33.334% = 3.3334 → floors 9.99, 1 cent to the largest (0.34 ¢)
    ['10.00', ['33.333', '33.333', '33.334'], ['3.33', '3.33', '3.34']],
    // 75.01 × 60% = 45.006, × 40% = 30.004 → floors 75.00; remainders 0.6 ¢ and 0.4 ¢ → the first
    ['75.01', ['60', '40'], ['45.01', '30.00']],
    ['0.00', ['70', '30'], ['0.00', '0.00']],
    ['1234.56', ['100'], ['1234.56']],
  ] as const)('%s split %j → %j', (amount, shares, parts) => {
    const splits = shares.map((p, i) => s(`sp${i + 1}`, p));
    const result = splitAmount(amount, splits);
    expect(result.map((r) => r.amount)).toEqual(parts);
    expect(result.map((r) => r.salespersonId)).toEqual(splits.map((x) => x.salespersonId));
  });

  it('refuses a negative amount and an invalid split', () => {
    expect(() => splitAmount('-1.00', [s('a', '100')])).toThrow(CommissionError);
    expect(() => splitAmount('1.00', [s('a', '60')])).toThrow(/not 100%/);
  });
});

describe('validateSplits', () => {
  it.each([
    [[], ['COMMISSION.SPLIT_EMPTY']],
    [[s('a', '60'), s('b', '30')], ['COMMISSION.SPLIT_SUM_NOT_100']],
    [[s('a', '33.33'), s('b', '33.33'), s('c', '33.33')], ['COMMISSION.SPLIT_SUM_NOT_100']], // 99.99
    [[s('a', '60'), s('a', '40')], ['COMMISSION.SPLIT_DUPLICATE_SALESPERSON']],
    [[s('a', '0'), s('b', '100')], ['COMMISSION.SPLIT_SHARE_INVALID']],
    [
      [s('a', '-10'), s('b', '110')],
      ['COMMISSION.SPLIT_SHARE_INVALID', 'COMMISSION.SPLIT_SHARE_INVALID'],
    ],
    [[s('a', '1e2')], ['COMMISSION.SPLIT_SHARE_INVALID']],
    [[s('', '100')], ['COMMISSION.SPLIT_SHARE_INVALID']],
    [[s('a', '100.0')], []],
    [[s('a', '66.67'), s('b', '33.33')], []],
  ] as const)('%j → %j', (splits, codes) => {
    expect(validateSplits(splits).map((i) => i.code)).toEqual(codes);
  });

  it('refuses a share given as a number (it may already have lost a digit)', () => {
    const split = [{ salespersonId: 'a', sharePct: 100 as unknown as string }];
    expect(validateSplits(split).map((i) => i.field)).toEqual(['splits[0].sharePct']);
  });
});

describe('allocateByLargestRemainder', () => {
  it('refuses a total that is not whole cents or not the rounded sum', () => {
    expect(() => allocateByLargestRemainder(money('1.005'), [money('1.005')])).toThrow(RangeError);
    expect(() => allocateByLargestRemainder(money('5.00'), [money('1.00')])).toThrow(RangeError);
  });
});

// Shares in hundredths of a percent that add up to 100.00%: k − 1 distinct cut points in 1…9999.
const sharesArb = fc.uniqueArray(fc.integer({ min: 1, max: 9999 }), { maxLength: 6 }).map((cuts) => {
  const points = [0, ...[...cuts].sort((a, b) => a - b), 10_000];
  return points.slice(1).map((p, i) => new MoneyDecimal(p - (points[i] as number)).dividedBy(100).toString());
});
// Amounts as whole cents, built as a decimal string (test data only).
const amountArb = fc
  .bigInt({ min: 0n, max: 99_999_999_999n })
  .map((c) => new MoneyDecimal(c.toString()).dividedBy(100).toFixed(2));

describe('properties', () => {
  it('a split never gains or loses a cent, and no part is a cent or more from its exact share', () => {
    fc.assert(
      fc.property(amountArb, sharesArb, (amount, shares) => {
        const splits = shares.map((p, i) => s(`sp${i}`, p));
        const parts = splitAmount(amount, splits);
        const sum = parts.reduce((a, p) => a.plus(p.amount), new MoneyDecimal(0));
        expect(sum.toFixed(2)).toBe(amount);
        parts.forEach((p, i) => {
          const exact = money(amount)
            .times(shares[i] as string)
            .dividedBy(100);
          expect(money(p.amount).minus(exact).abs().lt('0.01')).toBe(true);
        });
      }),
      { numRuns: 300 },
    );
  });
});
