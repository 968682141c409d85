import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CalcDecimal, ceilDivide, floorDivide, formatCalcDecimal, parseStrictDecimal } from './decimal';

describe('parseStrictDecimal', () => {
  it.each([
    ['12.50', {}, '12.5'],
    ['0', {}, '0'],
    ['007', {}, '7'],
    ['-3.25', { allowNegative: true }, '-3.25'],
    ['123456789012.123456', {}, '123456789012.123456'],
  ])('accepts %j', (text, options, expected) => {
    const parsed = parseStrictDecimal(text, options);
    expect(parsed.ok && parsed.value.toFixed()).toBe(expected);
  });

  it.each([
    ['', 'is empty'],
    ['1e3', 'not a plain decimal'],
    ['1E3', 'not a plain decimal'],
    [' 12', 'not a plain decimal'],
    ['12 ', 'not a plain decimal'],
    ['+12', 'not a plain decimal'],
    ['12.', 'not a plain decimal'],
    ['.5', 'not a plain decimal'],
    ['1.2.3', 'not a plain decimal'],
    ['1,000', 'not a plain decimal'],
    ['Infinity', 'not a plain decimal'],
    ['NaN', 'not a plain decimal'],
    ['0x10', 'not a plain decimal'],
    ['-1', 'cannot be negative'],
    ['1.1234567', 'more than 6 digits after'],
    ['1234567890123', 'more than 12 digits before'],
  ])('refuses %j (%s)', (text, message) => {
    const parsed = parseStrictDecimal(text);
    expect(parsed.ok).toBe(false);
    expect(!parsed.ok && parsed.message).toContain(message);
  });

  it.each([[12.5], [0], [null], [undefined], [{}]])('refuses the non-string %j', (value) => {
    const parsed = parseStrictDecimal(value);
    expect(parsed.ok).toBe(false);
  });

  it('tells a caller passing a number to pass a string instead', () => {
    const parsed = parseStrictDecimal(12.5);
    expect(!parsed.ok && parsed.message).toContain('string');
  });
});

describe('formatCalcDecimal', () => {
  it.each([
    ['12.5', 2, '12.50'],
    ['0.005', 2, '0.01'], // half up
    ['-0.001', 2, '0.00'], // never "-0.00"
    ['1e-30', undefined, '0.000000000000000000000000000001'], // never exponent notation
    ['65000', undefined, '65000'],
  ])('formatCalcDecimal(%s, %s) = %s', (value, places, expected) => {
    expect(formatCalcDecimal(new CalcDecimal(value), places)).toBe(expected);
  });
});

describe('floorDivide / ceilDivide', () => {
  it.each([
    ['100', '5', '20', '20'],
    ['12', '5', '2', '3'],
    ['0.3', '0.1', '3', '3'], // a float would give 2.9999999999999996
    ['10', '3.3333', '3', '4'],
    ['0', '5', '0', '0'],
  ])('%s / %s: floor %s, ceil %s', (a, b, floor, ceil) => {
    expect(floorDivide(new CalcDecimal(a), new CalcDecimal(b)).toFixed()).toBe(floor);
    expect(ceilDivide(new CalcDecimal(a), new CalcDecimal(b)).toFixed()).toBe(ceil);
  });

  it('floor(a/b)·b ≤ a < (floor(a/b)+1)·b for any a ≥ 0, b > 0', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 10_000_000 }), fc.integer({ min: 1, max: 100_000 }), (ai, bi) => {
        const a = new CalcDecimal(ai).div(100);
        const b = new CalcDecimal(bi).div(1000);
        const q = floorDivide(a, b);
        return q.mul(b).lte(a) && q.plus(1).mul(b).gt(a);
      }),
    );
  });
});
