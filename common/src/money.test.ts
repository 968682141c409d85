import { describe, expect, it } from 'vitest';
import { formatUsd, money, toMinorUnits, toMoneyString } from './money';

describe('money', () => {
  it.each([
    ['0.005', '0.01'], // half away from zero (ROUND_HALF_UP), the usual commercial rounding
    ['-0.005', '-0.01'],
    ['1234.5', '1234.50'],
    ['0.1', '0.10'],
  ])('toMoneyString(%s) = %s', (input, expected) => {
    expect(toMoneyString(input)).toBe(expected);
  });

  it('adds 0.1 + 0.2 exactly (a float would give 0.30000000000000004)', () => {
    expect(money('0.1').plus('0.2').toString()).toBe('0.3');
  });

  it.each(['1e3', '', ' 12', '12.', 'abc', '1,000'])('refuses %j', (input) => {
    expect(() => money(input)).toThrow(TypeError);
  });

  it('gives minor units as processors take them (Stripe API reference: 100 means $1.00)', () => {
    expect(toMinorUnits('1.00')).toBe('100');
    expect(toMinorUnits('1234.565')).toBe('123457');
  });

  it('formats dollars with grouping', () => {
    expect(formatUsd('1234567.8')).toBe('$1,234,567.80');
    expect(formatUsd('-5')).toBe('−$5.00');
  });
});
