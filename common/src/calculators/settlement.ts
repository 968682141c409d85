// Settlement screening from a floor-elevation survey.
//
// Angular distortion between two points: β = differential settlement / distance between them, both
// in inches (REFERENCE-VALUES.md). Shown as "1/N" with N rounded DOWN to a whole number, which shows
// the distortion as slightly larger than it is, never smaller.
//
// Which pairs are compared ("neighbouring pairs", our choice; no source prescribes one):
//   for each point P, let d(P) be the distance to its nearest other point; the pair (P, Q) is
//   compared when |PQ| ≤ 1.5 × d(P) or |PQ| ≤ 1.5 × d(Q). On a square survey grid this takes the
//   four sides and both diagonals of each cell (diagonal = 1.414 × side) and not the points two
//   cells away. Comparing far-apart points would dilute β; comparing only nearest neighbours would
//   miss the diagonals.
//
// Bands (screening only), each lower bound INCLUSIVE: reaching 1/300 counts as beyond 1/300.
//   β < 1/500            within-1/500   Bjerrum (1963) safe limit where cracking is not permissible (secondary)
//   1/500 ≤ β < 1/300    beyond-1/500
//   1/300 ≤ β < 1/150    beyond-1/300   Skempton & MacDonald (1956) first cracking of panel walls (secondary)
//   β ≥ 1/150            beyond-1/150   Skempton & MacDonald (1956) structural damage (secondary)
//
// Exactness: distances involve square roots, so every comparison (bands, worst pair, the N of "1/N")
// is done on squares, which decimal arithmetic computes exactly. Square roots are taken only to
// display distances and the tilt.
//
// Overall tilt: least-squares plane z = a + b·x + c·y through all points, x and y in ft, z converted
// from inches to ft, tilt % = 100 × √(b² + c²). Needs three points not on one line; otherwise null.
import { CalcDecimal, CalcDecimalValue, formatCalcDecimal } from './decimal';
import { CalculatorInputError } from './errors';
import { InputCollector, requireInputObject } from './input';

export const SETTLEMENT_NEIGHBOUR_FACTOR = '1.5';
export const SETTLEMENT_MAX_POINTS = 500;

const SOURCE_BJERRUM = 'Bjerrum (1963), Proc. European Conf. SMFE, Wiesbaden (secondary)';
const SOURCE_SKEMPTON =
  'Skempton & MacDonald (1956), "The Allowable Settlements of Buildings", Proc. ICE Part III (secondary)';

export type SettlementBandCode = 'within-1/500' | 'beyond-1/500' | 'beyond-1/300' | 'beyond-1/150';

export interface SettlementBand {
  code: SettlementBandCode;
  label: string;
  source: string;
}

/** The bands, from the least to the most distortion. `from` is the inclusive lower bound 1/from. */
export const SETTLEMENT_BANDS: readonly (SettlementBand & { fromDenominator: number | null })[] = [
  {
    code: 'within-1/500',
    fromDenominator: null,
    label: 'Under 1/500: inside the limit given for buildings where no cracking is acceptable',
    source: SOURCE_BJERRUM,
  },
  {
    code: 'beyond-1/500',
    fromDenominator: 500,
    label: '1/500 or more: past the limit given for buildings where no cracking is acceptable',
    source: SOURCE_BJERRUM,
  },
  {
    code: 'beyond-1/300',
    fromDenominator: 300,
    label: '1/300 or more: the distortion at which cracking of panel walls was first observed',
    source: SOURCE_SKEMPTON,
  },
  {
    code: 'beyond-1/150',
    fromDenominator: 150,
    label: '1/150 or more: the distortion associated with structural damage',
    source: SOURCE_SKEMPTON,
  },
];

export const SETTLEMENT_CAUTION =
  'A screening figure from a floor-elevation survey, not an engineering determination. Floors are not always built ' +
  'level, so a difference in elevation is not always settlement. The engineer of record and the local building ' +
  'department decide what it means and what, if anything, to do.';

export interface SettlementPointInput {
  label: string;
  xFt: string;
  yFt: string;
  /** Reading in inches, larger = higher, relative to any fixed datum (the same for every point). */
  elevationIn: string;
}

export interface SettlementInput {
  points: SettlementPointInput[];
}

export interface SettlementPair {
  a: string;
  b: string;
  differentialIn: string;
  distanceFt: string;
  /** "1/N", N rounded down; ">1/1" when the differential exceeds the distance; null when there is no differential. */
  ratio: string | null;
  band: SettlementBand;
}

export interface SettlementResult {
  pointCount: number;
  maxDifferentialIn: string;
  highest: { label: string; elevationIn: string };
  lowest: { label: string; elevationIn: string };
  worstPair: SettlementPair;
  worstRatio: string | null;
  band: SettlementBand;
  /** The neighbouring pairs, worst (largest β) first. */
  pairs: SettlementPair[];
  neighbourRule: string;
  /** Tilt of the best-fit plane, percent (2 decimals); null when the points lie on one line. */
  tiltPercent: string | null;
  tiltNote: string;
  caution: string;
  warnings: string[];
}

