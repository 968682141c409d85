// Reading a bank statement CSV into bank lines, with the columns the bookkeeper chose.
//
// common/ stays free of I/O and of packages it does not declare, so it does not split the text itself:
// the backend parses the file with csv-parse (a well-known CSV parser, RFC 4180 quoting) using
// BANK_CSV_PARSE_OPTIONS and passes the rows here. parseBankCsv then reads each row by the mapping:
//   - row numbers count every record from 1, the header included (what a spreadsheet shows when no cell
//     holds a line break); rows whose cells are all blank are skipped without an error;
//   - amounts: "1,234.56", "$1,234.56", "-$12.00", "$-12.00", "(12.00)" (negative), "12.00-" (negative),
//     ".50"; at most two decimals (a bank line is whole cents); thousands separators must group by three;
//   - 'signed': one column, positive = money into the account, negative = money out;
//     'debit_credit': a debit is money out and a credit money in, whatever sign the bank printed; a blank
//     or 0.00 cell on one side takes the other; both non-zero is an error;
//   - dates: 'YYYY-MM-DD', 'MM/DD/YYYY' or 'DD/MM/YYYY' (day and month may have one digit; '/', '-' or '.'
//     between them in the last two); the date must exist on the calendar; a four-digit year is required.
// Each row gives a line or one error per bad cell (never both), so the bookkeeper can fix the file.
import { calendarDayNumber, type IsoDate } from '../deadlines/calendar-date';
import { isDecimalString, money, toMinorUnits, toMoneyString } from '../money';
import { centsToMoneyString } from './cents';
import { ReconciliationError } from './errors';

export const BANK_DATE_FORMATS = ['YYYY-MM-DD', 'MM/DD/YYYY', 'DD/MM/YYYY'] as const;
export type BankDateFormat = (typeof BANK_DATE_FORMATS)[number];

/**
 * csv-parse options for a bank statement (the backend passes them to `parse` from 'csv-parse/sync'):
 * strip a UTF-8 byte-order mark, keep short or long rows (the mapping decides), keep blank lines so that
 * row numbers stay those of the file, trim spaces around unquoted cells.
 */
export const BANK_CSV_PARSE_OPTIONS = {
  bom: true,
  relax_column_count: true,
  skip_empty_lines: false,
  trim: true,
} as const;

export type BankCsvAmountColumns =
  { kind: 'signed'; column: number } | { kind: 'debit_credit'; debitColumn: number; creditColumn: number };

export interface BankCsvMapping {
  hasHeaderRow: boolean;
  /** 0-based column indexes. */
  dateColumn: number;
  descriptionColumn: number | null;
  amount: BankCsvAmountColumns;
  dateFormat: BankDateFormat;
}

export interface BankLine {
  /** 1-based record number in the file, the header counted. */
  rowNumber: number;
  date: IsoDate;
  description: string;
  /** Dollars, two decimals, signed: positive = into the account. */
  amount: string;
  /** The same in integer cents, for matching: "-1200". */
  amountCents: string;
}

export const BANK_CSV_ROW_ERROR_CODES = [
  'BANK_CSV.DATE_MISSING',
  'BANK_CSV.DATE_INVALID',
  'BANK_CSV.AMOUNT_MISSING',
  'BANK_CSV.AMOUNT_INVALID',
  'BANK_CSV.DEBIT_AND_CREDIT',
] as const;
export type BankCsvRowErrorCode = (typeof BANK_CSV_ROW_ERROR_CODES)[number];

export interface BankCsvRowError {
  rowNumber: number;
  /** The mapped column at fault. */
  field: 'date' | 'amount' | 'debit' | 'credit';
  code: BankCsvRowErrorCode;
  message: string;
}

export interface ParsedBankCsv {
  lines: BankLine[];
  errors: BankCsvRowError[];
}

export type BankAmountParse =
  { kind: 'blank' } | { kind: 'ok'; amount: string; cents: bigint } | { kind: 'invalid'; message: string };

const AMOUNT = /^([+\-\u2212]?)\s*(?:US\$|\$)?\s*([+\-\u2212]?)\s*(\d[\d,]*(?:\.\d*)?|\.\d+)\s*(-?)$/;
const GROUPED = /^\d{1,3}(?:,\d{3})+(?:\.\d*)?$/;

