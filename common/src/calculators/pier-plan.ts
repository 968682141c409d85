// Steel push piers (or helical piles) along a run: how many at a given spacing.
import { CAUTION_CALL_811, CAUTION_ENGINEER, CAUTION_LIFTING } from './cautions';
import { formatCalcDecimal } from './decimal';
import { InputCollector, requireInputObject } from './input';
import { countPointsAlongRun, MAX_POINTS_PER_RUN, pointCountWouldExceed } from './point-count';

export interface PierPlanInput {
  /** Length of the run along the footing, ft. Must be > 0. */
  runLengthFt: string;
  /**
   * Centre-to-centre pier spacing, ft. Required, with no default: pier spacing comes from the
   * design (loads, footing, pier capacity), not from a rule of thumb.
   */
  spacingFt: string;
  /** true for a full perimeter; false (default) for an open run with two ends. */
  closed?: boolean;
}

export interface PierPlanResult {
  piers: number;
  runLengthFt: string;
  spacingFt: string;
  closed: boolean;
  /** Open run: distance from the last pier to the end of the run; closed run: null. */
  endGapFt: string | null;
  cautions: string[];
}

export function pierPlan(input: PierPlanInput): PierPlanResult {
  const fields = requireInputObject(input, 'The pier plan');
  const v = new InputCollector();
  const length = v.decimal('runLengthFt', 'Run length (ft)', fields.runLengthFt, {
    positive: true,
    maxDecimals: 4,
  });
  const spacing = v.decimal('spacingFt', 'Pier spacing (ft)', fields.spacingFt, {
    positive: true,
    maxDecimals: 4,
  });
  const closed = v.booleanOr('closed', 'Closed perimeter', fields.closed, false);
  if (length && spacing && pointCountWouldExceed(length, spacing, MAX_POINTS_PER_RUN)) {
    v.add(
      'spacingFt',
      `This run would need more than ${MAX_POINTS_PER_RUN} piers: check that both lengths are in feet.`,
    );
  }
  v.throwIfAny();
  if (!length || !spacing) throw new Error('unreachable');

  const { count, endGap } = countPointsAlongRun(length, spacing, closed);
  return {
    piers: count,
    runLengthFt: formatCalcDecimal(length),
    spacingFt: formatCalcDecimal(spacing),
    closed,
    endGapFt: endGap === null ? null : formatCalcDecimal(endGap),
    cautions: [CAUTION_CALL_811, CAUTION_LIFTING, CAUTION_ENGINEER],
  };
}
