import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Decimal from 'decimal.js';
import { settlement, SettlementPointInput } from './settlement';
import { CalculatorInputError } from './errors';

const pt = (label: string, xFt: string, yFt: string, elevationIn: string): SettlementPointInput => ({
  label,
  xFt,
  yFt,
  elevationIn,
});

describe('settlement: angular distortion and bands', () => {
  it.each([
    // differential over 25 ft (300 in) → ratio and band; lower bounds inclusive
    // 1.0 in over 25 ft → β = 1/300 exactly → beyond-1/300
    //   (REFERENCE-VALUES.md example; 1/300 first cracking of panel walls, Skempton & MacDonald 1956, secondary)
    ['1.0', '1/300', 'beyond-1/300'],
    ['0.99', '1/303', 'beyond-1/500'], // 300/0.99 = 303.03 → N rounded down
    ['0.6', '1/500', 'beyond-1/500'], // exactly 1/500 (Bjerrum 1963 safe limit, secondary): reaching it flags
    ['0.59', '1/508', 'within-1/500'], // 508.47 → 508
    ['2.0', '1/150', 'beyond-1/150'], // exactly 1/150 (structural damage, Skempton & MacDonald 1956, secondary)
    ['1.99', '1/150', 'beyond-1/300'], // 150.75 → shown 1/150 (rounded down), but β < 1/150: band from the exact β
    ['0', null, 'within-1/500'],
  ])('%s in over 25 ft → %s, %s', (differential, ratio, band) => {
    const result = settlement({
      points: [pt('A', '0', '0', '0'), pt('B', '25', '0', new Decimal(differential).neg().toFixed())],
    });
    expect(result.worstRatio).toBe(ratio);
    expect(result.band.code).toBe(band);
    expect(result.worstPair.distanceFt).toBe('25.00');
    expect(result.maxDifferentialIn).toBe(new Decimal(differential).toFixed());
  });

  it('compares exactly when the distance is irrational: 1 in over the diagonal of a 15 × 20 ft rectangle = 25 ft', () => {
    const result = settlement({ points: [pt('A', '0', '0', '1'), pt('B', '15', '20', '0')] });
    expect(result.worstRatio).toBe('1/300');
    expect(result.band.code).toBe('beyond-1/300');
  });

  it('gives each band a label and a source', () => {
    const result = settlement({ points: [pt('A', '0', '0', '0'), pt('B', '25', '0', '-1')] });
    expect(result.band.label).toContain('1/300');
    expect(result.band.source).toContain('Skempton & MacDonald (1956)');
    const within = settlement({ points: [pt('A', '0', '0', '0'), pt('B', '25', '0', '0')] });
    expect(within.band.source).toContain('Bjerrum (1963)');
  });

  it('reports the highest and lowest points and the largest difference', () => {
    const result = settlement({
      points: [
        pt('NE', '0', '0', '0.5'),
        pt('NW', '20', '0', '-0.75'),
        pt('SW', '20', '20', '0'),
        pt('SE', '0', '20', '0.25'),
      ],
    });
    expect(result.highest).toEqual({ label: 'NE', elevationIn: '0.5' });
    expect(result.lowest).toEqual({ label: 'NW', elevationIn: '-0.75' });
    expect(result.maxDifferentialIn).toBe('1.25');
  });

  it('warns when a difference is larger than the distance between the points', () => {
    const result = settlement({ points: [pt('A', '0', '0', '0'), pt('B', '0.5', '0', '7')] });
    expect(result.worstRatio).toBe('>1/1');
    expect(result.band.code).toBe('beyond-1/150');
    expect(result.warnings.join(' ')).toContain('step');
  });

  it('carries the screening caution', () => {
    const result = settlement({ points: [pt('A', '0', '0', '0'), pt('B', '10', '0', '0')] });
    expect(result.caution).toContain('not an engineering determination');
    expect(result.caution).toContain('engineer of record');
    expect(result.caution).toContain('building department');
  });
});

