import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Decimal from 'decimal.js';
import { MoneyDecimal } from '../money';
import {
  marginFromMarkup,
  markupFromMargin,
  priceForMargin,
  priceOption,
  PricingError,
  type PriceLineInput,
  type PriceOptionInput,
} from './price-option';

const none = { kind: 'none', value: '0' } as const;
const invoice = (ratePct = '0') => ({ treatment: 'invoice', ratePct }) as const;
const materials = (ratePct: string) => ({ treatment: 'materials_cost', ratePct }) as const;

// A hand-checked option: 12 injection points × 20 lb = 240 lb of polyurethane (20 lb per point is common
// practice, REFERENCE-VALUES.md), invented prices.
//   240 lb   × cost  5.20 / price 11.50 = 1248.00 / 2760.00   (soil_stabilisation)
//    12 pts  × cost 18.00 / price 45.00 =  216.00 /  540.00   (soil_stabilisation)
//     1 l.s. × cost 300.00 / price 600.00 = 300.00 /  600.00  (mobilisation)
//   cost 1764.00, list 3900.00; 5% discount = 195.00; net 3705.00
//   invoice 7%: tax 3705.00 × 0.07 = 259.35, homeowner pays 3964.35; profit 3705 − 1764 = 1941.00,
//     margin 1941 / 3705 = 52.3886…% → 52.39, markup 1941 / 1764 = 110.0340…% → 110.03
//   materials cost 6%: materials 1248 + 216 = 1464.00, tax 87.84 borne by the contractor; homeowner pays
//     3705.00; profit 3705 − 1764 − 87.84 = 1853.16, margin 50.0178…% → 50.02, markup 105.0544…% → 105.05
const handChecked: PriceLineInput[] = [
  { quantity: '240', unitCost: '5.20', unitPrice: '11.50', category: 'soil_stabilisation' },
  { quantity: '12', unitCost: '18.00', unitPrice: '45.00', category: 'soil_stabilisation' },
  { quantity: '1', unitCost: '300.00', unitPrice: '600.00', category: 'mobilisation' },
];

