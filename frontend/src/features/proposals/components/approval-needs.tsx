import type { ApprovalDecision } from '@loambook/common';
import { APPROVER_NEEDS, reasonText, type ApprovalLimits } from '../approval-wording';

/** What an option (or a proposal) needs before it may go to the homeowner, in words. */
export function ApprovalNeeds({
  decision,
  limits,
  className,
}: {
  decision: ApprovalDecision;
  limits: ApprovalLimits;
  className?: string;
}) {
  if (!decision.needsApproval) {
    return (
      <div className={['approval-needs approval-needs--none', className].filter(Boolean).join(' ')}>
        <i className="pi pi-check-circle" aria-hidden="true" />
        <div>
          <p className="approval-needs__title">No approval needed</p>
          <p className="approval-needs__detail">
            Within the branch’s {limits.marginFloorPct}% margin floor and {limits.whose} {limits.authorityPct}
            % discount authority.
          </p>
        </div>
      </div>
    );
  }
  return (
    <div className={['approval-needs approval-needs--needed', className].filter(Boolean).join(' ')}>
      <i className="pi pi-exclamation-triangle" aria-hidden="true" />
      <div>
        <p className="approval-needs__title">{APPROVER_NEEDS[decision.approver]}</p>
        <ul className="approval-needs__reasons">
          {decision.reasons.map((r) => (
            <li key={r}>{reasonText(r, limits)}</li>
          ))}
        </ul>
      </div>
    </div>
  );
}