describe('settlement: which pairs are compared', () => {
  it('on a line of three points 10 ft apart, compares neighbours and not the two ends', () => {
    const result = settlement({
      points: [pt('A', '0', '0', '0'), pt('B', '10', '0', '-0.2'), pt('C', '20', '0', '-0.4')],
    });
    expect(result.pairs.map((p) => `${p.a}-${p.b}`).sort()).toEqual(['A-B', 'B-C']);
  });

  it('on a square grid, compares the sides and the diagonals of each cell (14.14 ft ≤ 1.5 × 10 ft), not two cells away', () => {
    const points: SettlementPointInput[] = [];
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) points.push(pt(`${i}${j}`, `${i * 10}`, `${j * 10}`, '0'));
    const result = settlement({ points });
    // 12 sides + 8 diagonals in a 3 × 3 grid of points
    expect(result.pairs).toHaveLength(20);
    expect(result.pairs.some((p) => p.distanceFt === '14.14')).toBe(true);
    expect(result.pairs.every((p) => p.distanceFt === '10.00' || p.distanceFt === '14.14')).toBe(true);
  });

  it('a far-off point is compared with its nearest neighbour and anything within 1.5 times that distance', () => {
    // C's nearest is B at 55 ft; A at 60 ft is within 1.5 × 55 = 82.5 ft, so A-C is compared too.
    const result = settlement({
      points: [pt('A', '0', '0', '0'), pt('B', '5', '0', '0'), pt('C', '60', '0', '-1')],
    });
    expect(result.pairs.map((p) => `${p.a}-${p.b}`).sort()).toEqual(['A-B', 'A-C', 'B-C']);
    // C at 14 ft: nearest is B at 9 ft, and A at 14 ft is beyond 1.5 × 9 = 13.5 ft (and beyond 1.5 × A's 5 ft).
    const near = settlement({
      points: [pt('A', '0', '0', '0'), pt('B', '5', '0', '0'), pt('C', '14', '0', '-1')],
    });
    expect(near.pairs.map((p) => `${p.a}-${p.b}`).sort()).toEqual(['A-B', 'B-C']);
    // C at 15 ft: A at 15 ft is exactly 1.5 × 10 ft, and the bound is inclusive.
    const edge = settlement({
      points: [pt('A', '0', '0', '0'), pt('B', '5', '0', '0'), pt('C', '15', '0', '-1')],
    });
    expect(edge.pairs.map((p) => `${p.a}-${p.b}`).sort()).toEqual(['A-B', 'A-C', 'B-C']);
  });

  it('puts the worst pair first: the one with the largest β, not the largest difference', () => {
    // A-B: 0.5 in over 5 ft = 1/120; B-C: 1.0 in over 20 ft = 1/240; A-C: 1.5 in over 25 ft = 1/200
    const result = settlement({
      points: [pt('A', '0', '0', '0'), pt('B', '5', '0', '-0.5'), pt('C', '25', '0', '-1.5')],
    });
    expect(result.pairs.map((p) => [`${p.a}-${p.b}`, p.ratio])).toEqual([
      ['A-B', '1/120'],
      ['A-C', '1/200'],
      ['B-C', '1/240'],
    ]);
    expect(result.worstRatio).toBe('1/120');
    expect(result.band.code).toBe('beyond-1/150');
    expect(result.maxDifferentialIn).toBe('1.5');
  });
});

describe('settlement: tilt of the best-fit plane', () => {
  it.each([
    // a plane rising 1 in per 10 ft along x: 1/120 = 0.83 %
    [[pt('A', '0', '0', '0'), pt('B', '10', '0', '1'), pt('C', '0', '10', '0')], '0.83'],
    // 0.3 in per 10 ft along x and 0.4 in per 10 ft along y → 0.5 in per 10 ft (120 in) = 0.42 %
    [
      [
        pt('A', '0', '0', '0'),
        pt('B', '10', '0', '0.3'),
        pt('C', '0', '10', '0.4'),
        pt('D', '10', '10', '0.7'),
      ],
      '0.42',
    ],
    // level floor
    [[pt('A', '0', '0', '2'), pt('B', '10', '0', '2'), pt('C', '0', '10', '2')], '0.00'],
    // 12 in over 10 ft = 10 %
    [
      [pt('A', '0', '0', '0'), pt('B', '10', '0', '12'), pt('C', '0', '10', '0'), pt('D', '10', '10', '12')],
      '10.00',
    ],
  ])('tilt of %j is %s %%', (points, tilt) => {
    expect(settlement({ points }).tiltPercent).toBe(tilt);
  });

  it('is not defined when all points lie on one line', () => {
    const result = settlement({
      points: [pt('A', '0', '0', '0'), pt('B', '10', '10', '1'), pt('C', '20', '20', '0')],
    });
    expect(result.tiltPercent).toBeNull();
    expect(result.tiltNote).toContain('one line');
  });
});