/** One amount cell as a bank prints it → dollars and integer cents (see the rules at the top). */
export function parseBankAmount(cell: string | undefined): BankAmountParse {
  let s = (cell ?? '').trim();
  if (s === '') return { kind: 'blank' };
  let parens = false;
  if (s.startsWith('(') && s.endsWith(')')) {
    parens = true;
    s = s.slice(1, -1).trim();
  }
  const m = AMOUNT.exec(s);
  if (!m) return { kind: 'invalid', message: `"${cell}" is not an amount.` };
  const signs = [m[1], m[2], m[4]].filter((x) => x);
  const number = m[3] as string;
  if (signs.length + (parens ? 1 : 0) > 1) {
    return { kind: 'invalid', message: `"${cell}" has more than one sign.` };
  }
  if (number.includes(',') && !GROUPED.test(number)) {
    return { kind: 'invalid', message: `"${cell}": thousands separators must group digits by three.` };
  }
  let plain = number.replace(/,/g, '');
  if (plain.startsWith('.')) plain = `0${plain}`;
  if (plain.endsWith('.')) plain = plain.slice(0, -1);
  const decimals = plain.includes('.') ? (plain.split('.')[1] as string).length : 0;
  if (decimals > 2) return { kind: 'invalid', message: `"${cell}" has more than two decimals.` };
  const negative = parens || signs[0] === '-' || signs[0] === '\u2212';
  const text = `${negative ? '-' : ''}${plain}`;
  if (!isDecimalString(text)) return { kind: 'invalid', message: `"${cell}" is too large.` };
  const value = money(text);
  return { kind: 'ok', amount: toMoneyString(value), cents: BigInt(toMinorUnits(value)) };
}

const DATE_PATTERNS: Record<BankDateFormat, { re: RegExp; y: number; m: number; d: number }> = {
  'YYYY-MM-DD': { re: /^(\d{4})-(\d{1,2})-(\d{1,2})$/, y: 1, m: 2, d: 3 },
  'MM/DD/YYYY': { re: /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})$/, y: 3, m: 1, d: 2 },
  'DD/MM/YYYY': { re: /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})$/, y: 3, m: 2, d: 1 },
};

/** One date cell in the given format → 'YYYY-MM-DD', or null when it is not a real date in that format. */
export function parseBankDate(cell: string | undefined, format: BankDateFormat): IsoDate | null {
  const p = DATE_PATTERNS[format];
  const m = p.re.exec((cell ?? '').trim());
  if (!m) return null;
  const iso = `${m[p.y]}-${(m[p.m] as string).padStart(2, '0')}-${(m[p.d] as string).padStart(2, '0')}`;
  return calendarDayNumber(iso) === null ? null : iso;
}

function checkMapping(mapping: BankCsvMapping): void {
  const bad = (field: string, message: string) =>
    new ReconciliationError('RECONCILIATION.INVALID_MAPPING', field, message);
  if (typeof mapping.hasHeaderRow !== 'boolean')
    throw bad('mapping.hasHeaderRow', 'Say whether the first row is a header.');
  if (!BANK_DATE_FORMATS.includes(mapping.dateFormat)) {
    throw bad('mapping.dateFormat', `The date format is one of ${BANK_DATE_FORMATS.join(', ')}.`);
  }
  const columns: [string, number | null][] = [
    ['mapping.dateColumn', mapping.dateColumn],
    ['mapping.descriptionColumn', mapping.descriptionColumn],
  ];
  if (mapping.amount?.kind === 'signed') columns.push(['mapping.amount.column', mapping.amount.column]);
  else if (mapping.amount?.kind === 'debit_credit') {
    columns.push(['mapping.amount.debitColumn', mapping.amount.debitColumn]);
    columns.push(['mapping.amount.creditColumn', mapping.amount.creditColumn]);
  } else throw bad('mapping.amount', 'Choose one amount column, or a debit and a credit column.');
  const used = new Set<number>();
  for (const [field, c] of columns) {
    if (c === null && field === 'mapping.descriptionColumn') continue;
    if (typeof c !== 'number' || !Number.isInteger(c) || c < 0 || c > 999) {
      throw bad(field, 'A column is chosen by its position: 0 for the first.');
    }
    if (used.has(c)) throw bad(field, 'The same column is chosen twice.');
    used.add(c);
  }
}

const cellAt = (row: readonly string[], c: number): string => (row[c] ?? '').trim();