interface ParsedPoint {
  label: string;
  x: CalcDecimalValue;
  y: CalcDecimalValue;
  z: CalcDecimalValue;
}

interface PairMath {
  i: number;
  j: number;
  dz: CalcDecimalValue; // |Δz|, in
  distIn2: CalcDecimalValue; // distance², in²
  dist2Ft: CalcDecimalValue; // distance², ft²
}

export function settlement(input: SettlementInput): SettlementResult {
  const points = parsePoints(input);
  const n = points.length;

  const dist2 = (p: ParsedPoint, q: ParsedPoint): CalcDecimalValue => {
    const dx = p.x.minus(q.x);
    const dy = p.y.minus(q.y);
    return dx.mul(dx).plus(dy.mul(dy));
  };

  // Nearest-neighbour distance² per point, and refusal of two points at one spot.
  const nearest2: CalcDecimalValue[] = [];
  for (let i = 0; i < n; i++) {
    let best: CalcDecimalValue | undefined;
    for (let j = 0; j < n; j++) {
      if (i === j) continue;
      const d2 = dist2(at(points, i), at(points, j));
      if (d2.isZero()) {
        throw new CalculatorInputError([
          {
            field: `points[${Math.max(i, j)}]`,
            message: `Points "${at(points, i).label}" and "${at(points, j).label}" are at the same place: give each reading its own position.`,
          },
        ]);
      }
      if (!best || d2.lt(best)) best = d2;
    }
    nearest2.push(best as CalcDecimalValue);
  }

  const factor2 = new CalcDecimal(SETTLEMENT_NEIGHBOUR_FACTOR).pow(2);
  const pairs: PairMath[] = [];
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const d2 = dist2(at(points, i), at(points, j));
      const neighbour = d2.lte(factor2.mul(at(nearest2, i))) || d2.lte(factor2.mul(at(nearest2, j)));
      if (!neighbour) continue;
      pairs.push({
        i,
        j,
        dz: at(points, i).z.minus(at(points, j).z).abs(),
        distIn2: d2.mul(144),
        dist2Ft: d2,
      });
    }
  }
  // Worst first: β_p > β_q  ⇔  dz_p² · dist_q² > dz_q² · dist_p². Ties keep survey order.
  pairs.sort((p, q) => q.dz.pow(2).mul(p.distIn2).comparedTo(p.dz.pow(2).mul(q.distIn2)));

  const warnings: string[] = [];
  const shownPairs = pairs.map((p) => {
    const shown = describePair(points, p);
    if (shown.ratio === '>1/1') {
      warnings.push(
        `Between "${shown.a}" and "${shown.b}" the difference in elevation is larger than the distance between them: ` +
          'check the survey for a step in the floor or a reading typed wrongly.',
      );
    }
    return shown;
  });
  const worstPair = shownPairs[0] as SettlementPair; // n ≥ 2 guarantees at least one pair

  let highest = at(points, 0);
  let lowest = at(points, 0);
  for (const p of points) {
    if (p.z.gt(highest.z)) highest = p;
    if (p.z.lt(lowest.z)) lowest = p;
  }

  const tilt = planeTiltPercent(points);
  return {
    pointCount: n,
    maxDifferentialIn: formatCalcDecimal(highest.z.minus(lowest.z)),
    highest: { label: highest.label, elevationIn: formatCalcDecimal(highest.z) },
    lowest: { label: lowest.label, elevationIn: formatCalcDecimal(lowest.z) },
    worstPair,
    worstRatio: worstPair.ratio,
    band: worstPair.band,
    pairs: shownPairs,
    neighbourRule:
      `Pairs compared: points whose distance apart is at most ${SETTLEMENT_NEIGHBOUR_FACTOR} times the distance from ` +
      'either of them to its nearest other point.',
    tiltPercent: tilt === null ? null : formatCalcDecimal(tilt, 2),
    tiltNote:
      tilt === null
        ? 'All points lie on one line, so the tilt of the floor as a whole cannot be found; survey points off that line.'
        : 'Slope of the best-fit (least-squares) plane through all points: rise over run, in percent.',
    caution: SETTLEMENT_CAUTION,
    warnings,
  };
}

/** The band for a distortion dz / √distIn2, compared exactly on squares. */
export function settlementBandFor(dzIn: CalcDecimalValue, distIn2: CalcDecimalValue): SettlementBand {
  let band = SETTLEMENT_BANDS[0] as SettlementBand;
  for (const candidate of SETTLEMENT_BANDS) {
    if (candidate.fromDenominator === null) continue;
    // β ≥ 1/k  ⇔  (k · dz)² ≥ dist²
    if (dzIn.mul(candidate.fromDenominator).pow(2).gte(distIn2)) band = candidate;
  }
  const { code, label, source } = band;
  return { code, label, source };
}

