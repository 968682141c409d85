import type { BankCsvMapping, BankCsvMappingSuggestion, BankDateFormat } from '@loambook/common';

/** The column choice as the form holds it: anything may still be missing. */
export interface MappingDraft {
  hasHeaderRow: boolean;
  dateColumn: number | null;
  descriptionColumn: number | null;
  amountKind: 'signed' | 'debit_credit';
  amountColumn: number | null;
  debitColumn: number | null;
  creditColumn: number | null;
  dateFormat: BankDateFormat | null;
}

export type MappingField =
  'dateColumn' | 'descriptionColumn' | 'amountColumn' | 'debitColumn' | 'creditColumn' | 'dateFormat';

export const EMPTY_DRAFT: MappingDraft = {
  hasHeaderRow: true,
  dateColumn: null,
  descriptionColumn: null,
  amountKind: 'signed',
  amountColumn: null,
  debitColumn: null,
  creditColumn: null,
  dateFormat: null,
};

export const DATE_FORMAT_LABELS: Record<BankDateFormat, string> = {
  'YYYY-MM-DD': 'Year-month-day (2026-11-04)',
  'MM/DD/YYYY': 'Month/day/year (11/04/2026)',
  'DD/MM/YYYY': 'Day/month/year (04/11/2026)',
};

export function draftFrom(mapping: BankCsvMapping | null): MappingDraft {
  if (!mapping) return EMPTY_DRAFT;
  return {
    hasHeaderRow: mapping.hasHeaderRow,
    dateColumn: mapping.dateColumn,
    descriptionColumn: mapping.descriptionColumn,
    amountKind: mapping.amount.kind,
    amountColumn: mapping.amount.kind === 'signed' ? mapping.amount.column : null,
    debitColumn: mapping.amount.kind === 'debit_credit' ? mapping.amount.debitColumn : null,
    creditColumn: mapping.amount.kind === 'debit_credit' ? mapping.amount.creditColumn : null,
    dateFormat: mapping.dateFormat,
  };
}

/**
 * The start of the form when the server had no whole mapping: the columns its guess did find (say the
 * description and the debit and credit columns, but no date column), so the bookkeeper chooses only the rest.
 */
export function draftFromSuggestion(s: BankCsvMappingSuggestion): MappingDraft {
  return {
    hasHeaderRow: s.hasHeaderRow,
    dateColumn: s.dateColumn,
    descriptionColumn: s.descriptionColumn,
    amountKind: s.amount?.kind ?? 'signed',
    amountColumn: s.amount?.kind === 'signed' ? s.amount.column : null,
    debitColumn: s.amount?.kind === 'debit_credit' ? s.amount.debitColumn : null,
    creditColumn: s.amount?.kind === 'debit_credit' ? s.amount.creditColumn : null,
    dateFormat: s.dateFormat,
  };
}

/** The short names of the date formats, for sentences ("month/day/year or day/month/year"). */
export const DATE_FORMAT_NAMES: Record<BankDateFormat, string> = {
  'YYYY-MM-DD': 'year-month-day',
  'MM/DD/YYYY': 'month/day/year',
  'DD/MM/YYYY': 'day/month/year',
};

/**
 * The mapping the draft makes, or what is missing or wrong, by field (the same rules the server applies:
 * every column chosen once, a date format picked).
 */
export function mappingFrom(
  d: MappingDraft,
):
  | { mapping: BankCsvMapping; errors: null }
  | { mapping: null; errors: Partial<Record<MappingField, string>> } {
  const errors: Partial<Record<MappingField, string>> = {};
  if (d.dateColumn === null) errors.dateColumn = 'Choose the column with the date.';
  if (d.dateFormat === null) errors.dateFormat = 'Choose how the dates are written.';
  if (d.amountKind === 'signed') {
    if (d.amountColumn === null) errors.amountColumn = 'Choose the column with the amount.';
  } else {
    if (d.debitColumn === null) errors.debitColumn = 'Choose the column with money out.';
    if (d.creditColumn === null) errors.creditColumn = 'Choose the column with money in.';
  }
  const chosen: [MappingField, number | null][] = [
    ['dateColumn', d.dateColumn],
    ['descriptionColumn', d.descriptionColumn],
    ...((d.amountKind === 'signed'
      ? [['amountColumn', d.amountColumn]]
      : [
          ['debitColumn', d.debitColumn],
          ['creditColumn', d.creditColumn],
        ]) as [MappingField, number | null][]),
  ];
  const seen = new Map<number, MappingField>();
  for (const [field, c] of chosen) {
    if (c === null) continue;
    if (seen.has(c) && !errors[field]) errors[field] = 'This column is chosen for something else already.';
    else seen.set(c, field);
  }
  if (Object.keys(errors).length > 0) return { mapping: null, errors };
  return {
    mapping: {
      hasHeaderRow: d.hasHeaderRow,
      dateColumn: d.dateColumn!,
      descriptionColumn: d.descriptionColumn,
      amount:
        d.amountKind === 'signed'
          ? { kind: 'signed', column: d.amountColumn! }
          : { kind: 'debit_credit', debitColumn: d.debitColumn!, creditColumn: d.creditColumn! },
      dateFormat: d.dateFormat!,
    },
    errors: null,
  };
}

/** A, B, … Z, AA, AB … as a spreadsheet names columns. */
export function columnLetter(index: number): string {
  let n = index + 1;
  let s = '';
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** "B · Description" when the first row names the column, "B · e.g. RENT" from the first value otherwise. */
export function columnLabel(rows: string[][], index: number, hasHeaderRow: boolean): string {
  const first = rows[0]?.[index]?.trim() ?? '';
  const sample = rows[hasHeaderRow ? 1 : 0]?.[index]?.trim() ?? '';
  if (hasHeaderRow && first) return `${columnLetter(index)} · ${first}`;
  return sample ? `${columnLetter(index)} · e.g. ${sample.slice(0, 24)}` : `${columnLetter(index)} (empty)`;
}

/** A server field ("mapping.amount.debitColumn") → the form's field. */
export function mappingFieldOf(serverField: string): MappingField | null {
  const table: Record<string, MappingField> = {
    'mapping.dateColumn': 'dateColumn',
    'mapping.descriptionColumn': 'descriptionColumn',
    'mapping.amount.column': 'amountColumn',
    'mapping.amount': 'amountColumn',
    'mapping.amount.debitColumn': 'debitColumn',
    'mapping.amount.creditColumn': 'creditColumn',
    'mapping.dateFormat': 'dateFormat',
  };
  return table[serverField] ?? null;
}
