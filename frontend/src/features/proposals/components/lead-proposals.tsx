import { Link, useNavigate } from 'react-router';
import { Button } from 'primereact/button';
import { Skeleton } from 'primereact/skeleton';
import { asSubject, formatUsd } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { formatRecent } from '@/lib/format';
import { useAppAbility } from '@/features/auth/ability';
import { useLead } from '@/features/leads/api/get-lead';
import { useLeadContract } from '../api/get-lead-contract';
import { useLeadProposals } from '../api/get-lead-proposals';
import { ContractSummary } from './contract-summary';
import { ProposalStatusTag } from './proposal-status-tag';
import '../proposals.css';

/**
 * The Proposals section of the lead page: every version with its status and totals, a way to start one,
 * and the signed contract with its cancellation clock.
 */
export function LeadProposals({ leadId }: { leadId: string }) {
  const ability = useAppAbility();
  const navigate = useNavigate();
  const proposals = useLeadProposals(leadId);
  const lead = useLead(leadId);
  const signed = proposals.data?.some((p) => p.status === 'signed') ?? false;
  const contract = useLeadContract(leadId, { enabled: signed });

  const latest = proposals.data?.[0];
  const mayCreate =
    !!lead.data &&
    ability.can(
      'create',
      asSubject('Proposal', { branchId: lead.data.branchId, salespersonId: lead.data.salespersonId }),
    );
  // A lead has one line of versions: a new proposal starts only when none is live (or the last was declined).
  const canStart = mayCreate && (!latest || latest.status === 'declined');

  const newButton = canStart ? (
    <Button
      type="button"
      label="New proposal"
      icon="pi pi-plus"
      size="small"
      onClick={() => void navigate(paths.newProposal.href(leadId))}
    />
  ) : null;

  if (proposals.isPending) {
    return (
      <div className="lead-proposals" role="status" aria-label="Loading proposals">
        <Skeleton height="3.5rem" className="lead-proposals__skeleton" />
        <Skeleton height="3.5rem" />
      </div>
    );
  }
  if (proposals.isError) return <ApiErrorMessage error={proposals.error} />;

  return (
    <div className="lead-proposals">
      {contract.data ? <ContractSummary contract={contract.data} timeZone={lead.data?.timezone} /> : null}
      {proposals.data.length === 0 ? (
        <EmptyState icon="pi-file-edit" title="No proposal yet">
          <p className="lead-proposals__empty">
            Price the work from the branch’s price book: up to six options for the homeowner to choose from.
          </p>
          {newButton}
        </EmptyState>
      ) : (
        <>
          {newButton ? <div className="lead-proposals__actions">{newButton}</div> : null}
          <ol className="lead-proposals__list">
            {proposals.data.map((p) => (
              <li key={p.id} className="lead-proposal">
                <div className="lead-proposal__head">
                  <Link to={paths.proposal.href(p.id)} className="lead-proposal__link">
                    Version {p.version}
                  </Link>
                  <ProposalStatusTag status={p.status} />
                  <span className="lead-proposal__when muted">
                    {p.sentAt ? `Sent ${formatRecent(p.sentAt)}` : `Updated ${formatRecent(p.updatedAt)}`}
                  </span>
                </div>
                <ul className="lead-proposal__options">
                  {[...p.options]
                    .sort((a, b) => a.position - b.position)
                    .map((o) => (
                      <li key={o.id}>
                        <span className="lead-proposal__option-title">
                          {o.position}. {o.title}
                        </span>
                        <span className="lead-proposal__option-total">{formatUsd(o.customerTotal)}</span>
                        {o.grossMarginPct !== null ? (
                          <span className="lead-proposal__option-margin muted">
                            {o.grossMarginPct}% margin
                          </span>
                        ) : null}
                      </li>
                    ))}
                </ul>
              </li>
            ))}
          </ol>
        </>
      )}
    </div>
  );
}
