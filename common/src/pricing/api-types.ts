// Wire shapes of the price book, proposals and the approval queue. Decimal values travel as strings:
// money always with two decimals ("1234.50"), quantities and percentages as short as they go ("12.5").
import type { DiscountAuthority } from '../branches/branch-rules';
import type { Role } from '../roles';
import type { ApprovalDecision, ApprovalReason } from './approval';
import type { CommissionBasis } from './commission';
import type { PriceBookCategory, PriceBookUnit, QuantitySource } from './price-book';
import type { OptionDiscount, OptionTax, OptionTotals } from './price-option';

export interface PriceBookItem {
  id: string;
  branchId: string;
  code: string;
  description: string;
  category: PriceBookCategory;
  unit: PriceBookUnit;
  unitCost: string;
  unitPrice: string;
  active: boolean;
  /** Named by a proposal line: it can be deactivated but never deleted. */
  inUse: boolean;
  createdAt: string;
  updatedAt: string;
}

export interface CreatePriceBookItemRequest {
  code: string;
  description: string;
  category: PriceBookCategory;
  unit: PriceBookUnit;
  unitCost: string;
  unitPrice: string;
  active?: boolean;
}

export type UpdatePriceBookItemRequest = Partial<CreatePriceBookItemRequest>;

export const PROPOSAL_STATUSES = [
  'draft',
  'pending_approval',
  'approved',
  'refused',
  'sent',
  'signed',
  'superseded',
  'declined',
] as const;
export type ProposalStatus = (typeof PROPOSAL_STATUSES)[number];

export const PROPOSAL_STATUS_LABELS: Record<ProposalStatus, string> = {
  draft: 'Draft',
  pending_approval: 'Waiting for approval',
  approved: 'Approved, ready to send',
  refused: 'Approval refused',
  sent: 'Sent to the homeowner',
  signed: 'Signed',
  superseded: 'Replaced by a later version',
  declined: 'Declined by the homeowner',
};

/** Statuses in which PUT edits the version in place (it returns to draft). */
export const PROPOSAL_EDITABLE_IN_PLACE: readonly ProposalStatus[] = ['draft', 'refused', 'approved'];
/** Statuses in which PUT makes a new version and supersedes this one. */
export const PROPOSAL_EDIT_MAKES_VERSION: readonly ProposalStatus[] = ['sent'];
/** Statuses that never change again through an edit. */
export const PROPOSAL_READ_ONLY: readonly ProposalStatus[] = ['superseded', 'signed', 'declined'];

export interface ProposalLineRequest {
  priceBookItemId: string;
  /** Up to 7 digits and 3 decimals, more than 0. */
  quantity: string;
  quantitySource?: QuantitySource;
}

export interface ProposalOptionRequest {
  title: string;
  description?: string | null;
  discount: OptionDiscount;
  lines: ProposalLineRequest[];
}

export interface CreateProposalRequest {
  inspectionId?: string | null;
  notes?: string | null;
  options: ProposalOptionRequest[];
}

export interface UpdateProposalRequest extends CreateProposalRequest {
  /**
   * false (default): lines whose item was already on the version being edited keep the prices quoted
   * then; only newly added items take today's price book. true: every line takes today's price book.
   */
  refreshPrices?: boolean;
}

export interface ProposalLine {
  id: string;
  position: number;
  priceBookItemId: string | null;
  code: string;
  description: string;
  category: PriceBookCategory;
  unit: PriceBookUnit;
  quantity: string;
  unitCost: string;
  unitPrice: string;
  quantitySource: QuantitySource;
  /** quantity × unitCost and × unitPrice, rounded to cents for display only: the option's totals are
   * rounded once from the exact sums, so these may differ from them by a cent. */
  lineCost: string;
  lineList: string;
}

export interface CommissionPreview {
  ratePct: string;
  basis: CommissionBasis;
  amount: string;
}

export interface ProposalOption {
  id: string;
  position: number;
  title: string;
  description: string | null;
  discount: OptionDiscount;
  lines: ProposalLine[];
  totals: OptionTotals;
  /** What submitting this option now would need, for the signed-in person's role and the branch's settings. */
  approval: ApprovalDecision;
  commission: CommissionPreview;
}

export interface ProposalVersionRef {
  id: string;
  version: number;
  status: ProposalStatus;
  createdAt: string;
  sentAt: string | null;
}

export const APPROVAL_REQUEST_STATUSES = ['pending', 'approved', 'refused', 'withdrawn'] as const;
export type ApprovalRequestStatus = (typeof APPROVAL_REQUEST_STATUSES)[number];

/** What the approver saw: the figures at the moment of submission (a copy, kept with the request). */
export interface ApprovalFigures {
  submitterRole: Role;
  marginFloorPct: string;
  discountAuthority: DiscountAuthority;
  tax: OptionTax;
  options: {
    optionId: string;
    position: number;
    title: string;
    costTotal: string;
    listTotal: string;
    discountTotal: string;
    discountPct: string;
    netTotal: string;
    taxTotal: string;
    customerTotal: string;
    grossProfit: string;
    grossMarginPct: string | null;
    approver: ApprovalDecision['approver'];
    reasons: ApprovalReason[];
  }[];
}

export interface PersonRef {
  id: string;
  name: string;
}

export interface ApprovalRequestView {
  id: string;
  proposalId: string;
  proposalVersion: number;
  leadId: string;
  homeownerName: string;
  branchId: string;
  branchName: string;
  status: ApprovalRequestStatus;
  approver: 'branch_manager' | 'owner';
  reasons: ApprovalReason[];
  figures: ApprovalFigures;
  requestedBy: PersonRef;
  requestedAt: string;
  decidedBy: PersonRef | null;
  decidedAt: string | null;
  decisionNote: string | null;
  /** May the signed-in person approve or refuse it (pending, and within their authority)? */
  canDecide: boolean;
}

export interface ProposalDetail {
  id: string;
  leadId: string;
  branchId: string;
  inspectionId: string | null;
  version: number;
  previousId: string | null;
  status: ProposalStatus;
  salespersonId: string | null;
  notes: string | null;
  sentAt: string | null;
  createdBy: string;
  createdAt: string;
  updatedAt: string;
  /** The sales-tax treatment and rate the totals were computed with (the branch's, when last saved). */
  tax: OptionTax;
  options: ProposalOption[];
  /** The options' decisions combined: what submitting now would need. */
  approval: ApprovalDecision;
  /** The latest approval request of this version, if any. */
  approvalRequest: ApprovalRequestView | null;
  /** Every version of the lead's proposal, newest first. */
  versions: ProposalVersionRef[];
  /** PUT is accepted now (by this person). When status is 'sent' it makes a new version. */
  editable: boolean;
  /** Never editable again (superseded, signed, declined). */
  readOnly: boolean;
  /** POST …/submit is accepted now (by this person). */
  canSubmit: boolean;
}

export interface ProposalSummary {
  id: string;
  leadId: string;
  branchId: string;
  version: number;
  previousId: string | null;
  status: ProposalStatus;
  salespersonId: string | null;
  createdAt: string;
  updatedAt: string;
  sentAt: string | null;
  options: {
    id: string;
    position: number;
    title: string;
    netTotal: string;
    customerTotal: string;
    grossMarginPct: string | null;
  }[];
}

export interface DecideApprovalRequest {
  /** Required to refuse; optional to approve. Up to 2000 characters. */
  note?: string;
}
