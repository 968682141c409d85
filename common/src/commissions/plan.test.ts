import { describe, expect, it } from 'vitest';
import { CommissionError } from './errors';
import {
  computeCommission,
  validateCommissionDeal,
  validateCommissionPlan,
  type CommissionPlan,
  type CommissionRate,
  type CommissionSplit,
} from './plan';

// All prices and rates below are invented; every expected figure is worked by hand in the comment beside it.
const flat = (ratePct: string): CommissionRate => ({ kind: 'flat', ratePct });
const volumeTiers = (mode: 'step' | 'bracket'): CommissionRate => ({
  kind: 'tiered',
  measure: 'monthly_volume',
  mode,
  tiers: [
    { from: '0', ratePct: '5' },
    { from: '50000', ratePct: '7' },
    { from: '100000', ratePct: '9' },
  ],
});
const marginBands = (mode: 'step' | 'bracket'): CommissionRate => ({
  kind: 'tiered',
  measure: 'margin_band',
  mode,
  tiers: [
    { from: '0', ratePct: '4' },
    { from: '30', ratePct: '6' },
    { from: '40', ratePct: '8' },
  ],
});
const plan = (
  basis: CommissionPlan['basis'],
  rate: CommissionRate,
  firstMilestonePct = '50',
): CommissionPlan => ({ basis, rate, firstMilestonePct });
const solo = (monthVolumeBefore?: string): CommissionSplit[] => [
  { salespersonId: 'ana', sharePct: '100', monthVolumeBefore },
];