describe('priceOption', () => {
  it('prices the hand-checked option with tax on the invoice', () => {
    expect(
      priceOption({ lines: handChecked, discount: { kind: 'percent', value: '5' }, tax: invoice('7') }),
    ).toEqual({
      costTotal: '1764.00',
      listTotal: '3900.00',
      discountTotal: '195.00',
      discountPct: '5.00',
      netTotal: '3705.00',
      materialsCostTotal: '1464.00',
      taxTotal: '259.35',
      taxBorneBy: 'homeowner',
      customerTotal: '3964.35',
      grossProfit: '1941.00',
      grossMarginPct: '52.39',
      markupPct: '110.03',
    });
  });

  it('prices the hand-checked option with the contractor paying tax on materials', () => {
    expect(
      priceOption({ lines: handChecked, discount: { kind: 'percent', value: '5' }, tax: materials('6') }),
    ).toEqual({
      costTotal: '1764.00',
      listTotal: '3900.00',
      discountTotal: '195.00',
      discountPct: '5.00',
      netTotal: '3705.00',
      materialsCostTotal: '1464.00',
      taxTotal: '87.84',
      taxBorneBy: 'contractor',
      customerTotal: '3705.00',
      grossProfit: '1853.16',
      grossMarginPct: '50.02',
      markupPct: '105.05',
    });
  });

  it('takes only the given categories as materials when told', () => {
    const t = priceOption({
      lines: handChecked,
      discount: none,
      tax: materials('10'),
      materialsCategories: ['mobilisation'],
    });
    expect(t.materialsCostTotal).toBe('300.00');
    expect(t.taxTotal).toBe('30.00');
  });

  it('treats a line without a category as materials (the cautious reading)', () => {
    const t = priceOption({
      lines: [{ quantity: '1', unitCost: '100', unitPrice: '200' }],
      discount: none,
      tax: materials('5'),
    });
    expect(t.taxTotal).toBe('5.00');
    expect(t.grossProfit).toBe('95.00');
  });

  // Rounding: to cents once per total, half away from zero (ROUND_HALF_UP).
  it.each([
    // lines, discount, list, discountTotal, net
    [[['0.001', '5.00']], none, '0.01', '0.00', '0.01'], // 0.005 → 0.01 (half up, once on the sum)
    [[['0.001', '4.00']], none, '0.00', '0.00', '0.00'], // 0.004 → 0.00
    [
      [
        ['0.001', '4.00'],
        ['0.001', '4.00'],
      ],
      none,
      '0.01',
      '0.00',
      '0.01',
    ], // 0.004 + 0.004 = 0.008 → 0.01: lines are not rounded one by one (that would give 0.00)
    [[['1', '10.05']], { kind: 'percent', value: '5' }, '10.05', '0.50', '9.55'], // 0.5025 → 0.50
    [[['1', '0.20']], { kind: 'percent', value: '12.5' }, '0.20', '0.03', '0.17'], // 0.025 → 0.03
    [[['3', '33.33']], { kind: 'amount', value: '99.99' }, '99.99', '99.99', '0.00'], // the whole list off
    [[['2.5', '10']], { kind: 'percent', value: '100' }, '25.00', '25.00', '0.00'],
  ] as const)('lines %j, discount %j → list %s, discount %s, net %s', (lines, discount, list, disc, net) => {
    const t = priceOption({
      lines: lines.map(([quantity, unitPrice]) => ({ quantity, unitPrice, unitCost: '0' })),
      discount,
      tax: invoice(),
    });
    expect([t.listTotal, t.discountTotal, t.netTotal]).toEqual([list, disc, net]);
  });

  it('rounds the invoice tax once, half-up, on the net', () => {
    // 10.50 × 6.5% = 0.6825 → 0.68; 10.70 × 6.5% = 0.6955 → 0.70 (half up)
    const tax = (price: string) =>
      priceOption({
        lines: [{ quantity: '1', unitCost: '0', unitPrice: price }],
        discount: none,
        tax: invoice('6.5'),
      }).taxTotal;
    expect(tax('10.50')).toBe('0.68');
    expect(tax('10.70')).toBe('0.70');
  });

  it('gives an amount discount as a percentage of list', () => {
    const t = priceOption({
      lines: [{ quantity: '1', unitCost: '500', unitPrice: '1200' }],
      discount: { kind: 'amount', value: '150' },
      tax: invoice(),
    });
    expect(t.discountPct).toBe('12.50');
    expect(t.netTotal).toBe('1050.00');
  });

  it('has no margin when nothing is charged, and no markup when nothing is spent', () => {
    const free = priceOption({
      lines: [{ quantity: '1', unitCost: '40', unitPrice: '100' }],
      discount: { kind: 'percent', value: '100' },
      tax: invoice('7'),
    });
    expect(free.grossMarginPct).toBeNull();
    expect(free.grossProfit).toBe('-40.00');
    expect(free.markupPct).toBe('-100.00');
    const noCost = priceOption({
      lines: [{ quantity: '1', unitCost: '0', unitPrice: '100' }],
      discount: none,
      tax: invoice(),
    });
    expect(noCost.markupPct).toBeNull();
    expect(noCost.grossMarginPct).toBe('100.00');
  });

  it('prices an option with no lines at zero', () => {
    const t = priceOption({ lines: [], discount: none, tax: invoice('7') });
    expect(t).toMatchObject({ listTotal: '0.00', netTotal: '0.00', grossMarginPct: null, markupPct: null });
  });

  it('shows a loss as a negative margin', () => {
    const t = priceOption({
      lines: [{ quantity: '1', unitCost: '120', unitPrice: '100' }],
      discount: none,
      tax: invoice(),
    });
    expect(t.grossMarginPct).toBe('-20.00');
  });

  it.each([
    [{ kind: 'amount', value: '100.01' }, 'PRICING.DISCOUNT_EXCEEDS_LIST', 'discount.value'],
    [{ kind: 'percent', value: '100.01' }, 'PRICING.DISCOUNT_EXCEEDS_LIST', 'discount.value'],
    [{ kind: 'percent', value: '-1' }, 'PRICING.INVALID_NUMBER', 'discount.value'],
    [{ kind: 'amount', value: '1e2' }, 'PRICING.INVALID_NUMBER', 'discount.value'],
  ] as const)('refuses the discount %j', (discount, code, field) => {
    const run = () =>
      priceOption({ lines: [{ quantity: '1', unitCost: '50', unitPrice: '100' }], discount, tax: invoice() });
    expect(run).toThrow(PricingError);
    try {
      run();
    } catch (e) {
      expect((e as PricingError).code).toBe(code);
      expect((e as PricingError).field).toBe(field);
    }
  });

  it.each([
    [{ quantity: '0', unitCost: '1', unitPrice: '1' }, 'lines.0.quantity'],
    [{ quantity: '-2', unitCost: '1', unitPrice: '1' }, 'lines.0.quantity'],
    [{ quantity: '1', unitCost: '-1', unitPrice: '1' }, 'lines.0.unitCost'],
    [{ quantity: 2 as unknown as string, unitCost: '1', unitPrice: '1' }, 'lines.0.quantity'], // never a JS number
  ])('refuses the line %j', (line, field) => {
    expect(() => priceOption({ lines: [line], discount: none, tax: invoice() })).toThrow(
      expect.objectContaining({ code: 'PRICING.INVALID_NUMBER', field }),
    );
  });
});