/**
 * The date formats every non-empty cell of `column` in `rows` fits, in BANK_DATE_FORMATS order: all three
 * when the column holds nothing to read, none when some cell is not a date in any of them. `rows` are
 * transactions only (no header row).
 */
export function dateFormatsFitting(rows: readonly (readonly string[])[], column: number): BankDateFormat[] {
  const cells = rows.map((r) => cellAt(r, column)).filter((c) => c !== '');
  return BANK_DATE_FORMATS.filter((f) => cells.every((cell) => parseBankDate(cell, f) !== null));
}

/**
 * Bank lines from the rows of a bank statement CSV (already split by csv-parse) and the column mapping;
 * a bad cell gives an error with the row number instead of a line. Throws ReconciliationError on a
 * malformed mapping.
 */
export function parseBankCsv(rows: readonly (readonly string[])[], mapping: BankCsvMapping): ParsedBankCsv {
  checkMapping(mapping);
  const lines: BankLine[] = [];
  const errors: BankCsvRowError[] = [];
  rows.forEach((row, i) => {
    if (i === 0 && mapping.hasHeaderRow) return;
    if (row.every((cell) => (cell ?? '').trim() === '')) return;
    const rowNumber = i + 1;
    const rowErrors: BankCsvRowError[] = [];

    const dateCell = cellAt(row, mapping.dateColumn);
    const date = dateCell === '' ? null : parseBankDate(dateCell, mapping.dateFormat);
    if (dateCell === '') {
      rowErrors.push({
        rowNumber,
        field: 'date',
        code: 'BANK_CSV.DATE_MISSING',
        message: 'The date is blank.',
      });
    } else if (date === null) {
      rowErrors.push({
        rowNumber,
        field: 'date',
        code: 'BANK_CSV.DATE_INVALID',
        message: `"${dateCell}" is not a date written ${mapping.dateFormat}.`,
      });
    }

    let amount: { amount: string; cents: bigint } | null = null;
    const a = mapping.amount;
    if (a.kind === 'signed') {
      const r = parseBankAmount(cellAt(row, a.column));
      if (r.kind === 'ok') amount = r;
      else
        rowErrors.push(
          r.kind === 'blank'
            ? { rowNumber, field: 'amount', code: 'BANK_CSV.AMOUNT_MISSING', message: 'The amount is blank.' }
            : { rowNumber, field: 'amount', code: 'BANK_CSV.AMOUNT_INVALID', message: r.message },
        );
    } else {
      const debit = parseBankAmount(cellAt(row, a.debitColumn));
      const credit = parseBankAmount(cellAt(row, a.creditColumn));
      for (const [field, r] of [
        ['debit', debit],
        ['credit', credit],
      ] as const) {
        if (r.kind === 'invalid') {
          rowErrors.push({ rowNumber, field, code: 'BANK_CSV.AMOUNT_INVALID', message: r.message });
        }
      }
      if (debit.kind !== 'invalid' && credit.kind !== 'invalid') {
        const abs = (c: bigint) => (c < 0n ? -c : c);
        const d = debit.kind === 'ok' ? abs(debit.cents) : null;
        const c = credit.kind === 'ok' ? abs(credit.cents) : null;
        if (d === null && c === null) {
          rowErrors.push({
            rowNumber,
            field: 'amount',
            code: 'BANK_CSV.AMOUNT_MISSING',
            message: 'Both the debit and the credit are blank.',
          });
        } else if (d !== null && c !== null && d !== 0n && c !== 0n) {
          rowErrors.push({
            rowNumber,
            field: 'amount',
            code: 'BANK_CSV.DEBIT_AND_CREDIT',
            message: 'The row has both a debit and a credit.',
          });
        } else {
          const cents = d !== null && d !== 0n ? -d : (c ?? 0n);
          amount = { amount: centsToMoneyString(cents), cents };
        }
      }
    }

    if (rowErrors.length > 0 || date === null || amount === null) {
      errors.push(...rowErrors);
      return;
    }
    lines.push({
      rowNumber,
      date,
      description: mapping.descriptionColumn === null ? '' : cellAt(row, mapping.descriptionColumn),
      amount: amount.amount,
      amountCents: amount.cents.toString(),
    });
  });
  return { lines, errors };
}

// ---- guessing the mapping from the header --------------------------------------------------------

