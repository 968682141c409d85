import { describe, expect, it } from 'vitest';
import { money } from '../money';
import { markupFromMargin, marginFromMarkup, priceForMargin } from '../pricing/price-option';
import { actualMeasureOf, jobActuals, summariseActuals, type ActualsPlanLine } from './actuals';

// An invented injection job, checked by hand:
//   PU-LB   polyurethane  240 lb    × 4.00  =   960.00
//   PU-PT   points         12 point × 10.00 =   120.00
//   MOB     mobilisation    1 lump  × 300.00 =  300.00
//   CREW-HR crew hours     16 hour  × 45.00 =   720.00
//   estimated cost                           = 2,100.00
// Contract price 4,200.00 (no invoice tax) → estimated margin (4200 − 2100) / 4200 = 50.00 %.
// The log: 300.5 lb, 14 points, 20.5 hours in the day notes:
//   300.5 × 4 = 1,202.00; 14 × 10 = 140.00; 300.00 (not measured); 20.5 × 45 = 922.50
//   actual cost = 1202 + 140 + 300 + 922.50 = 2,564.50
//   actual gross profit = 4200 − 2564.50 = 1,635.50; margin 1635.50 / 4200 = 0.389404… → 38.94 %.
const PLAN: ActualsPlanLine[] = [
  {
    code: 'PU-LB',
    description: 'Polyurethane',
    category: 'soil_stabilisation',
    unit: 'lb',
    quantity: '240.000',
    unitCost: '4.00',
  },
  {
    code: 'PU-PT',
    description: 'Injection point',
    category: 'soil_stabilisation',
    unit: 'point',
    quantity: '12.000',
    unitCost: '10.00',
  },
  {
    code: 'MOB',
    description: 'Mobilisation',
    category: 'mobilisation',
    unit: 'lump_sum',
    quantity: '1.000',
    unitCost: '300.00',
  },
  {
    code: 'CREW-HR',
    description: 'Crew hours',
    category: 'mobilisation',
    unit: 'hour',
    quantity: '16.000',
    unitCost: '45.00',
  },
];
const LOG = { injectionPoints: 14, pounds: '300.50', pushPiers: 0, helicalPiles: 0, labourHours: '20.50' };

describe('jobActuals: the hand-checked example', () => {
  const a = jobActuals({ jobId: 'j1', price: '4200.00', plan: PLAN, log: LOG });

  it('prices the measured lines at the logged quantities and the rest as planned', () => {
    expect(a.estimatedCost).toBe('2100.00');
    expect(a.actualCost).toBe('2564.50');
    expect(a.estimatedMarginPct).toBe('50.00');
    expect(a.actualMarginPct).toBe('38.94');
    expect(a.estimatedGrossProfit).toBe('2100.00');
    expect(a.actualGrossProfit).toBe('1635.50');
    expect(a.lines.map((l) => [l.code, l.plannedQty, l.actualQty, l.actualCost, l.measuredBy])).toEqual([
      ['PU-LB', '240', '300.5', '1202.00', 'lb'],
      ['PU-PT', '12', '14', '140.00', 'injection_points'],
      ['MOB', '1', '1', '300.00', null],
      ['CREW-HR', '16', '20.5', '922.50', 'labour_hours'],
    ]);
    expect(a.material).toEqual({ plannedLb: '240', usedLb: '300.5', unitCost: '4.00' });
    expect(a.labour).toEqual({ estimatedHours: '16', actualHours: '20.5', costPerHour: '45.00' });
    expect(a.injectionPoints).toEqual({ planned: '12', installed: 14 });
    expect(a.piers).toEqual({ planned: '0', installed: 0 });
  });

  it('keeps the margin identities of common/src/pricing (REFERENCE-VALUES.md "Money")', () => {
    // price = cost / (1 − margin): 2564.50 / (1 − 0.389404…) = 4200, at full precision.
    const exact = money('1635.50').dividedBy('4200').times(100);
    expect(priceForMargin('2564.50', exact).toDecimalPlaces(10).toFixed(2)).toBe('4200.00');
    // markup = margin / (1 − margin) and back: 1635.50 / 2564.50 = 63.77 % markup.
    expect(markupFromMargin(exact).toDecimalPlaces(2).toFixed(2)).toBe('63.77');
    expect(marginFromMarkup(markupFromMargin(exact)).toDecimalPlaces(2).toFixed(2)).toBe(a.actualMarginPct);
  });

  it("the job's own labour estimate and rate win over the plan lines for the labour figures", () => {
    const b = jobActuals({
      jobId: 'j1',
      price: '4200.00',
      plan: PLAN,
      log: LOG,
      estimatedLabourHours: '18.00',
      labourCostPerHour: '40',
    });
    expect(b.labour).toEqual({ estimatedHours: '18', actualHours: '20.5', costPerHour: '40.00' });
    expect(b.actualCost).toBe('2564.50'); // the cost stays the plan line's
  });
});

