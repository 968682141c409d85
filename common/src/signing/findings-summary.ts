// The findings of an inspection in words, for the homeowner: what the proposal and the contract print and
// what the signing page shows. Observations only (FINDINGS_CAUTION), and the survey's screening figure with
// its caution (SETTLEMENT_CAUTION): neither is an engineering determination.
import type { SettlementResult } from '../calculators/settlement';
import { SETTLEMENT_CAUTION } from '../calculators/settlement';
import {
  CRACK_ORIENTATION_LABELS,
  FINDINGS_CAUTION,
  FINDINGS_ITEMS,
  GRADING_LABELS,
  GUTTER_COVERAGE_LABELS,
  SOIL_MOISTURE_LABELS,
  SOIL_TYPE_LABELS,
  type CrackFinding,
  type DrainageFinding,
  type FindingsItemKey,
  type InspectionFindings,
  type LocationFinding,
  type ObservedFinding,
  type SoilFinding,
} from '../inspections/findings';

export interface FindingsSummaryItem {
  key: FindingsItemKey;
  label: string;
  /** One line per observation; "None seen." for an empty list; "Not recorded." when unanswered. */
  lines: string[];
  /** The item's safety caution, shown only when something was observed. */
  caution: string | null;
}

export interface SurveySummary {
  pointCount: number;
  /** Highest minus lowest reading, inches. */
  maxDifferentialIn: string;
  highestLabel: string;
  lowestLabel: string;
  /** The worst neighbouring pair's angular distortion, "1/N"; null when the floor reads level. */
  worstRatio: string | null;
  worstPair: { a: string; b: string; differentialIn: string; distanceFt: string };
  band: { code: string; label: string; source: string };
  /** Always shown with the figures: a screening figure, not an engineering determination. */
  caution: string;
}

export interface FindingsSummary {
  inspectionId: string;
  /** The day of the visit on the branch's clock, 'YYYY-MM-DD'; null while not completed. */
  inspectedOn: string | null;
  summary: string | null;
  items: FindingsSummaryItem[];
  survey: SurveySummary | null;
  caution: string;
}

const withNote = (text: string, note?: string) => (note?.trim() ? `${text} (${note.trim()})` : text);

function crackLine(c: CrackFinding): string {
  return withNote(
    `${c.location}: ${c.widthIn} in wide, ${CRACK_ORIENTATION_LABELS[c.orientation]?.toLowerCase() ?? c.orientation}`,
    c.note,
  );
}

function observedLine(o: ObservedFinding): string {
  return withNote(o.observed ? 'Observed' : 'Not observed', o.note);
}

function drainageLines(d: DrainageFinding): string[] {
  const lines = [
    GUTTER_COVERAGE_LABELS[d.gutters] ?? d.gutters,
    d.downspoutsDischargeNearFoundation
      ? 'Downspouts discharge near the foundation'
      : 'Downspouts discharge away from the foundation',
    `Ground: ${(GRADING_LABELS[d.grading] ?? d.grading).toLowerCase()}`,
  ];
  if (d.note?.trim()) lines.push(d.note.trim());
  return lines;
}

function soilLine(s: SoilFinding): string {
  return withNote(
    `${SOIL_TYPE_LABELS[s.type] ?? s.type}, ${(SOIL_MOISTURE_LABELS[s.moisture] ?? s.moisture).toLowerCase()}`,
    s.note,
  );
}

/** Did the item record something (a crack, a sticking door, an observed condition)? */
function somethingSeen(value: unknown): boolean {
  if (Array.isArray(value)) return value.length > 0;
  if (value && typeof value === 'object' && 'observed' in value) return (value as ObservedFinding).observed;
  return false;
}

/** Every checklist item, in the checklist's order, in words. */
export function describeFindings(
  findings: Partial<InspectionFindings> | null | undefined,
): FindingsSummaryItem[] {
  const f = (findings ?? {}) as Partial<InspectionFindings>;
  return FINDINGS_ITEMS.map((item) => {
    const value = f[item.key];
    let lines: string[];
    if (value === undefined || value === null) lines = ['Not recorded.'];
    else if (item.kind === 'cracks') {
      const list = value as CrackFinding[];
      lines = list.length ? list.map(crackLine) : ['None seen.'];
    } else if (item.kind === 'locations') {
      const list = value as LocationFinding[];
      lines = list.length ? list.map((l) => withNote(l.location, l.note)) : ['None seen.'];
    } else if (item.kind === 'observed') lines = [observedLine(value as ObservedFinding)];
    else if (item.kind === 'drainage') lines = drainageLines(value as DrainageFinding);
    else lines = [soilLine(value as SoilFinding)];
    return {
      key: item.key,
      label: item.label,
      lines,
      caution: item.caution && somethingSeen(value) ? item.caution : null,
    };
  });
}

/** The survey's headline figures, with the band's source and the screening caution. */
export function summariseSurvey(result: SettlementResult | null | undefined): SurveySummary | null {
  if (!result) return null;
  return {
    pointCount: result.pointCount,
    maxDifferentialIn: result.maxDifferentialIn,
    highestLabel: result.highest.label,
    lowestLabel: result.lowest.label,
    worstRatio: result.worstRatio,
    worstPair: {
      a: result.worstPair.a,
      b: result.worstPair.b,
      differentialIn: result.worstPair.differentialIn,
      distanceFt: result.worstPair.distanceFt,
    },
    band: { code: result.band.code, label: result.band.label, source: result.band.source },
    caution: SETTLEMENT_CAUTION,
  };
}

export function findingsSummary(p: {
  inspectionId: string;
  inspectedOn: string | null;
  summary: string | null;
  findings: Partial<InspectionFindings> | null | undefined;
  survey: SettlementResult | null | undefined;
}): FindingsSummary {
  return {
    inspectionId: p.inspectionId,
    inspectedOn: p.inspectedOn,
    summary: p.summary?.trim() ? p.summary.trim() : null,
    items: describeFindings(p.findings),
    survey: summariseSurvey(p.survey),
    caution: FINDINGS_CAUTION,
  };
}
