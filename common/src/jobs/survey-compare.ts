// The inspection's floor-elevation survey beside the re-survey taken at completion.
//
// Each side is screened with the settlement calculator of #3 (largest difference in elevation and the
// worst neighbouring pair's angular distortion β = differential / distance, shown "1/N"; Skempton &
// MacDonald 1956 and Bjerrum 1963 bands, secondary). Per label found on both surveys: the change in
// inches, after − before (positive: the point reads higher than it did). Both surveys measure from their
// own reference point, so a change is meaningful when both use the same reference (sameReference).
// A screening comparison only: the engineer of record decides what it means.
import { CalcDecimal, formatCalcDecimal } from '../calculators/decimal';
import { SETTLEMENT_CAUTION, settlement } from '../calculators/settlement';
import type { SurveyComparison } from './api-types';

export interface ComparedPoint {
  label: string;
  xFt: string;
  yFt: string;
  elevationIn: string;
  isReference?: boolean;
}

function screen(points: readonly ComparedPoint[]) {
  if (points.length < 2) return null;
  return settlement({
    points: points.map(({ label, xFt, yFt, elevationIn }) => ({ label, xFt, yFt, elevationIn })),
  });
}

const plain = (v: string) => formatCalcDecimal(new CalcDecimal(v));

export function compareSurveys(
  before: readonly ComparedPoint[],
  after: readonly ComparedPoint[],
): SurveyComparison {
  const b = screen(before);
  const a = screen(after);
  const afterByLabel = new Map(after.map((p) => [p.label, p]));
  const changes = before
    .filter((p) => afterByLabel.has(p.label))
    .map((p) => {
      const q = afterByLabel.get(p.label)!;
      return {
        label: p.label,
        beforeIn: plain(p.elevationIn),
        afterIn: plain(q.elevationIn),
        changeIn: formatCalcDecimal(new CalcDecimal(q.elevationIn).minus(p.elevationIn)),
      };
    });
  const beforeRef = before.find((p) => p.isReference)?.label ?? null;
  const afterRef = after.find((p) => p.isReference)?.label ?? null;
  const side = (points: readonly ComparedPoint[]) =>
    points.map((p) => ({
      label: p.label,
      xFt: plain(p.xFt),
      yFt: plain(p.yFt),
      elevationIn: plain(p.elevationIn),
    }));
  return {
    before: side(before),
    after: side(after),
    beforeMaxDifferentialIn: b?.maxDifferentialIn ?? null,
    afterMaxDifferentialIn: a?.maxDifferentialIn ?? null,
    beforeWorstRatio: b?.worstRatio ?? null,
    afterWorstRatio: a?.worstRatio ?? null,
    changes,
    beforeBand: b ? b.band.label : null,
    afterBand: a ? a.band.label : null,
    sameReference: beforeRef !== null && beforeRef === afterRef,
    caution: SETTLEMENT_CAUTION,
  };
}
