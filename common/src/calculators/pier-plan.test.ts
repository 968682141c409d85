import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Decimal from 'decimal.js';
import { pierPlan } from './pier-plan';
import { CalculatorInputError } from './errors';

describe('pierPlan', () => {
  // Same counting as injection points: open floor(L/s)+1, closed ceil(L/s).
  it.each([
    ['36', '6', false, 7, '0'],
    ['36', '6', true, 6, null],
    ['40', '6', false, 7, '4'],
    ['40', '6', true, 7, null],
    ['6', '6', false, 2, '0'],
    ['5.5', '6', false, 1, '5.5'],
    ['0.3', '0.1', false, 4, '0'], // a float division would give 2.999… and 3 piers
  ])('%s ft at %s ft, closed %s → %i piers', (runLengthFt, spacingFt, closed, piers, endGapFt) => {
    const plan = pierPlan({ runLengthFt, spacingFt, closed });
    expect(plan.piers).toBe(piers);
    expect(plan.endGapFt).toBe(endGapFt);
  });

  it('needs a spacing: pier spacing comes from the design, so there is no default', () => {
    expect(() => pierPlan({ runLengthFt: '40' } as never)).toThrow(CalculatorInputError);
  });

  it.each([
    [{ runLengthFt: '0', spacingFt: '6' }],
    [{ runLengthFt: '40', spacingFt: '0' }],
    [{ runLengthFt: '40', spacingFt: '6', closed: 1 }],
  ])('refuses %j', (input) => {
    expect(() => pierPlan(input as never)).toThrow(CalculatorInputError);
  });

  it('carries the 811 and engineer cautions', () => {
    const text = pierPlan({ runLengthFt: '40', spacingFt: '6' }).cautions.join(' ');
    expect(text).toContain('811');
    expect(text).toContain('engineer');
  });

  it('never gives fewer piers for a longer run', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 100_000 }),
        fc.integer({ min: 1, max: 100_000 }),
        fc.integer({ min: 10, max: 200 }),
        fc.boolean(),
        (a, b, s, closed) => {
          const spacingFt = new Decimal(s).div(10).toFixed();
          const [short, long] = a <= b ? [a, b] : [b, a];
          return (
            pierPlan({ runLengthFt: String(short), spacingFt, closed }).piers <=
            pierPlan({ runLengthFt: String(long), spacingFt, closed }).piers
          );
        },
      ),
    );
  });
});
