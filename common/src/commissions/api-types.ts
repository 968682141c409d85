// What the commission routes answer and accept, over JSON; the backend answers with these and the screens
// read them. Money and percentages are decimal strings ("1234.50", "33.34"), dates 'YYYY-MM-DD', instants
// ISO-8601.
import type { CommissionLineKind } from './earning';
import type { CommissionBreakdown, CommissionMilestone, CommissionPlanBasis, CommissionRate } from './plan';

export interface CommissionPlanView {
  id: string;
  /** null: the company-wide default; else the branch whose contracts it applies to. */
  branchId: string | null;
  branchCode: string | null;
  name: string;
  basis: CommissionPlanBasis;
  rate: CommissionRate;
  firstMilestonePct: string;
  effectiveFrom: string;
  active: boolean;
  /** A split names it: its terms are frozen (name and active may still change). */
  inUse: boolean;
  createdAt: string;
  updatedAt: string;
}

export interface CommissionPlanInput {
  branchId?: string | null;
  name: string;
  basis: CommissionPlanBasis;
  rate: CommissionRate;
  firstMilestonePct: string;
  effectiveFrom: string;
  active?: boolean;
}

export type CommissionPlanPatch = Partial<CommissionPlanInput>;

export interface CommissionSplitView {
  salespersonId: string;
  salespersonName: string;
  sharePct: string;
  monthVolumeBefore: string;
}

export interface ContractCommissionSplitsView {
  contractId: string;
  leadId: string;
  branchId: string;
  /** The plan the split is (or would be) computed under; null when no plan applies yet. */
  plan: { id: string; name: string } | null;
  /** false: nothing stored yet — the default (100% to the contract's salesperson) is shown. */
  stored: boolean;
  /** A commission line exists: the split can no longer change. */
  earned: boolean;
  cancelled: boolean;
  splits: CommissionSplitView[];
  /** What the contract pays under the plan and split (null without a plan or a salesperson). */
  preview: CommissionBreakdown | null;
  /** Who may be named in the split: the branch's active salespeople, managers and owners. */
  eligible: { id: string; name: string }[];
}

export interface SetCommissionSplitsInput {
  splits: { salespersonId: string; sharePct: string }[];
}

export type CommissionStatementStatus = 'draft' | 'approved' | 'paid';

export interface CommissionStatementSummary {
  id: string;
  branchId: string;
  branchCode: string;
  salespersonId: string;
  salespersonName: string;
  periodStart: string;
  periodEnd: string;
  status: CommissionStatementStatus;
  earned: string;
  clawedBack: string;
  carriedIn: string;
  net: string;
  payable: string;
  /** min(0, net): what the next statement starts with. */
  carriedOut: string;
  lineCount: number;
  approvedAt: string | null;
  approvedByName: string | null;
  paidAt: string | null;
  paidOn: string | null;
  paidReference: string | null;
  paidByName: string | null;
  paidJournalEntryId: string | null;
}

export interface CommissionStatementLineView {
  id: string;
  contractId: string;
  leadId: string;
  homeownerName: string;
  milestone: CommissionMilestone;
  kind: CommissionLineKind;
  /** Signed: an earning is positive, a clawback negative. */
  amount: string;
  effectiveOn: string;
  journalEntryId: string;
}

export interface CommissionStatementDetail extends CommissionStatementSummary {
  lines: CommissionStatementLineView[];
}

export interface BuildStatementsResult {
  period: { start: string; end: string };
  /** Lines put on statements by this build. */
  linesPlaced: number;
  /** The draft statements written or recomputed. */
  statements: CommissionStatementSummary[];
}

export interface PayStatementInput {
  paidOn: string;
  reference?: string;
}

export interface EarningRunResult {
  asOf: string;
  contractsChecked: number;
  linesWritten: number;
  earned: string;
  clawedBack: string;
  /** Contracts passed over: no plan applies, or no salesperson. */
  skipped: { contractId: string; reason: 'no_plan' | 'no_salesperson' }[];
  failures: { contractId: string; code: string; message: string }[];
}
