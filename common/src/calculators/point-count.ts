// How many points (injection points, piers) fit along a run at a given centre-to-centre spacing.
//
// Open run (a straight wall with two ends): a point at the start and one every `spacing` after it,
//   floor(L / s) + 1 points. When L is not a whole number of spacings, the last point stands
//   L − floor(L/s)·s short of the end; that distance is reported as `endGapFt` so the planner sees it.
// Closed run (a full perimeter): the last gap closes back onto the first point, ceil(L / s) points,
//   so no gap is longer than the spacing.
// A zero-length run is refused by the callers (it is an input mistake, not a one-point job).
import { CalcDecimalValue, ceilDivide, floorDivide } from './decimal';

/** Counts above this are refused as a probable unit mistake (for example inches typed as feet). */
export const MAX_POINTS_PER_RUN = 100_000;

export interface PointCount {
  count: number;
  /** Open runs: distance from the last point to the end of the run. Closed runs: null. */
  endGap: CalcDecimalValue | null;
}

export function countPointsAlongRun(
  length: CalcDecimalValue,
  spacing: CalcDecimalValue,
  closed: boolean,
): PointCount {
  if (closed) {
    return { count: ceilDivide(length, spacing).toNumber(), endGap: null };
  }
  const spans = floorDivide(length, spacing);
  return { count: spans.plus(1).toNumber(), endGap: length.minus(spans.mul(spacing)) };
}

/** The count without building it, to refuse absurd inputs before any work. */
export function pointCountWouldExceed(
  length: CalcDecimalValue,
  spacing: CalcDecimalValue,
  limit: number,
): boolean {
  return length.div(spacing).gt(limit);
}
