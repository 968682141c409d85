import {
  money,
  SURVEY_DECIMAL_PATTERN,
  SURVEY_LABEL_MAX_LENGTH,
  type SettlementPointInput,
  type SurveyPoint,
} from '@loambook/common';
import { isApiError } from '@/lib/api-client';

/** A row of the survey grid as typed: decimal strings from the keyboard to the wire. */
export interface SurveyRow {
  key: string;
  label: string;
  xFt: string;
  yFt: string;
  elevationIn: string;
}

export type SurveyColumn = 'label' | 'xFt' | 'yFt' | 'elevationIn';
export const SURVEY_COLUMNS: readonly SurveyColumn[] = ['label', 'xFt', 'yFt', 'elevationIn'];
export const COLUMN_LABELS: Record<SurveyColumn, string> = {
  label: 'Label',
  xFt: 'X (ft)',
  yFt: 'Y (ft)',
  elevationIn: 'Elevation (in)',
};

let next = 0;
export const rowKey = () => `p${++next}`;

/** A, B, … Z, AA, AB …: the next label not yet used. */
export function nextLabel(rows: SurveyRow[]): string {
  const used = new Set(rows.map((r) => r.label.trim()));
  for (let n = 0; ; n++) {
    let label = '';
    let k = n;
    do {
      label = String.fromCharCode(65 + (k % 26)) + label;
      k = Math.floor(k / 26) - 1;
    } while (k >= 0);
    if (!used.has(label)) return label;
  }
}

export function rowsFromPoints(points: SurveyPoint[]): SurveyRow[] {
  return points.map((p) => ({ key: rowKey(), ...p }));
}

/** A new survey starts with its reference point at the origin, reading 0. */
export function startingRows(): SurveyRow[] {
  return [{ key: rowKey(), label: 'A', xFt: '0', yFt: '0', elevationIn: '0' }];
}

export const DECIMAL_MESSAGE = 'A number with at most 2 decimals, e.g. 12.5 or -0.75.';

const isZero = (v: string) => {
  try {
    return money(v.trim()).isZero();
  } catch {
    return false;
  }
};

/** Faults keyed "rowKey.column" (and "reference"). */
export type SurveyErrors = Record<string, string>;

export function validateSurvey(rows: SurveyRow[], referenceKey: string | null): SurveyErrors {
  const e: SurveyErrors = {};
  const seen = new Map<string, string>();
  for (const r of rows) {
    const label = r.label.trim();
    if (!label) e[`${r.key}.label`] = 'Give the point a label.';
    else if (label.length > SURVEY_LABEL_MAX_LENGTH)
      e[`${r.key}.label`] = `At most ${SURVEY_LABEL_MAX_LENGTH} characters.`;
    else if (seen.has(label)) e[`${r.key}.label`] = `"${label}" is used twice: labels must be unique.`;
    else seen.set(label, r.key);
    for (const c of ['xFt', 'yFt', 'elevationIn'] as const) {
      if (!SURVEY_DECIMAL_PATTERN.test(r[c].trim()))
        e[`${r.key}.${c}`] = r[c].trim() ? DECIMAL_MESSAGE : 'Enter a reading.';
    }
  }
  if (!referenceKey || !rows.some((r) => r.key === referenceKey)) {
    e.reference = 'Choose the reference point: the one every elevation is measured from.';
  } else {
    const ref = rows.find((r) => r.key === referenceKey)!;
    if (!e[`${ref.key}.elevationIn`] && !isZero(ref.elevationIn)) {
      e[`${ref.key}.elevationIn`] = 'The reference point reads 0: every other elevation is relative to it.';
    }
  }
  if (rows.length < 2) e.rows = 'A survey needs at least 2 points.';
  return e;
}

/** The rows complete and valid enough to screen now, or null when fewer than two are. */
export function previewPoints(rows: SurveyRow[]): SettlementPointInput[] | null {
  const seen = new Set<string>();
  const points: SettlementPointInput[] = [];
  for (const r of rows) {
    const label = r.label.trim();
    if (!label || label.length > SURVEY_LABEL_MAX_LENGTH || seen.has(label)) continue;
    if (!(['xFt', 'yFt', 'elevationIn'] as const).every((c) => SURVEY_DECIMAL_PATTERN.test(r[c].trim())))
      continue;
    seen.add(label);
    points.push({ label, xFt: r.xFt.trim(), yFt: r.yFt.trim(), elevationIn: r.elevationIn.trim() });
  }
  return points.length >= 2 ? points : null;
}

export function toPoints(rows: SurveyRow[]): SurveyPoint[] {
  return rows.map((r) => ({
    label: r.label.trim(),
    xFt: r.xFt.trim(),
    yFt: r.yFt.trim(),
    elevationIn: r.elevationIn.trim(),
  }));
}

/**
 * The server's faults on the grid's cells: "points.2.elevationIn" (validation), "points[2].elevationIn"
 * (the reference rule), "points[2]" (two points at one spot), "referenceLabel". The rest go above the grid.
 */
export function surveyServerErrors(
  error: unknown,
  rows: SurveyRow[],
): { cells: SurveyErrors; form: string | null } {
  if (!isApiError(error)) return { cells: {}, form: 'Something went wrong. Try again.' };
  const cells: SurveyErrors = {};
  const loose: string[] = [];
  for (const { field, message } of error.fieldErrors) {
    const m = /^points(?:\.(\d+)|\[(\d+)\])(?:\.(label|xFt|yFt|elevationIn))?$/.exec(field);
    const row = m ? rows[Number(m[1] ?? m[2])] : undefined;
    if (m && row) cells[`${row.key}.${m[3] ?? 'xFt'}`] = message;
    else if (field === 'referenceLabel') cells.reference = message;
    else loose.push(message);
  }
  const form = loose.length || Object.keys(cells).length === 0 ? [error.message, ...loose].join(' ') : null;
  return { cells, form };
}

/** A reading's sign flipped, as typed ("0.75" ↔ "-0.75"): tablets' number pads often have no minus key. */
export function flipSign(value: string): string {
  const v = value.trim();
  if (!v) return '-';
  return v.startsWith('-') ? v.slice(1) : `-${v}`;
}

/** The points as the database keeps them (2 decimals: "-0.5" is "-0.50"), to tell whether anything changed. */
export function normalisedPoints(points: SurveyPoint[]): string {
  const n = (v: string) => {
    try {
      return money(v.trim()).toFixed(2);
    } catch {
      return v.trim();
    }
  };
  return JSON.stringify(
    points.map((p) => ({
      label: p.label.trim(),
      xFt: n(p.xFt),
      yFt: n(p.yFt),
      elevationIn: n(p.elevationIn),
    })),
  );
}
