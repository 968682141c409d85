// Polyurethane soil-stabilisation injection: points along a run, material and drum sets.
import { CAUTION_CALL_811, CAUTION_ENGINEER, CAUTION_ISOCYANATES, CAUTION_LIFTING } from './cautions';
import { ceilDivide, CalcDecimal, formatCalcDecimal } from './decimal';
import { InputCollector, requireInputObject } from './input';
import { countPointsAlongRun, MAX_POINTS_PER_RUN, pointCountWouldExceed } from './point-count';

/** Injection points about every 5 ft along the wall (common practice, REFERENCE-VALUES.md). */
export const DEFAULT_INJECTION_SPACING_FT = '5';
/** Rods to about 5 ft below the footing (common practice, REFERENCE-VALUES.md). */
export const DEFAULT_INJECTION_DEPTH_FT = '5';
/** About 20 lb of two-part material per point (common practice, REFERENCE-VALUES.md). */
export const DEFAULT_LB_PER_POINT = '20';
/**
 * Pounds of material in one drum set (a pair of 55-gallon drums, one per component).
 * 1000 lb is a common-practice assumption of ours, NOT from a published source: the real figure
 * depends on the product's density and the supplier's fill. Pass the supplier's figure when known.
 */
export const DEFAULT_LB_PER_DRUM_SET = '1000';

export interface InjectionPlanInput {
  /** Length of the run along the wall, ft. Must be > 0. */
  runLengthFt: string;
  /** Centre-to-centre spacing of the points, ft. Default "5" (common practice). */
  spacingFt?: string;
  /** Depth of the rods below the footing, ft. Default "5" (common practice). */
  depthFt?: string;
  /** Planned material per point, lb. Default "20" (common practice). */
  lbPerPoint?: string;
  /** Material in one drum set, lb. Default "1000" (our assumption, see DEFAULT_LB_PER_DRUM_SET). */
  lbPerDrumSet?: string;
  /** true for a full perimeter that closes on itself; false (default) for an open run with two ends. */
  closed?: boolean;
}

export interface InjectionPlanResult {
  points: number;
  totalLb: string;
  drumSets: number;
  /** Material left in the last drum set once the plan is used: drumSets × lbPerDrumSet − totalLb. */
  leftoverLb: string;
  runLengthFt: string;
  spacingFt: string;
  depthFt: string;
  lbPerPoint: string;
  lbPerDrumSet: string;
  closed: boolean;
  /** Open run: distance from the last point to the end of the run; closed run: null. */
  endGapFt: string | null;
  /** Rod depth summed over all points, ft (points × depthFt). */
  totalRodDepthFt: string;
  assumptions: string[];
  cautions: string[];
}

export function injectionPlan(input: InjectionPlanInput): InjectionPlanResult {
  const fields = requireInputObject(input, 'The injection plan');
  const v = new InputCollector();
  const length = v.decimal('runLengthFt', 'Run length (ft)', fields.runLengthFt, {
    positive: true,
    maxDecimals: 4,
  });
  const spacing = v.decimalOr('spacingFt', 'Spacing (ft)', fields.spacingFt, DEFAULT_INJECTION_SPACING_FT, {
    positive: true,
    maxDecimals: 4,
  });
  const depth = v.decimalOr('depthFt', 'Depth (ft)', fields.depthFt, DEFAULT_INJECTION_DEPTH_FT, {
    positive: true,
    maxDecimals: 4,
    max: { value: '200', why: 'check the units: the depth is in feet' },
  });
  const lbPerPoint = v.decimalOr(
    'lbPerPoint',
    'Material per point (lb)',
    fields.lbPerPoint,
    DEFAULT_LB_PER_POINT,
    {
      positive: true,
      maxDecimals: 4,
    },
  );
  const lbPerDrumSet = v.decimalOr(
    'lbPerDrumSet',
    'Material per drum set (lb)',
    fields.lbPerDrumSet,
    DEFAULT_LB_PER_DRUM_SET,
    {
      positive: true,
      maxDecimals: 4,
    },
  );
  const closed = v.booleanOr('closed', 'Closed perimeter', fields.closed, false);
  if (length && spacing && pointCountWouldExceed(length, spacing, MAX_POINTS_PER_RUN)) {
    v.add(
      'spacingFt',
      `This run would need more than ${MAX_POINTS_PER_RUN} points: check that both lengths are in feet.`,
    );
  }
  v.throwIfAny();
  // All defined after throwIfAny; the checks satisfy the compiler.
  if (!length || !spacing || !depth || !lbPerPoint || !lbPerDrumSet) throw new Error('unreachable');

  const { count, endGap } = countPointsAlongRun(length, spacing, closed);
  const totalLb = lbPerPoint.mul(count);
  const drumSets = ceilDivide(totalLb, lbPerDrumSet);
  const assumptions: string[] = [];
  if (fields.spacingFt === undefined) assumptions.push('Spacing of 5 ft between points (common practice).');
  if (fields.depthFt === undefined) assumptions.push('Rods to 5 ft below the footing (common practice).');
  if (fields.lbPerPoint === undefined) assumptions.push('20 lb of material per point (common practice).');
  if (fields.lbPerDrumSet === undefined) {
    assumptions.push(
      "1000 lb of material per drum set (pair of 55-gallon drums): our assumption, not a published figure; use the supplier's figure.",
    );
  }
  assumptions.push(
    'A point is finished when material returns to the surface nearby, when the slab or a pipe starts to lift, or when ' +
      'the planned quantity is reached, so the material used can differ from the plan.',
  );

  return {
    points: count,
    totalLb: formatCalcDecimal(totalLb),
    drumSets: drumSets.toNumber(),
    leftoverLb: formatCalcDecimal(drumSets.mul(lbPerDrumSet).minus(totalLb)),
    runLengthFt: formatCalcDecimal(length),
    spacingFt: formatCalcDecimal(spacing),
    depthFt: formatCalcDecimal(depth),
    lbPerPoint: formatCalcDecimal(lbPerPoint),
    lbPerDrumSet: formatCalcDecimal(lbPerDrumSet),
    closed,
    endGapFt: endGap === null ? null : formatCalcDecimal(endGap),
    totalRodDepthFt: formatCalcDecimal(new CalcDecimal(count).mul(depth)),
    assumptions,
    cautions: [CAUTION_CALL_811, CAUTION_ISOCYANATES, CAUTION_LIFTING, CAUTION_ENGINEER],
  };
}