describe('computeCommission — one salesperson', () => {
  it.each([
    // plan, netPrice, cost, volume before, total, first milestone, second milestone
    // Flat rates
    [plan('net_price', flat('8')), '3705.00', '1764.00', undefined, '296.40', '148.20', '148.20'], // 3705 × 8%; half
    [plan('gross_margin', flat('10')), '3705.00', '1764.00', undefined, '194.10', '97.05', '97.05'], // (3705 − 1764) × 10%
    [plan('net_price', flat('7.5')), '1000.05', '0', undefined, '75.00', '37.50', '37.50'], // 75.00375 → 75.00 (half-up, once)
    [plan('net_price', flat('7.5')), '1000.10', '0', undefined, '75.01', '37.51', '37.50'], // 75.0075 → 75.01; 37.505 → 37.51, rest 37.50
    [plan('net_price', flat('6'), '30'), '12345.67', '0', undefined, '740.74', '222.22', '518.52'], // 740.7402 → 740.74; 30% = 222.222 → 222.22
    [plan('net_price', flat('6'), '100'), '1000.00', '0', undefined, '60.00', '60.00', '0.00'], // all at the first milestone
    [plan('net_price', flat('6'), '0'), '1000.00', '0', undefined, '60.00', '0.00', '60.00'], // all at completion
    [plan('gross_margin', flat('10')), '500.00', '520.00', undefined, '0.00', '0.00', '0.00'], // a loss pays nothing
    [plan('net_price', flat('0')), '500.00', '100.00', undefined, '0.00', '0.00', '0.00'],

    // Monthly volume tiers 0 → 5%, 50,000 → 7%, 100,000 → 9%
    // step: 45,000 before + 10,000 = 55,000 → the 7% band, on all 10,000 = 700.00
    [plan('net_price', volumeTiers('step')), '10000.00', '0', '45000.00', '700.00', '350.00', '350.00'],
    // bracket: slice 45,000–55,000 = 5,000 × 5% + 5,000 × 7% = 250 + 350 = 600.00
    [plan('net_price', volumeTiers('bracket')), '10000.00', '0', '45000.00', '600.00', '300.00', '300.00'],
    // step at a band's lower bound: 40,000 + 10,000 = exactly 50,000 → the 7% band: 700.00
    [plan('net_price', volumeTiers('step')), '10000.00', '0', '40000.00', '700.00', '350.00', '350.00'],
    // bracket, same: slice 40,000–50,000 lies wholly in the 5% band: 500.00
    [plan('net_price', volumeTiers('bracket')), '10000.00', '0', '40000.00', '500.00', '250.00', '250.00'],
    // bracket over three bands: 45,000–105,000 = 5,000 × 5% + 50,000 × 7% + 5,000 × 9% = 250 + 3,500 + 450
    [plan('net_price', volumeTiers('bracket')), '60000.00', '0', '45000.00', '4200.00', '2100.00', '2100.00'],
    // step, same: 105,000 → 9% × 60,000 = 5,400.00
    [plan('net_price', volumeTiers('step')), '60000.00', '0', '45000.00', '5400.00', '2700.00', '2700.00'],
    // margin basis with volume tiers: base 10,000 − 6,000 = 4,000; step 7% → 280.00; bracket blended 6% → 240.00
    [
      plan('gross_margin', volumeTiers('step')),
      '10000.00',
      '6000.00',
      '45000.00',
      '280.00',
      '140.00',
      '140.00',
    ],
    [
      plan('gross_margin', volumeTiers('bracket')),
      '10000.00',
      '6000.00',
      '45000.00',
      '240.00',
      '120.00',
      '120.00',
    ],
    // first sale of the month: 0 + 3,705 → 5%: 185.25; 50% = 92.625 → 92.63, rest 92.62
    [plan('net_price', volumeTiers('step')), '3705.00', '0', '0', '185.25', '92.63', '92.62'],

    // Margin bands 0 → 4%, 30 → 6%, 40 → 8% (margin % = (net − cost) / net × 100)
    // step, net basis: (10,000 − 6,500) / 10,000 = 35% → 6% × 10,000 = 600.00
    [plan('net_price', marginBands('step')), '10000.00', '6500.00', undefined, '600.00', '300.00', '300.00'],
    // bracket, net basis: 0–30 at 4 + 30–35 at 6 = 120 + 30 = 150 / 35 = 4.2857…% × 10,000 = 428.571… → 428.57
    [
      plan('net_price', marginBands('bracket')),
      '10000.00',
      '6500.00',
      undefined,
      '428.57',
      '214.29',
      '214.28',
    ],
    // bracket, margin basis: 3,500 × 150/35 % = 150.00 (= 10,000 × (30% × 4% + 5% × 6%) = 120 + 30)
    [
      plan('gross_margin', marginBands('bracket')),
      '10000.00',
      '6500.00',
      undefined,
      '150.00',
      '75.00',
      '75.00',
    ],
    // step, margin basis: 6% × 3,500 = 210.00
    [
      plan('gross_margin', marginBands('step')),
      '10000.00',
      '6500.00',
      undefined,
      '210.00',
      '105.00',
      '105.00',
    ],
    // the band is read on the printed margin: 899.90 / 3,000 = 29.9966…% → 30.00% → 6% × 3,000 = 180.00
    [plan('net_price', marginBands('step')), '3000.00', '2100.10', undefined, '180.00', '90.00', '90.00'],
    // 2,999 / 10,000 = 29.99% → the 4% band: 400.00
    [plan('net_price', marginBands('step')), '10000.00', '7001.00', undefined, '400.00', '200.00', '200.00'],
    // 40% exactly → the 8% band: 8% × 5,000 = 400.00
    [plan('net_price', marginBands('step')), '5000.00', '3000.00', undefined, '400.00', '200.00', '200.00'],
    // a loss: −10% lies below every band → 0
    [plan('net_price', marginBands('step')), '1000.00', '1100.00', undefined, '0.00', '0.00', '0.00'],
    [plan('net_price', marginBands('bracket')), '1000.00', '1100.00', undefined, '0.00', '0.00', '0.00'],
    // net 0: no margin, no commission
    [plan('net_price', marginBands('step')), '0.00', '0.00', undefined, '0.00', '0.00', '0.00'],
  ] as const)(
    '%j on net %s, cost %s, volume before %s → %s (%s + %s)',
    (p, netPrice, cost, volume, total, first, second) => {
      const result = computeCommission(p, { netPrice, cost, splits: solo(volume) });
      expect(result.total).toBe(total);
      expect(result.parts).toHaveLength(1);
      expect(result.parts[0]?.amount).toBe(total);
      expect(result.parts[0]?.milestones).toEqual([
        { milestone: 'deposit_cleared_window_closed', amount: first },
        { milestone: 'job_completed', amount: second },
      ]);
    },
  );

  it('reports the base, the printed margin and the blended rate', () => {
    // bracket net basis above: blended 150 / 35 = 4.285714…%
    const r = computeCommission(plan('net_price', marginBands('bracket')), {
      netPrice: '10000.00',
      cost: '6500.00',
      splits: solo(),
    });
    expect(r.base).toBe('10000.00');
    expect(r.grossMarginPct).toBe('35.00');
    expect(r.parts[0]?.effectiveRatePct.startsWith('4.285714285714')).toBe(true);
    const loss = computeCommission(plan('gross_margin', flat('10')), {
      netPrice: '500.00',
      cost: '520.00',
      splits: solo(),
    });
    expect(loss.base).toBe('0.00');
    expect(loss.grossMarginPct).toBe('-4.00'); // −20 / 500
  });

  it('pays nothing below the first band: "nothing under 20% margin"', () => {
    const rate: CommissionRate = {
      kind: 'tiered',
      measure: 'margin_band',
      mode: 'step',
      tiers: [{ from: '20', ratePct: '5' }],
    };
    // 150 / 1000 = 15% → below the first band → 0
    expect(
      computeCommission(plan('net_price', rate), { netPrice: '1000.00', cost: '850.00', splits: solo() })
        .total,
    ).toBe('0.00');
    // bracket at 25%: 0–20 at 0 + 20–25 at 5 = 25 / 25 = 1% blended × 1,000 = 10.00
    const bracket: CommissionRate = { ...rate, mode: 'bracket' };
    expect(
      computeCommission(plan('net_price', bracket), { netPrice: '1000.00', cost: '750.00', splits: solo() })
        .total,
    ).toBe('10.00');
  });
});