describe('margin and markup identities', () => {
  // REFERENCE-VALUES.md, "Money" (algebraic identities; worked examples published in many pricing guides):
  // price = cost / (1 − margin); markup = margin / (1 − margin); margin = markup / (1 + markup).
  it('cost 100 at 20% margin → price 125, markup 25% (REFERENCE-VALUES.md, Money)', () => {
    expect(priceForMargin('100', '20').toString()).toBe('125');
    expect(markupFromMargin('20').toString()).toBe('25');
    const t = priceOption({
      lines: [{ quantity: '1', unitCost: '100', unitPrice: '125' }],
      discount: none,
      tax: invoice(),
    });
    expect([t.grossMarginPct, t.markupPct]).toEqual(['20.00', '25.00']);
  });

  // REFERENCE-VALUES.md once said "Margin 40% → markup 80%", against its own identity:
  // markup = 0.40 / (1 − 0.40) = 66.67% (cost 100 → price 166.67, profit 66.67). A markup of 80% is a
  // margin of 0.80 / 1.80 = 44.44%. The note now reads 66.67%; the test holds both identities.
  it('margin 40% → markup 66.67%, markup 80% → margin 44.44% (the identities of REFERENCE-VALUES.md, Money)', () => {
    expect(markupFromMargin('40').toDecimalPlaces(2).toFixed(2)).toBe('66.67');
    expect(marginFromMarkup('80').toDecimalPlaces(2).toFixed(2)).toBe('44.44');
    expect(marginFromMarkup(markupFromMargin('40')).toDecimalPlaces(30).toString()).toBe('40');
    const t = priceOption({
      lines: [{ quantity: '1', unitCost: '100', unitPrice: '166.67' }],
      discount: none,
      tax: invoice(),
    });
    expect([t.grossMarginPct, t.markupPct]).toEqual(['40.00', '66.67']);
  });

  it('refuses a margin of 100% or more', () => {
    expect(() => priceForMargin('100', '100')).toThrow(RangeError);
  });
});

// ---------------------------------------------------------------------------------------------------
// Property tests. Arbitrary amounts are built as strings of cents / thousandths, never JS decimals.

const centsString = (max: number) =>
  fc.integer({ min: 0, max }).map((c) => new Decimal(c).dividedBy(100).toFixed(2));
const quantityString = fc
  .integer({ min: 1, max: 9_999_999 })
  .map((q) => new Decimal(q).dividedBy(1000).toString());
const category = fc.constantFrom('soil_stabilisation', 'piers', 'mobilisation', 'permits_engineering');
const line = fc.record({
  quantity: quantityString,
  unitCost: centsString(500_000),
  unitPrice: centsString(900_000),
  category,
});
const tax = fc.record({
  treatment: fc.constantFrom('invoice' as const, 'materials_cost' as const),
  ratePct: fc.integer({ min: 0, max: 12_000 }).map((r) => new Decimal(r).dividedBy(1000).toString()),
});
const percentDiscount = fc
  .integer({ min: 0, max: 10_000 })
  .map((p) => ({ kind: 'percent' as const, value: new Decimal(p).dividedBy(100).toString() }));

// The test's own arithmetic at the same 40 significant digits as the code (Decimal's default is 20).
const D = (s: string | Decimal) => new MoneyDecimal(s);
const isCents = (s: string) => /^-?\d+\.\d{2}$/.test(s);

