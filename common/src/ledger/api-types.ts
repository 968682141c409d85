// Wire shapes of the ledger API. Money is a string with two decimals ("1234.50"); dates are "YYYY-MM-DD".
import type { Page } from '../api/types';
import type { AccountType, Side } from './accounts';
import type { TrialBalanceRow, TrialBalanceTotals } from './trial-balance';

export const SOURCE_KINDS = ['event', 'user', 'system'] as const;
/** What posted an entry: a processor event (webhook), a person, or the system (a scheduled job). */
export type SourceKind = (typeof SOURCE_KINDS)[number];

export interface LedgerAccount {
  id: string;
  branchId: string;
  code: string;
  name: string;
  type: AccountType;
  normalSide: Side;
  salespersonSubledger: boolean;
}

export interface JournalLine {
  id: string;
  accountId: string;
  accountCode: string;
  accountName: string;
  side: Side;
  amount: string;
  salespersonId: string | null;
  salespersonName: string | null;
}

export interface JournalEntry {
  id: string;
  branchId: string;
  branchCode: string;
  reasonCode: string;
  reasonLabel: string;
  sourceKind: SourceKind;
  /** The processor event id, the user id or the job name. */
  sourceRef: string;
  memo: string | null;
  effectiveOn: string;
  postedAt: string;
  postedBy: string | null;
  postedByName: string | null;
  leadId: string | null;
  contractId: string | null;
  jobId: string | null;
  /** The entry this one reverses. */
  reversesEntryId: string | null;
  /** The entry that reverses this one, once there is one. */
  reversedByEntryId: string | null;
  /** The sum of the debits (equal to the credits). */
  total: string;
  lines: JournalLine[];
}

export type JournalPage = Page<JournalEntry> & { page: number; pageSize: number };

export interface JournalQuery {
  branchId?: string;
  from?: string;
  to?: string;
  reasonCode?: string;
  page?: string;
  pageSize?: string;
}

export interface AccountLedgerLine {
  entryId: string;
  lineId: string;
  effectiveOn: string;
  postedAt: string;
  reasonCode: string;
  reasonLabel: string;
  memo: string | null;
  side: Side;
  amount: string;
  salespersonId: string | null;
  salespersonName: string | null;
  /** The account's balance after this line, on its normal side (negative: the other side). */
  balance: string;
}

export interface AccountLedger {
  account: LedgerAccount & { branchCode: string };
  from: string | null;
  to: string | null;
  /** The balance before `from` (on the normal side). */
  openingBalance: string;
  closingBalance: string;
  debitTotal: string;
  creditTotal: string;
  lines: AccountLedgerLine[];
}

export interface TrialBalance {
  /** null: every branch the person may see, like accounts added together. */
  branchId: string | null;
  asOf: string;
  /** accountId: the branch's account when one branch is shown; null when branches are added together. */
  rows: (TrialBalanceRow & { accountId: string | null })[];
  totals: TrialBalanceTotals;
}

export interface ReverseEntryRequest {
  reason: string;
}
