import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Decimal from 'decimal.js';
import { injectionPlan } from './injection-plan';
import { CalculatorInputError } from './errors';

describe('injectionPlan', () => {
  // Defaults: 5 ft spacing, 5 ft depth, 20 lb per point (common practice, REFERENCE-VALUES.md);
  // 1000 lb per drum set (our assumption, not published).
  it.each([
    // runLengthFt, closed, points, totalLb, drumSets, endGapFt
    ['100', false, 21, '420', 1, '0'], // open: floor(100/5)+1
    ['100', true, 20, '400', 1, null], // closed perimeter: ceil(100/5)
    ['102', false, 21, '420', 1, '2'], // last point 2 ft short of the end
    ['102', true, 21, '420', 1, null], // ceil(102/5) = 21
    ['3', false, 1, '20', 1, '3'], // shorter than one spacing: one point
    ['3', true, 1, '20', 1, null],
    ['250', false, 51, '1020', 2, '0'], // 1020 lb needs a second drum set
    ['245', false, 50, '1000', 1, '0'], // exactly one drum set
  ])(
    'run %s ft, closed %s → %i points, %s lb, %i drum sets',
    (runLengthFt, closed, points, totalLb, drumSets, endGapFt) => {
      const plan = injectionPlan({ runLengthFt, closed });
      expect(plan.points).toBe(points);
      expect(plan.totalLb).toBe(totalLb);
      expect(plan.drumSets).toBe(drumSets);
      expect(plan.endGapFt).toBe(endGapFt);
      expect(plan.spacingFt).toBe('5');
      expect(plan.depthFt).toBe('5');
      expect(plan.lbPerPoint).toBe('20');
      expect(plan.lbPerDrumSet).toBe('1000');
    },
  );

  it('uses the given spacing, depth, material and drum-set size', () => {
    const plan = injectionPlan({
      runLengthFt: '40.5',
      spacingFt: '4.5',
      depthFt: '6',
      lbPerPoint: '22.5',
      lbPerDrumSet: '900',
    });
    expect(plan.points).toBe(10); // floor(40.5 / 4.5) + 1
    expect(plan.totalLb).toBe('225');
    expect(plan.drumSets).toBe(1);
    expect(plan.leftoverLb).toBe('675');
    expect(plan.totalRodDepthFt).toBe('60');
    expect(plan.assumptions.join(' ')).not.toContain('our assumption');
  });

  it('says which defaults it assumed, and names the drum-set size as our assumption', () => {
    const plan = injectionPlan({ runLengthFt: '10' });
    expect(plan.assumptions.some((a) => a.includes('common practice'))).toBe(true);
    expect(plan.assumptions.some((a) => a.includes('not a published figure'))).toBe(true);
  });

  it('carries the safety cautions (811, isocyanates, lifting, engineer)', () => {
    const text = injectionPlan({ runLengthFt: '10' }).cautions.join(' ');
    expect(text).toContain('811');
    expect(text).toContain('isocyanates');
    expect(text).toContain('licensed engineer');
  });

  it.each([
    [{ runLengthFt: '0' }, 'runLengthFt', 'greater than 0'], // a zero-length run is refused, not one point
    [{ runLengthFt: '-5' }, 'runLengthFt', 'negative'],
    [{ runLengthFt: '1e2' }, 'runLengthFt', 'not a plain decimal'],
    [{ runLengthFt: 100 }, 'runLengthFt', 'string'],
    [{}, 'runLengthFt', 'required'],
    [{ runLengthFt: '100', spacingFt: '0' }, 'spacingFt', 'greater than 0'],
    [{ runLengthFt: '100', lbPerPoint: '' }, 'lbPerPoint', 'empty'],
    [{ runLengthFt: '100', lbPerDrumSet: '0' }, 'lbPerDrumSet', 'greater than 0'],
    [{ runLengthFt: '100', depthFt: '500' }, 'depthFt', 'not be more than 200'],
    [{ runLengthFt: '100', closed: 'yes' }, 'closed', 'true or false'],
    [{ runLengthFt: '1000000', spacingFt: '1' }, 'spacingFt', 'more than 100000 points'],
  ])('refuses %j', (input, field, message) => {
    try {
      injectionPlan(input as never);
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(CalculatorInputError);
      const e = error as CalculatorInputError;
      expect(e.code).toBe('CALC.INVALID_INPUT');
      const detail = e.details.find((d) => d.field === field);
      expect(detail?.message).toContain(message);
    }
  });

  it('reports every bad field at once', () => {
    try {
      injectionPlan({ runLengthFt: 'x', spacingFt: '-1', lbPerPoint: '0' });
      expect.unreachable();
    } catch (error) {
      expect((error as CalculatorInputError).details.map((d) => d.field)).toEqual([
        'runLengthFt',
        'spacingFt',
        'lbPerPoint',
      ]);
    }
  });

  const lengthTenths = fc.integer({ min: 1, max: 50_000 }).map((n) => new Decimal(n).div(10).toFixed());
  const spacingTenths = fc.integer({ min: 5, max: 200 }).map((n) => new Decimal(n).div(10).toFixed());

  it('never gives fewer points for a longer run (open or closed)', () => {
    fc.assert(
      fc.property(lengthTenths, lengthTenths, spacingTenths, fc.boolean(), (a, b, spacingFt, closed) => {
        const [short, long] = new Decimal(a).lte(b) ? [a, b] : [b, a];
        return (
          injectionPlan({ runLengthFt: short, spacingFt, closed }).points <=
          injectionPlan({ runLengthFt: long, spacingFt, closed }).points
        );
      }),
    );
  });

  it('totalLb is exactly points × lbPerPoint, and the drum sets hold it with less than one set spare', () => {
    const lbPerPoint = fc.integer({ min: 1, max: 100_000 }).map((n) => new Decimal(n).div(100).toFixed());
    fc.assert(
      fc.property(
        lengthTenths,
        spacingTenths,
        lbPerPoint,
        fc.boolean(),
        (runLengthFt, spacingFt, lb, closed) => {
          const plan = injectionPlan({ runLengthFt, spacingFt, lbPerPoint: lb, closed });
          const total = new Decimal(plan.totalLb);
          const held = new Decimal(plan.drumSets).mul(plan.lbPerDrumSet);
          return (
            total.eq(new Decimal(lb).mul(plan.points)) &&
            held.gte(total) &&
            held.minus(plan.lbPerDrumSet).lt(total)
          );
        },
      ),
    );
  });

  it('an open run never has an end gap as long as the spacing', () => {
    fc.assert(
      fc.property(lengthTenths, spacingTenths, (runLengthFt, spacingFt) => {
        const plan = injectionPlan({ runLengthFt, spacingFt });
        const gap = new Decimal(plan.endGapFt ?? 'NaN');
        return gap.gte(0) && gap.lt(spacingFt);
      }),
    );
  });
});