describe('computeCommission — splits', () => {
  it.each([
    // plan, netPrice, cost, splits [id, share, volume before], total, parts [amount, first, second]
    // flat 10% of 1,000.10 = 100.01; 50.005 each → 50.01 to the first listed (tie), 50.00
    //   milestones: 50.01 × 50% = 25.005 → 25.01 + 25.00; 50.00 → 25.00 + 25.00
    [
      plan('net_price', flat('10')),
      '1000.10',
      '0',
      [
        ['ana', '50'],
        ['ben', '50'],
      ],
      '100.01',
      [
        ['50.01', '25.01', '25.00'],
        ['50.00', '25.00', '25.00'],
      ],
    ],
    // flat 7.5% of 1,000.10 = 75.0075 → 75.01; exact parts 45.0045 and 30.003 → floors 75.00; 1 cent to the
    // larger remainder (0.45 ¢ > 0.30 ¢) → 45.01, 30.00; 45.01 / 2 = 22.505 → 22.51 + 22.50
    [
      plan('net_price', flat('7.5')),
      '1000.10',
      '0',
      [
        ['ana', '60'],
        ['ben', '40'],
      ],
      '75.01',
      [
        ['45.01', '22.51', '22.50'],
        ['30.00', '15.00', '15.00'],
      ],
    ],
    // three ways of 100.00 (flat 10% of 1,000): exact 33.34, 33.33, 33.33
    [
      plan('net_price', flat('10')),
      '1000.00',
      '0',
      [
        ['ana', '33.34'],
        ['ben', '33.33'],
        ['cai', '33.33'],
      ],
      '100.00',
      [
        ['33.34', '16.67', '16.67'],
        ['33.33', '16.67', '16.66'],
        ['33.33', '16.67', '16.66'],
      ],
    ],
    // monthly volume, each on their own month (tiers 0 → 5%, 50,000 → 7%):
    //   ana 60%: 45,000 before + 6,000 credited = 51,000 → 7%: 10,000 × 60% × 7% = 420.00
    //   ben 40%: 0 + 4,000 → 5%: 10,000 × 40% × 5% = 200.00;  total 620.00
    [
      plan('net_price', volumeTiers('step')),
      '10000.00',
      '0',
      [
        ['ana', '60', '45000'],
        ['ben', '40', '0'],
      ],
      '620.00',
      [
        ['420.00', '210.00', '210.00'],
        ['200.00', '100.00', '100.00'],
      ],
    ],
    //   bracket: ana's slice 45,000–51,000 = 5,000 × 5% + 1,000 × 7% = 250 + 70 = 320.00; ben 4,000 × 5% = 200.00
    [
      plan('net_price', volumeTiers('bracket')),
      '10000.00',
      '0',
      [
        ['ana', '60', '45000'],
        ['ben', '40', '0'],
      ],
      '520.00',
      [
        ['320.00', '160.00', '160.00'],
        ['200.00', '100.00', '100.00'],
      ],
    ],
    // margin basis, margin bands step: (10,000 − 6,500) = 3,500 at 6% = 210.00, split 70/30 → 147.00 / 63.00
    [
      plan('gross_margin', marginBands('step')),
      '10000.00',
      '6500.00',
      [
        ['ana', '70'],
        ['ben', '30'],
      ],
      '210.00',
      [
        ['147.00', '73.50', '73.50'],
        ['63.00', '31.50', '31.50'],
      ],
    ],
  ] as const)('%#: net %s → %s', (p, netPrice, cost, splits, total, parts) => {
    const r = computeCommission(p, {
      netPrice,
      cost,
      splits: splits.map(([salespersonId, sharePct, monthVolumeBefore]) => ({
        salespersonId,
        sharePct,
        monthVolumeBefore,
      })),
    });
    expect(r.total).toBe(total);
    expect(r.parts.map((x) => [x.amount, ...x.milestones.map((m) => m.amount)])).toEqual(parts);
    expect(r.parts.map((x) => x.salespersonId)).toEqual(splits.map((x) => x[0]));
  });
});

