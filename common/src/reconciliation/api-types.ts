// The reconciliation API's request and response shapes. Amounts are strings ("1234.50", signed on bank
// lines: positive = into the account); cents are strings of digits ("-1200"); dates are 'YYYY-MM-DD'.
//
// The backend answers with these and the screens read them.
import type { BankCsvMapping, BankCsvMappingSuggestion, BankCsvRowError } from './bank-csv';
import type { PayoutBreakdown } from './payout-breakdown';

export interface BankAccount {
  id: string;
  /** null: a company-wide account. */
  branchId: string | null;
  branchName: string | null;
  name: string;
  last4: string;
  /** Processor payouts are looked for on this account. */
  receivesPayouts: boolean;
  /** The column choice of the last upload, offered again on the next. */
  csvMapping: BankCsvMapping | null;
  statementCount: number;
  /** The last day of the latest statement, or null. */
  statementsThrough: string | null;
  /** The last day of the latest locked period, or null. */
  lockedThrough: string | null;
  createdAt: string;
}

export interface CreateBankAccountRequest {
  name: string;
  last4: string;
  branchId?: string | null;
  receivesPayouts?: boolean;
}

/** What the first rows of a file look like, and a first mapping to confirm. */
export interface BankStatementPreview {
  fileName: string;
  fileBytes: number;
  sha256: string;
  /** Records in the file, the header and blank rows counted. */
  rowCount: number;
  /** The widest row's cell count. */
  columnCount: number;
  /** The first rows as split (PREVIEW_ROWS at most), row 1 first. */
  rows: string[][];
  suggestion: BankCsvMappingSuggestion;
  savedMapping: BankCsvMapping | null;
  /** The mapping to start from: the one given, else the account's saved one, else a complete guess, else null. */
  mapping: BankCsvMapping | null;
  mappingSource: 'given' | 'saved' | 'suggested' | null;
  /** The file read with `mapping`, when there is one. */
  check: BankStatementCheck | null;
  /** The statement already made from this very file on the account, if any. */
  duplicateOf: { statementId: string; fileName: string; uploadedAt: string } | null;
}

export interface BankStatementCheck {
  lineCount: number;
  errorCount: number;
  /** The first MAX_ROW_ERRORS errors. */
  errors: BankCsvRowError[];
  periodFrom: string | null;
  periodTo: string | null;
  moneyIn: string;
  moneyOut: string;
}

export interface BankStatement {
  id: string;
  bankAccountId: string;
  bankAccountName: string;
  fileName: string;
  sha256: string;
  periodFrom: string;
  periodTo: string;
  rowCount: number;
  lineCount: number;
  skippedRows: BankCsvRowError[];
  mapping: BankCsvMapping;
  moneyIn: string;
  moneyOut: string;
  matchedCount: number;
  uploadedBy: { id: string; name: string };
  uploadedAt: string;
}

/** 422 BANK_STATEMENT.ROWS_INVALID carries this as details. */
export interface BankStatementRowErrors {
  errorCount: number;
  invalidRowCount: number;
  lineCount: number;
  errors: BankCsvRowError[];
}

export type MatchTargetKind = 'payout' | 'commission_payment' | 'other';
export type MatchStatus = 'suggested' | 'confirmed';

export interface BankLineView {
  id: string;
  statementId: string;
  rowNumber: number;
  postedOn: string;
  description: string;
  amount: string;
  amountCents: string;
  locked: boolean;
}

/** A statement's line with its match, if any (GET /api/bank-statements/:id/lines). */
export interface BankStatementLine extends BankLineView {
  match: { id: string; status: MatchStatus; targetKind: MatchTargetKind; targetId: string | null } | null;
}

export interface PayoutTarget {
  id: string;
  processorPayoutId: string;
  arrivalDate: string;
  amount: string;
  amountCents: string;
  currency: string;
  status: string;
}

export interface CommissionPaymentTarget {
  /** The commission statement's id. */
  id: string;
  salespersonId: string;
  salespersonName: string;
  branchId: string;
  branchName: string;
  periodStart: string;
  periodEnd: string;
  paidOn: string;
  /** What was paid, positive. */
  payable: string;
  /** The bank line expected: the negative of payable, in cents. */
  bankAmountCents: string;
}

export interface MatchView {
  id: string;
  status: MatchStatus;
  targetKind: MatchTargetKind;
  targetId: string | null;
  bankLine: BankLineView;
  payout: PayoutTarget | null;
  commissionPayment: CommissionPaymentTarget | null;
  note: string | null;
  /** Bank date − target date, in days (positive: the bank line is later); null for 'other'. */
  daysApart: number | null;
  createdBy: { id: string; name: string };
  createdAt: string;
  matchedBy: { id: string; name: string } | null;
  matchedAt: string | null;
  locked: boolean;
}

export interface ReconciledPeriod {
  id: string;
  bankAccountId: string;
  periodStart: string;
  periodEnd: string;
  lockedBy: { id: string; name: string };
  lockedAt: string;
}

export interface LockBlockers {
  unmatchedBankLines: number;
  unconfirmedMatches: number;
  unmatchedPayouts: number;
  unmatchedCommissionPayments: number;
  /** Days of the range no uploaded statement covers. */
  uncoveredDays: number;
}

export interface ReconciliationView {
  bankAccount: BankAccount;
  from: string;
  to: string;
  lockedPeriods: ReconciledPeriod[];
  matched: MatchView[];
  unmatchedBankLines: BankLineView[];
  unmatchedPayouts: PayoutTarget[];
  unmatchedCommissionPayments: CommissionPaymentTarget[];
  summary: {
    bankLines: number;
    moneyIn: string;
    moneyOut: string;
    suggested: number;
    confirmed: number;
  };
  /** What stands in the way of locking the range (all zero: it may be locked). */
  lockBlockers: LockBlockers;
  /** The whole range is already inside locked periods. */
  locked: boolean;
}

export interface SuggestResult {
  windowDays: number;
  suggested: number;
  /** Lines that took part, on each side. */
  bankLinesConsidered: number;
  targetsConsidered: number;
}

export interface CreateMatchRequest {
  bankLineId: string;
  targetKind: MatchTargetKind;
  /** The payout's or commission statement's id; absent for 'other'. */
  targetId?: string;
  note?: string;
}

export interface LockPeriodRequest {
  bankAccountId: string;
  from: string;
  to: string;
}

export interface PayoutItemView {
  balanceTransactionId: string;
  type: string;
  amount: string;
  fee: string;
  net: string;
  branchId: string;
  branchName: string;
  paymentId: string | null;
  refundId: string | null;
  contractId: string | null;
  leadId: string | null;
  homeownerName: string | null;
  address: string | null;
  paymentKind: 'deposit' | 'balance' | null;
  receivedOn: string | null;
}

export interface PayoutBreakdownView {
  payout: PayoutTarget;
  breakdown: PayoutBreakdown;
  branches: {
    branchId: string;
    branchName: string;
    gross: string;
    fee: string;
    net: string;
    itemCount: number;
  }[];
  charges: PayoutItemView[];
  refunds: PayoutItemView[];
  others: PayoutItemView[];
  /** The bank line it is matched to, if any. */
  match: { id: string; status: MatchStatus; bankLine: BankLineView; bankAccountId: string } | null;
}