/** Largest whole N with N · dz ≤ dist, i.e. floor(dist / dz), found exactly on squares. */
function ratioDenominator(dz: CalcDecimalValue, distIn2: CalcDecimalValue): CalcDecimalValue {
  let q = distIn2.sqrt().div(dz).floor();
  const fits = (k: CalcDecimalValue) => k.mul(dz).pow(2).lte(distIn2);
  while (q.gt(0) && !fits(q)) q = q.minus(1);
  while (fits(q.plus(1))) q = q.plus(1);
  return q;
}

function describePair(points: ParsedPoint[], p: PairMath): SettlementPair {
  let ratio: string | null = null;
  if (!p.dz.isZero()) {
    const denominator = ratioDenominator(p.dz, p.distIn2);
    ratio = denominator.isZero() ? '>1/1' : `1/${denominator.toFixed(0)}`;
  }
  return {
    a: at(points, p.i).label,
    b: at(points, p.j).label,
    differentialIn: formatCalcDecimal(p.dz),
    distanceFt: formatCalcDecimal(p.dist2Ft.sqrt(), 2),
    ratio,
    band: settlementBandFor(p.dz, p.distIn2),
  };
}

/** Least-squares plane tilt in percent, or null when the points are collinear. */
function planeTiltPercent(points: ParsedPoint[]): CalcDecimalValue | null {
  const n = new CalcDecimal(points.length);
  const zero = new CalcDecimal(0);
  let sx = zero,
    sy = zero,
    sz = zero,
    sxx = zero,
    syy = zero,
    sxy = zero,
    sxz = zero,
    syz = zero;
  for (const p of points) {
    sx = sx.plus(p.x);
    sy = sy.plus(p.y);
    sz = sz.plus(p.z);
    sxx = sxx.plus(p.x.mul(p.x));
    syy = syy.plus(p.y.mul(p.y));
    sxy = sxy.plus(p.x.mul(p.y));
    sxz = sxz.plus(p.x.mul(p.z));
    syz = syz.plus(p.y.mul(p.z));
  }
  // n-scaled centred sums; exact, no division by n.
  const a = n.mul(sxx).minus(sx.mul(sx));
  const b = n.mul(syy).minus(sy.mul(sy));
  const c = n.mul(sxy).minus(sx.mul(sy));
  const p = n.mul(sxz).minus(sx.mul(sz));
  const q = n.mul(syz).minus(sy.mul(sz));
  const det = a.mul(b).minus(c.mul(c));
  if (det.isZero()) return null;
  const slopeX = p.mul(b).minus(q.mul(c)).div(det); // in per ft
  const slopeY = q.mul(a).minus(p.mul(c)).div(det); // in per ft
  return slopeX.pow(2).plus(slopeY.pow(2)).sqrt().div(12).mul(100);
}

function parsePoints(input: SettlementInput): ParsedPoint[] {
  const fields = requireInputObject(input, 'The settlement survey');
  const raw = fields.points;
  if (!Array.isArray(raw)) {
    throw new CalculatorInputError([
      { field: 'points', message: 'Points must be a list of survey readings.' },
    ]);
  }
  if (raw.length < 2) {
    throw new CalculatorInputError([
      { field: 'points', message: 'Give at least 2 survey points: a differential needs two readings.' },
    ]);
  }
  if (raw.length > SETTLEMENT_MAX_POINTS) {
    throw new CalculatorInputError([
      { field: 'points', message: `Give at most ${SETTLEMENT_MAX_POINTS} survey points.` },
    ]);
  }
  const v = new InputCollector();
  const seen = new Map<string, number>();
  const parsed: ParsedPoint[] = [];
  raw.forEach((item: unknown, index) => {
    const field = `points[${index}]`;
    if (typeof item !== 'object' || item === null) {
      v.add(field, `Point ${index + 1} must have a label, xFt, yFt and elevationIn.`);
      return;
    }
    const point = item as Record<string, unknown>;
    const label = typeof point.label === 'string' ? point.label.trim() : '';
    if (label === '') {
      v.add(`${field}.label`, `Point ${index + 1} needs a label.`);
    } else if (seen.has(label)) {
      v.add(
        `${field}.label`,
        `Label "${label}" is used by points ${(seen.get(label) ?? 0) + 1} and ${index + 1}: labels must be unique.`,
      );
    } else {
      seen.set(label, index);
    }
    const name = label === '' ? `Point ${index + 1}` : `Point "${label}"`;
    const coordinate = { allowNegative: true, maxDecimals: 4, maxIntegerDigits: 6 };
    const x = v.decimal(`${field}.xFt`, `${name}: x (ft)`, point.xFt, coordinate);
    const y = v.decimal(`${field}.yFt`, `${name}: y (ft)`, point.yFt, coordinate);
    const z = v.decimal(`${field}.elevationIn`, `${name}: elevation (in)`, point.elevationIn, coordinate);
    if (x && y && z) parsed.push({ label, x, y, z });
  });
  v.throwIfAny();
  return parsed;
}

function at<T>(list: readonly T[], index: number): T {
  const value = list[index];
  if (value === undefined) throw new Error(`index ${index} out of range`);
  return value;
}