describe('jobActuals: several lines measuring the same thing, piers, an empty log', () => {
  // Two pound lines, 100 lb at 3.00 and 100 lb at 5.00: the log fills them in plan order.
  const twoLb: ActualsPlanLine[] = [
    {
      code: 'A',
      description: 'A',
      category: 'soil_stabilisation',
      unit: 'lb',
      quantity: '100',
      unitCost: '3.00',
    },
    {
      code: 'B',
      description: 'B',
      category: 'soil_stabilisation',
      unit: 'lb',
      quantity: '100',
      unitCost: '5.00',
    },
  ];
  it.each([
    ['80', ['80', '0'], '240.00'], // 80 × 3
    ['150', ['100', '50'], '550.00'], // 100 × 3 + 50 × 5
    ['250', ['100', '150'], '1050.00'], // 100 × 3 + 150 × 5: the excess on the last line
  ])('%s lb logged → %j, cost %s', (pounds, quantities, cost) => {
    const a = jobActuals({
      jobId: 'j',
      price: '2000.00',
      plan: twoLb,
      log: { injectionPoints: 0, pounds, pushPiers: 0, helicalPiles: 0, labourHours: '0' },
    });
    expect(a.lines.map((l) => l.actualQty)).toEqual(quantities);
    expect(a.actualCost).toBe(cost);
    expect(a.material.unitCost).toBeNull(); // two different unit costs
  });

  it('counts push piers and helical piles against their own lines', () => {
    // 8 push piers planned × 700 = 5600; 2 helical × 900 = 1800 → 7400. Logged 9 push, 2 helical:
    // 9 × 700 + 1800 = 8100. Price 12,000: margins (12000 − 7400) / 12000 = 38.33 %, 4100 / 12000 = 32.50 %
    // (38.333… rounds half-up to 38.33; 0.325 exactly).
    const a = jobActuals({
      jobId: 'j',
      price: '12000.00',
      plan: [
        {
          code: 'PP',
          description: 'Push pier',
          category: 'piers',
          unit: 'each',
          quantity: '8',
          unitCost: '700',
        },
        {
          code: 'HP',
          description: 'Helical pile',
          category: 'helical_piles',
          unit: 'each',
          quantity: '2',
          unitCost: '900',
        },
      ],
      log: { injectionPoints: 0, pounds: '0', pushPiers: 9, helicalPiles: 2, labourHours: '0' },
    });
    expect(a.estimatedCost).toBe('7400.00');
    expect(a.actualCost).toBe('8100.00');
    expect(a.estimatedMarginPct).toBe('38.33');
    expect(a.actualMarginPct).toBe('32.50');
    expect(a.piers).toEqual({ planned: '10', installed: 11 });
  });

  it('an empty log costs nothing on the measured lines', () => {
    const a = jobActuals({
      jobId: 'j',
      price: '4200.00',
      plan: PLAN,
      log: { injectionPoints: 0, pounds: '0', pushPiers: 0, helicalPiles: 0, labourHours: '0' },
    });
    expect(a.actualCost).toBe('300.00');
    expect(a.labour.actualHours).toBe('0');
  });

  it.each([
    [{ unit: 'lb', category: 'soil_stabilisation' }, 'lb'],
    [{ unit: 'point', category: 'soil_stabilisation' }, 'injection_points'],
    [{ unit: 'each', category: 'soil_stabilisation' }, null],
    [{ unit: 'point', category: 'piers' }, 'push_piers'],
    [{ unit: 'each', category: 'helical_piles' }, 'helical_piles'],
    [{ unit: 'hour', category: 'mobilisation' }, 'labour_hours'],
    [{ unit: 'linear_ft', category: 'drainage' }, null],
    [{ unit: 'lump_sum', category: 'permits_engineering' }, null],
  ])('%j is measured by %s', (line, measure) => {
    expect(actualMeasureOf(line)).toBe(measure);
  });
});

describe('summariseActuals', () => {
  it('sums per key, takes the margin of the sums, and puts the largest under-estimate first', () => {
    // Ana: price 4200 + 1800 = 6000; estimated 2100 + 900 = 3000 → 50.00 %; actual 2564.50 + 900 = 3464.50
    //   → (6000 − 3464.50) / 6000 = 0.422583… → 42.26 %; drift 42.26 − 50.00 = −7.74 points.
    // Ben: 10000, estimated 6000 → 40.00 %, actual 5800 → 42.00 %; drift +2.00.
    const rows = summariseActuals([
      { key: 'ben', name: 'Ben Sample', price: '10000.00', estimatedCost: '6000.00', actualCost: '5800.00' },
      { key: 'ana', name: 'Ana Example', price: '4200.00', estimatedCost: '2100.00', actualCost: '2564.50' },
      { key: 'ana', name: 'Ana Example', price: '1800.00', estimatedCost: '900.00', actualCost: '900.00' },
      { key: 'cy', name: 'Cy Nothing', price: '0.00', estimatedCost: '0.00', actualCost: '0.00' },
    ]);
    expect(rows).toEqual([
      {
        key: 'ana',
        name: 'Ana Example',
        jobs: 2,
        price: '6000.00',
        estimatedCost: '3000.00',
        actualCost: '3464.50',
        estimatedMarginPct: '50.00',
        actualMarginPct: '42.26',
        marginDriftPts: '-7.74',
      },
      {
        key: 'ben',
        name: 'Ben Sample',
        jobs: 1,
        price: '10000.00',
        estimatedCost: '6000.00',
        actualCost: '5800.00',
        estimatedMarginPct: '40.00',
        actualMarginPct: '42.00',
        marginDriftPts: '2.00',
      },
      {
        key: 'cy',
        name: 'Cy Nothing',
        jobs: 1,
        price: '0.00',
        estimatedCost: '0.00',
        actualCost: '0.00',
        estimatedMarginPct: null,
        actualMarginPct: null,
        marginDriftPts: null,
      },
    ]);
  });
});
