// Errors of the commission rules. Each carries a stable code (mapped by the server to 400/422) and the
// field at fault, so a screen can show the message beside the input.

export const COMMISSION_ERROR_CODES = [
  /** The plan itself is malformed: a rate out of range, tiers out of order, an unknown basis… */
  'COMMISSION.PLAN_INVALID',
  /** No salesperson on the contract. */
  'COMMISSION.SPLIT_EMPTY',
  /** A share is not a decimal string greater than 0 and at most 100. */
  'COMMISSION.SPLIT_SHARE_INVALID',
  /** The same salesperson appears twice in one split. */
  'COMMISSION.SPLIT_DUPLICATE_SALESPERSON',
  /** The shares do not add up to exactly 100. */
  'COMMISSION.SPLIT_SUM_NOT_100',
  /** A monthly-volume plan without the salesperson's volume earlier in the month. */
  'COMMISSION.VOLUME_MISSING',
  /** A contract fact (price, cost, date, instant, time zone) is malformed. */
  'COMMISSION.FACTS_INVALID',
  /** A statement line or a closed period that cannot be placed. */
  'COMMISSION.STATEMENT_INVALID',
] as const;
export type CommissionErrorCode = (typeof COMMISSION_ERROR_CODES)[number];

export interface CommissionIssue {
  code: CommissionErrorCode;
  /** The input at fault, e.g. "rate.tiers[1].from" or "splits[0].sharePct". */
  field: string;
  message: string;
}

export class CommissionError extends Error {
  readonly code: CommissionErrorCode;
  readonly field: string;
  readonly details: CommissionIssue[];

  constructor(details: CommissionIssue[]) {
    const first = details[0];
    super(first ? first.message : 'Invalid commission input.');
    this.name = 'CommissionError';
    this.code = first ? first.code : 'COMMISSION.PLAN_INVALID';
    this.field = first ? first.field : '';
    this.details = details;
  }
}

export function throwIfIssues(issues: CommissionIssue[]): void {
  if (issues.length > 0) throw new CommissionError(issues);
}