export interface BankCsvMappingSuggestion {
  /** True when at least one header cell was recognised. */
  hasHeaderRow: boolean;
  dateColumn: number | null;
  descriptionColumn: number | null;
  amount: BankCsvAmountColumns | null;
  /** The one format every sample date fits, or null (no samples, or ambiguous: ask the bookkeeper). */
  dateFormat: BankDateFormat | null;
  /** The formats every sample date fits (all three when there are no samples). */
  dateFormatCandidates: BankDateFormat[];
}

type Role = 'date' | 'description' | 'amount' | 'debit' | 'credit';

// Header names, best first. Posting date before transaction date: the day the money moved on the account.
const NAMES: Record<Role, { exact: string[]; contains: string[] }> = {
  date: {
    exact: [
      'posting date',
      'posted date',
      'post date',
      'date posted',
      'date',
      'transaction date',
      'trans date',
      'txn date',
      'value date',
      'booking date',
      'effective date',
    ],
    contains: ['date'],
  },
  description: {
    exact: [
      'description',
      'transaction description',
      'memo',
      'details',
      'transaction details',
      'narrative',
      'payee',
      'name',
      'particulars',
      'reference',
    ],
    contains: ['description', 'memo', 'detail'],
  },
  amount: {
    exact: ['amount', 'transaction amount', 'amount usd', 'amount $', 'net amount', 'value'],
    contains: ['amount'],
  },
  debit: {
    exact: [
      'debit',
      'debits',
      'debit amount',
      'withdrawal',
      'withdrawals',
      'withdrawal amount',
      'money out',
      'paid out',
      'outflow',
    ],
    contains: ['debit', 'withdraw'],
  },
  credit: {
    exact: [
      'credit',
      'credits',
      'credit amount',
      'deposit',
      'deposits',
      'deposit amount',
      'money in',
      'paid in',
      'inflow',
    ],
    contains: ['credit', 'deposit'],
  },
};

const normalise = (h: string) =>
  h
    .toLowerCase()
    .replace(/[^a-z0-9$]+/g, ' ')
    .trim();

function score(role: Role, header: string): number | null {
  if (header === '') return null;
  const money = role === 'amount' || role === 'debit' || role === 'credit';
  if (money && header.includes('balance')) return null;
  if (role === 'amount' && /debit|credit|withdraw|deposit/.test(header)) return null;
  const exact = NAMES[role].exact.indexOf(header);
  if (exact >= 0) return exact;
  return NAMES[role].contains.some((c) => header.includes(c)) ? 100 : null;
}

/**
 * A first guess at the mapping from the header row (names such as "Posting Date", "Description",
 * "Amount", or "Debit"/"Credit"), and at the date format from sample rows. The bookkeeper confirms it.
 */
export function suggestColumnMapping(
  headerRow: readonly string[],
  sampleRows: readonly (readonly string[])[] = [],
): BankCsvMappingSuggestion {
  const headers = headerRow.map((h) => normalise(h ?? ''));
  const taken = new Set<number>();
  const best = (role: Role): number | null => {
    let found: number | null = null;
    let foundScore = Infinity;
    headers.forEach((h, i) => {
      if (taken.has(i)) return;
      const s = score(role, h);
      if (s !== null && s < foundScore) {
        found = i;
        foundScore = s;
      }
    });
    if (found !== null) taken.add(found);
    return found;
  };
  const dateColumn = best('date');
  const signed = best('amount');
  let amount: BankCsvAmountColumns | null = null;
  if (signed !== null) amount = { kind: 'signed', column: signed };
  else {
    const debitColumn = best('debit');
    const creditColumn = best('credit');
    if (debitColumn !== null && creditColumn !== null)
      amount = { kind: 'debit_credit', debitColumn, creditColumn };
  }
  const descriptionColumn = best('description');

  const samples =
    dateColumn === null ? [] : sampleRows.map((r) => cellAt(r, dateColumn)).filter((c) => c !== '');
  const dateFormatCandidates =
    dateColumn === null ? [...BANK_DATE_FORMATS] : dateFormatsFitting(sampleRows, dateColumn);
  return {
    hasHeaderRow: dateColumn !== null || amount !== null || descriptionColumn !== null,
    dateColumn,
    descriptionColumn,
    amount,
    dateFormat:
      samples.length > 0 && dateFormatCandidates.length === 1 ? (dateFormatCandidates[0] ?? null) : null,
    dateFormatCandidates: [...dateFormatCandidates],
  };
}
