import { describe, expect, it } from 'vitest';
import { labourEstimate, plannedCounts, type PlanLineLike } from './plan';

const line = (category: string, unit: string, quantity: string, unitCost = '0'): PlanLineLike => ({
  category,
  unit,
  quantity,
  unitCost,
});

describe('labourEstimate', () => {
  it.each<[string, PlanLineLike[], { hours: string | null; costPerHour: string | null }]>([
    ['no hour line', [line('soil_stabilisation', 'lb', '240', '5.20')], { hours: null, costPerHour: null }],
    [
      'one hour line',
      [line('soil_stabilisation', 'hour', '16', '55')],
      { hours: '16.00', costPerHour: '55.00' },
    ],
    // (10 × 50 + 6 × 60) / 16 = 860 / 16 = 53.75, by hand
    [
      'two at different rates: weighted',
      [line('piers', 'hour', '10', '50'), line('soil_stabilisation', 'hour', '6', '60')],
      { hours: '16.00', costPerHour: '53.75' },
    ],
    // 100 / 3 = 33.333… → 33.33 (half up)
    [
      'a cost per hour rounded to the cent',
      [line('piers', 'hour', '1', '0'), line('piers', 'hour', '2', '50')],
      { hours: '3.00', costPerHour: '33.33' },
    ],
  ])('%s', (_label, lines, expected) => {
    expect(labourEstimate(lines)).toEqual(expected);
  });
});

describe('plannedCounts', () => {
  it('counts points, piers, piles and pounds by category and unit', () => {
    expect(
      plannedCounts([
        line('soil_stabilisation', 'lb', '240.500'),
        line('soil_stabilisation', 'lb', '60'),
        line('soil_stabilisation', 'point', '12'),
        line('soil_stabilisation', 'hour', '16'),
        line('piers', 'each', '8'),
        line('helical_piles', 'each', '4'),
        line('mobilisation', 'lump_sum', '1'),
      ]),
    ).toEqual({ injectionPoints: '12', pushPiers: '8', helicalPiles: '4', materialLb: '300.5' });
  });
  it('zeros for an empty plan', () => {
    expect(plannedCounts([])).toEqual({
      injectionPoints: '0',
      pushPiers: '0',
      helicalPiles: '0',
      materialLb: '0',
    });
  });
});
