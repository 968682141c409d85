import { formatUsd, money, type ApprovalRequestView } from '@loambook/common';
import { formatRecent } from '@/lib/format';
import { reasonText, submitterLimits } from '@/features/proposals/approval-wording';

interface ApprovalListProps {
  requests: ApprovalRequestView[];
  selectedId: string | null;
  onSelect: (request: ApprovalRequestView) => void;
}

/** The requests as a list of large buttons: the homeowner, who asks, when, why and for how much. */
export function ApprovalList({ requests, selectedId, onSelect }: ApprovalListProps) {
  return (
    <ul className="approval-list" aria-label="Requests">
      {requests.map((r) => {
        const limits = submitterLimits(r.figures.submitterRole, r.figures);
        const highest = r.figures.options.reduce<string | null>(
          (max, o) =>
            max === null || money(o.customerTotal).greaterThan(money(max)) ? o.customerTotal : max,
          null,
        );
        return (
          <li key={r.id}>
            <button
              type="button"
              className={`approval-item${r.id === selectedId ? ' approval-item--selected' : ''}`}
              aria-pressed={r.id === selectedId}
              onClick={() => onSelect(r)}
            >
              <span className="approval-item__top">
                <span className="approval-item__name">{r.homeownerName}</span>
                {highest ? <span className="approval-item__value">{formatUsd(highest)}</span> : null}
              </span>
              <span className="approval-item__meta">
                {r.branchName} · {r.requestedBy.name} · {formatRecent(r.requestedAt)}
              </span>
              <span className="approval-item__reasons">
                {r.reasons.map((reason) => reasonText(reason, limits)).join(' · ')}
              </span>
              {r.status === 'pending' && !r.canDecide ? (
                <span className="approval-item__owner">Needs the owner</span>
              ) : null}
            </button>
          </li>
        );
      })}
    </ul>
  );
}
