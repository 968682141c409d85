/**
 * CSV as RFC 4180 writes it: fields separated by commas, records by CRLF, a field quoted when it holds a
 * comma, a quote or a line break, with quotes doubled. A header record comes first.
 *
 * A text field that a spreadsheet would read as a formula (it starts with =, +, -, @, a tab or a carriage
 * return) is prefixed with an apostrophe (OWASP "CSV Injection", secondary). Amounts are written as they
 * are, so that "-29.30" stays a number.
 */
export type CsvCell = string | null | undefined;

const AMOUNT = /^-?\d+(\.\d+)?$/;
const FORMULA_START = /^[=+\-@\t\r]/;

function field(value: CsvCell): string {
  if (value === null || value === undefined) return '';
  const safe = FORMULA_START.test(value) && !AMOUNT.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

export function toCsv(header: readonly string[], rows: readonly (readonly CsvCell[])[]): string {
  return [header, ...rows].map((r) => r.map(field).join(',')).join('\r\n') + '\r\n';
}