describe('priceOption properties', () => {
  it('never gains or loses a cent: net = list − discount, customer = net (+ tax), profit = net − cost (− tax)', () => {
    fc.assert(
      fc.property(
        fc.array(line, { minLength: 1, maxLength: 8 }),
        percentDiscount,
        tax,
        (lines, discount, t) => {
          const r = priceOption({ lines, discount, tax: t });
          for (const v of [
            r.costTotal,
            r.listTotal,
            r.discountTotal,
            r.netTotal,
            r.taxTotal,
            r.customerTotal,
          ]) {
            expect(isCents(v)).toBe(true);
          }
          expect(D(r.netTotal).equals(D(r.listTotal).minus(r.discountTotal))).toBe(true);
          const contractor = t.treatment === 'materials_cost';
          expect(D(r.customerTotal).equals(contractor ? D(r.netTotal) : D(r.netTotal).plus(r.taxTotal))).toBe(
            true,
          );
          expect(
            D(r.grossProfit).equals(
              D(r.netTotal)
                .minus(r.costTotal)
                .minus(contractor ? r.taxTotal : '0'),
            ),
          ).toBe(true);
          expect(D(r.discountTotal).lessThanOrEqualTo(r.listTotal)).toBe(true);
          expect(D(r.discountTotal).isNegative()).toBe(false);
        },
      ),
    );
  });

  it('gives each total as the exact sum rounded once, half-up', () => {
    fc.assert(
      fc.property(fc.array(line, { minLength: 1, maxLength: 8 }), (lines) => {
        const r = priceOption({ lines, discount: none, tax: invoice() });
        const sum = (k: 'unitCost' | 'unitPrice') =>
          lines
            .reduce((acc, l) => acc.plus(D(l.quantity).times(l[k])), D('0'))
            .toDecimalPlaces(2, Decimal.ROUND_HALF_UP)
            .toFixed(2);
        expect([r.costTotal, r.listTotal]).toEqual([sum('unitCost'), sum('unitPrice')]);
      }),
    );
  });

  // Line extensions are never rounded, so splitting a line into two of the same total quantity gives
  // exactly the same totals (not merely within a cent).
  it('splitting a line into two with the same total quantity changes no total', () => {
    fc.assert(
      fc.property(
        line,
        fc.integer({ min: 1, max: 999 }),
        fc.array(line, { maxLength: 4 }),
        percentDiscount,
        tax,
        (l, permille, others, discount, t) => {
          const q = D(l.quantity);
          const first = q.times(permille).dividedBy(1000).toDecimalPlaces(3, Decimal.ROUND_DOWN);
          fc.pre(first.greaterThan(0) && first.lessThan(q));
          const split = [
            { ...l, quantity: first.toString() },
            { ...l, quantity: q.minus(first).toString() },
          ];
          const whole: PriceOptionInput = { lines: [l, ...others], discount, tax: t };
          expect(priceOption({ ...whole, lines: [...split, ...others] })).toEqual(priceOption(whole));
        },
      ),
    );
  });

  it('does not depend on the order of the lines', () => {
    fc.assert(
      fc.property(
        fc.array(line, { minLength: 2, maxLength: 6 }),
        percentDiscount,
        tax,
        (lines, discount, t) => {
          expect(priceOption({ lines: [...lines].reverse(), discount, tax: t })).toEqual(
            priceOption({ lines, discount, tax: t }),
          );
        },
      ),
    );
  });

  it('satisfies the margin/markup identities for random cost and price (REFERENCE-VALUES.md, Money)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 100_000_000 }),
        fc.integer({ min: 1, max: 100_000_000 }),
        (costCents, priceCents) => {
          const cost = new Decimal(costCents).dividedBy(100).toFixed(2);
          const price = new Decimal(priceCents).dividedBy(100).toFixed(2);
          const r = priceOption({
            lines: [{ quantity: '1', unitCost: cost, unitPrice: price }],
            discount: none,
            tax: invoice(),
          });
          const margin = D(r.grossProfit).dividedBy(r.netTotal); // as a fraction
          const markup = D(r.grossProfit).dividedBy(r.costTotal);
          // equal to 30 significant digits (the arithmetic carries 40)
          const close = (a: Decimal, b: Decimal) =>
            a.minus(b).abs().lessThanOrEqualTo(D(b).abs().times('1e-30').plus('1e-30'));
          if (margin.lessThan(1)) {
            // markup = margin / (1 − margin); price = cost / (1 − margin)
            expect(close(markupFromMargin(margin.times(100)), markup.times(100))).toBe(true);
            expect(close(priceForMargin(cost, margin.times(100)), D(price))).toBe(true);
          }
          // margin = markup / (1 + markup)
          expect(close(marginFromMarkup(markup.times(100)), margin.times(100))).toBe(true);
          // and the shown figures are those, rounded half-up to two decimals
          expect(r.grossMarginPct).toBe(
            margin.times(100).toDecimalPlaces(2, Decimal.ROUND_HALF_UP).toFixed(2),
          );
          expect(r.markupPct).toBe(markup.times(100).toDecimalPlaces(2, Decimal.ROUND_HALF_UP).toFixed(2));
        },
      ),
    );
  });
});
