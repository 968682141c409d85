// Who must agree before a proposal option may go to the homeowner.
//
// The rule, per option (the proposal needs the highest approver any of its options needs):
// - within the branch's margin floor AND within the submitter's own discount authority → no approval;
// - a salesperson beyond their discount authority, or below the floor → the branch manager approves;
//   a discount beyond the branch manager's authority → only the owner may approve;
// - a branch manager's own proposal: a discount up to the manager's authority is theirs to give; beyond it,
//   or below the margin floor, the owner approves. A manager never approves an exception on their own
//   proposal (nobody signs off their own exception), so a manager below the floor needs the owner;
// - the owner never needs approval;
// - bookkeepers and crew leads do not make proposals; if one ever submits, they are held to the
//   salesperson's authority (the narrowest).
// "Equal to the limit counts as within": a 10% discount with 10% authority, a 38.00% margin at a 38%
// floor. The figures are judged as shown (two decimals, as priceOption rounds them). No margin (a net
// total of zero) counts as below any floor.
import type { DiscountAuthority } from '../branches/branch-rules';
import { money } from '../money';
import type { Role } from '../roles';

export const APPROVAL_REASONS = ['MARGIN_BELOW_FLOOR', 'DISCOUNT_BEYOND_AUTHORITY'] as const;
export type ApprovalReason = (typeof APPROVAL_REASONS)[number];

export const APPROVAL_REASON_LABELS: Record<ApprovalReason, string> = {
  MARGIN_BELOW_FLOOR: "Gross margin below the branch's floor",
  DISCOUNT_BEYOND_AUTHORITY: "Discount beyond the submitter's authority",
};

export type Approver = 'none' | 'branch_manager' | 'owner';

export const APPROVER_LABELS: Record<Approver, string> = {
  none: 'No approval needed',
  branch_manager: 'Branch manager',
  owner: 'Owner',
};

export interface ApprovalInput {
  role: Role;
  marginFloorPct: string;
  discountAuthority: DiscountAuthority;
  /** The discount as a percentage of the list total. */
  discountPct: string;
  /** null when the option has no net total to take a margin of. */
  grossMarginPct: string | null;
}

export interface ApprovalDecision {
  needsApproval: boolean;
  approver: Approver;
  reasons: ApprovalReason[];
}

const RANK: Record<Approver, number> = { none: 0, branch_manager: 1, owner: 2 };

export function approvalDecision(input: ApprovalInput): ApprovalDecision {
  if (input.role === 'owner') return { needsApproval: false, approver: 'none', reasons: [] };

  const discount = money(input.discountPct);
  const ownAuthority =
    input.role === 'branch_manager'
      ? input.discountAuthority.branch_manager
      : input.discountAuthority.salesperson;
  const belowFloor =
    input.grossMarginPct === null || money(input.grossMarginPct).lessThan(input.marginFloorPct);
  const beyondOwn = discount.greaterThan(ownAuthority);
  const beyondManager = discount.greaterThan(input.discountAuthority.branch_manager);

  const reasons: ApprovalReason[] = [];
  if (belowFloor) reasons.push('MARGIN_BELOW_FLOOR');
  if (beyondOwn) reasons.push('DISCOUNT_BEYOND_AUTHORITY');
  if (reasons.length === 0) return { needsApproval: false, approver: 'none', reasons };

  const approver: Approver = input.role === 'branch_manager' || beyondManager ? 'owner' : 'branch_manager';
  return { needsApproval: true, approver, reasons };
}

/** The decision for a whole proposal: the highest approver any option needs, and every reason given. */
export function combineDecisions(decisions: readonly ApprovalDecision[]): ApprovalDecision {
  let approver: Approver = 'none';
  const reasons = new Set<ApprovalReason>();
  for (const d of decisions) {
    if (RANK[d.approver] > RANK[approver]) approver = d.approver;
    d.reasons.forEach((r) => reasons.add(r));
  }
  return {
    needsApproval: approver !== 'none',
    approver,
    reasons: APPROVAL_REASONS.filter((r) => reasons.has(r)),
  };
}

/** May this person decide a request that needs `approver`? (Branch membership is checked separately.) */
export function mayApprove(role: Role, approver: Approver): boolean {
  if (role === 'owner') return true;
  return role === 'branch_manager' && approver === 'branch_manager';
}