describe('validation', () => {
  it.each([
    [plan('net_price', flat('101')), ['rate.ratePct']],
    [plan('net_price', flat('-1')), ['rate.ratePct']],
    [plan('net_price', flat('8'), '150'), ['firstMilestonePct']],
    [plan('net_price', flat('8.0')), []],
    [{ ...plan('net_price', flat('8')), basis: 'gross' as never }, ['basis']],
    [
      plan('net_price', {
        kind: 'tiered',
        measure: 'monthly_volume',
        mode: 'step',
        tiers: [
          { from: '0', ratePct: '5' },
          { from: '0', ratePct: '7' },
        ],
      }),
      ['rate.tiers[1].from'],
    ],
    [
      plan('net_price', {
        kind: 'tiered',
        measure: 'margin_band',
        mode: 'bracket',
        tiers: [{ from: '120', ratePct: '5' }],
      }),
      ['rate.tiers[0].from'],
    ],
    [plan('net_price', { kind: 'tiered', measure: 'margin_band', mode: 'step', tiers: [] }), ['rate.tiers']],
    [
      plan('net_price', {
        kind: 'tiered',
        measure: 'margin_band',
        mode: 'sliding' as never,
        tiers: [{ from: '0', ratePct: '1' }],
      }),
      ['rate.mode'],
    ],
  ] as const)('%j → issues at %j', (p, fields) => {
    const issues = validateCommissionPlan(p);
    expect(issues.map((i) => i.field)).toEqual(fields);
    issues.forEach((i) => expect(i.code).toBe('COMMISSION.PLAN_INVALID'));
  });

  it('needs each salesperson’s month volume on a monthly-volume plan', () => {
    const p = plan('net_price', volumeTiers('step'));
    const issues = validateCommissionDeal(p, { netPrice: '1000.00', cost: '0', splits: solo() });
    expect(issues).toEqual([expect.objectContaining({ code: 'COMMISSION.VOLUME_MISSING' })]);
    expect(() => computeCommission(p, { netPrice: '1000.00', cost: '0', splits: solo() })).toThrow(
      CommissionError,
    );
    // a flat plan does not need it
    expect(
      validateCommissionDeal(plan('net_price', flat('8')), {
        netPrice: '1000.00',
        cost: '0',
        splits: solo(),
      }),
    ).toEqual([]);
  });

  it('refuses numbers for money and a split that does not reach 100', () => {
    const p = plan('net_price', flat('8'));
    expect(() =>
      computeCommission(p, { netPrice: 1000 as unknown as string, cost: '0', splits: solo() }),
    ).toThrow(/net price/);
    try {
      computeCommission(p, {
        netPrice: '1000.00',
        cost: '0',
        splits: [
          { salespersonId: 'ana', sharePct: '60' },
          { salespersonId: 'ben', sharePct: '30' },
        ],
      });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(CommissionError);
      expect((e as CommissionError).code).toBe('COMMISSION.SPLIT_SUM_NOT_100');
    }
  });
});
