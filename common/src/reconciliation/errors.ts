// Errors of the reconciliation rules, with stable codes the server maps to 400 (a malformed input).

export const RECONCILIATION_ERROR_CODES = [
  /** The bank CSV column mapping is malformed (a column index, the date format, …). */
  'RECONCILIATION.INVALID_MAPPING',
  /** The matching window is not a whole number of days from 0 to 366. */
  'RECONCILIATION.INVALID_WINDOW',
  /** A line to match or a payout transaction has a malformed amount or date. */
  'RECONCILIATION.INVALID_LINE',
] as const;
export type ReconciliationErrorCode = (typeof RECONCILIATION_ERROR_CODES)[number];

export class ReconciliationError extends Error {
  constructor(
    readonly code: ReconciliationErrorCode,
    /** The input at fault, e.g. "mapping.dateColumn" or "bankSide[12].amountCents". */
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'ReconciliationError';
  }
}
