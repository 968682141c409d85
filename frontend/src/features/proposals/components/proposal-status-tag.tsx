import { Tag } from 'primereact/tag';
import { PROPOSAL_STATUS_LABELS, type ProposalStatus } from '@loambook/common';

const SEVERITY: Record<ProposalStatus, 'success' | 'info' | 'warning' | 'danger' | 'secondary' | null> = {
  draft: 'secondary',
  pending_approval: 'warning',
  approved: 'info',
  refused: 'danger',
  sent: 'info',
  signed: 'success',
  superseded: 'secondary',
  declined: 'secondary',
};

export function ProposalStatusTag({ status }: { status: ProposalStatus }) {
  return (
    <Tag
      value={PROPOSAL_STATUS_LABELS[status]}
      severity={SEVERITY[status] ?? undefined}
      className={`proposal-status proposal-status--${status}`}
    />
  );
}