describe('settlement: input checks', () => {
  it.each([
    [{ points: [pt('A', '0', '0', '0')] }, 'points', 'at least 2'],
    [{ points: 'A' }, 'points', 'list'],
    [{ points: [pt('A', '0', '0', '0'), pt('A', '10', '0', '0')] }, 'points[1].label', 'unique'],
    [{ points: [pt('A', '0', '0', '0'), pt(' ', '10', '0', '0')] }, 'points[1].label', 'label'],
    [{ points: [pt('A', '0', '0', '0'), pt('B', '1e1', '0', '0')] }, 'points[1].xFt', 'not a plain decimal'],
    [
      { points: [pt('A', '0', '0', '0'), { label: 'B', xFt: '1', yFt: '0', elevationIn: 0.5 }] },
      'points[1].elevationIn',
      'string',
    ],
    [{ points: [pt('A', '0', '0', '0'), pt('B', '0', '0', '1')] }, 'points[1]', 'same place'],
  ])('refuses %j', (input, field, message) => {
    try {
      settlement(input as never);
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(CalculatorInputError);
      const detail = (error as CalculatorInputError).details.find((d) => d.field === field);
      expect(detail?.message).toContain(message);
    }
  });
});

describe('settlement: properties', () => {
  const survey = fc
    .uniqueArray(fc.tuple(fc.integer({ min: -40, max: 40 }), fc.integer({ min: -40, max: 40 })), {
      minLength: 2,
      maxLength: 12,
      selector: ([x, y]) => `${x},${y}`,
    })
    .chain((spots) =>
      fc.tuple(
        fc.constant(spots),
        fc.array(fc.integer({ min: -30, max: 30 }), { minLength: spots.length, maxLength: spots.length }),
      ),
    )
    .map(([spots, tenths]) =>
      spots.map(([x, y], i) =>
        pt(`P${i}`, String(x), String(y), new Decimal(tenths[i] ?? 0).div(10).toFixed()),
      ),
    );

  // β = dz / dist, kept as squares (dz², dist² in in²) so that comparisons are exact.
  const betaOf = (points: SettlementPointInput[], a: string, b: string) => {
    const p = points.find((q) => q.label === a);
    const q = points.find((r) => r.label === b);
    if (!p || !q) throw new Error('pair names an unknown point');
    const dx = new Decimal(p.xFt).minus(q.xFt);
    const dy = new Decimal(p.yFt).minus(q.yFt);
    const dz = new Decimal(p.elevationIn).minus(q.elevationIn).abs();
    return { dz, dz2: dz.pow(2), dist2: dx.pow(2).plus(dy.pow(2)).mul(144) };
  };
  const atLeast = (x: ReturnType<typeof betaOf>, y: ReturnType<typeof betaOf>) =>
    x.dz2.mul(y.dist2).gte(y.dz2.mul(x.dist2));

  it("the worst pair's β is at least every compared pair's β", () => {
    fc.assert(
      fc.property(survey, (points) => {
        const result = settlement({ points });
        const worst = betaOf(points, result.worstPair.a, result.worstPair.b);
        return result.pairs.every((p) => atLeast(worst, betaOf(points, p.a, p.b)));
      }),
    );
  });

  it('every point is in at least one compared pair, and the worst ratio 1/N never understates β', () => {
    fc.assert(
      fc.property(survey, (points) => {
        const result = settlement({ points });
        const covered = points.every((p) => result.pairs.some((q) => q.a === p.label || q.b === p.label));
        const worst = betaOf(points, result.worstPair.a, result.worstPair.b);
        const ratio = result.worstRatio;
        let notUnderstated: boolean;
        if (ratio === null) notUnderstated = worst.dz.isZero();
        else if (ratio === '>1/1') notUnderstated = worst.dz2.gt(worst.dist2);
        else {
          const n = new Decimal(ratio.slice(2));
          // 1/N ≥ β ⇔ N·dz ≤ dist, and N is the largest such whole number: (N+1)·dz > dist
          notUnderstated =
            worst.dz.mul(n).pow(2).lte(worst.dist2) && worst.dz.mul(n.plus(1)).pow(2).gt(worst.dist2);
        }
        return covered && notUnderstated;
      }),
    );
  });

  it('the largest difference is at least the worst pair’s difference', () => {
    fc.assert(
      fc.property(survey, (points) => {
        const result = settlement({ points });
        return new Decimal(result.maxDifferentialIn).gte(result.worstPair.differentialIn);
      }),
    );
  });
});
