import { describe, expect, it } from 'vitest';
import { formatWarrantyNumber, warrantyEndsOn, warrantySequence } from './warranty';

describe('warranty numbers', () => {
  it.each([
    ['MRW', 1, 'W-MRW-0001'],
    ['NG1', 42, 'W-NG1-0042'],
    ['MRW', 12345, 'W-MRW-12345'],
  ] as const)('%s #%s → %s, and back', (code, seq, number) => {
    expect(formatWarrantyNumber(code, seq)).toBe(number);
    expect(warrantySequence(code, number)).toBe(seq);
  });

  it('refuses what is not a number of the branch', () => {
    expect(warrantySequence('MRW', 'W-NG1-0001')).toBeNull();
    expect(warrantySequence('MRW', 'W-MRW-12')).toBeNull();
    expect(() => formatWarrantyNumber('MRW', 0)).toThrow();
    expect(() => formatWarrantyNumber('mrw', 1)).toThrow();
  });
});

describe('warrantyEndsOn', () => {
  it.each([
    ['2026-07-20', 10, '2036-07-20'],
    ['2028-02-29', 4, '2032-02-29'], // 2032 is a leap year
    ['2028-02-29', 1, '2029-03-01'], // no 29 February in 2029: the longer reading
    ['2000-02-29', 100, '2100-03-01'], // 2100 is not a leap year (divisible by 100, not by 400)
    ['2026-12-31', 1, '2027-12-31'],
  ] as const)('%s + %s years → %s', (from, years, expected) => {
    expect(warrantyEndsOn(from, years)).toBe(expected);
  });
});
