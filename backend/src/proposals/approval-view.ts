import { asSubject, mayApprove, type ApprovalRequestView } from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import type { ApprovalRecord } from './proposals.repository';

/**
 * May this person approve or refuse the request? It must be pending, within their authority (only the
 * owner decides what needs the owner), in their branches, and not their own request.
 */
export function canDecide(user: SessionUser, r: ApprovalRecord): boolean {
  return (
    r.status === 'pending' &&
    mayApprove(user.role, r.approver) &&
    user.ability.can(
      'approve',
      asSubject('Proposal', { branchId: r.branchId, salespersonId: r.salespersonId }),
    ) &&
    (user.role === 'owner' || r.requestedBy.id !== user.id)
  );
}

export function toApprovalView(user: SessionUser, r: ApprovalRecord): ApprovalRequestView {
  return {
    id: r.id,
    proposalId: r.proposalId,
    proposalVersion: r.proposalVersion,
    leadId: r.leadId,
    homeownerName: r.homeownerName,
    branchId: r.branchId,
    branchName: r.branchName,
    status: r.status,
    approver: r.approver,
    reasons: r.reasons,
    figures: r.figures,
    requestedBy: { id: r.requestedBy.id, name: r.requestedBy.name },
    requestedAt: r.requestedAt,
    decidedBy: r.decidedBy,
    decidedAt: r.decidedAt,
    decisionNote: r.decisionNote,
    canDecide: canDecide(user, r),
  };
}
