import type { ApprovalReason, Approver, DiscountAuthority, Role } from '@loambook/common';

/** The limits a reason is measured against, and whose authority it is ("your", "the salesperson’s"). */
export interface ApprovalLimits {
  marginFloorPct: string;
  authorityPct: string;
  whose: string;
}

/** The discount authority that applies to someone in `role` (the narrowest for roles that do not sell). */
export function authorityFor(role: Role, authority: DiscountAuthority): string {
  return role === 'branch_manager' ? authority.branch_manager : authority.salesperson;
}

/** Limits for the person looking at their own proposal: "your authority". */
export function viewerLimits(
  role: Role,
  settings: { marginFloorPct: string; discountAuthority: DiscountAuthority },
): ApprovalLimits {
  return {
    marginFloorPct: settings.marginFloorPct,
    authorityPct: authorityFor(role, settings.discountAuthority),
    whose: 'your',
  };
}

/** Limits for an approver reading someone else's request: "the salesperson’s authority". */
export function submitterLimits(
  role: Role,
  settings: { marginFloorPct: string; discountAuthority: DiscountAuthority },
): ApprovalLimits {
  return {
    marginFloorPct: settings.marginFloorPct,
    authorityPct: authorityFor(role, settings.discountAuthority),
    whose: role === 'branch_manager' ? 'the branch manager’s' : 'the salesperson’s',
  };
}

/** A reason in words, with the figure it is measured against. */
export function reasonText(reason: ApprovalReason, limits: ApprovalLimits): string {
  switch (reason) {
    case 'MARGIN_BELOW_FLOOR':
      return `Margin below the branch floor (${limits.marginFloorPct}%)`;
    case 'DISCOUNT_BEYOND_AUTHORITY':
      return `Discount beyond ${limits.whose} authority (${limits.authorityPct}%)`;
    default:
      return String(reason);
  }
}

export const APPROVER_NEEDS: Record<Approver, string> = {
  none: 'No approval needed',
  branch_manager: 'Needs the branch manager’s approval',
  owner: 'Needs the owner’s approval',
};
