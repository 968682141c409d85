import { useMemo } from 'react';
import { Link, useNavigate, useParams } from 'react-router';
import { Card } from 'primereact/card';
import { Message } from 'primereact/message';
import type { CreateProposalRequest } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { PageLoading } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { isApiError } from '@/lib/api-client';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { usePriceBook } from '@/features/price-book/api/get-price-book';
import { useCreateProposal } from '../api/create-proposal';
import { useLeadInspections } from '../api/get-lead-inspections';
import { useLeadProposals } from '../api/get-lead-proposals';
import { useSubmitProposal } from '../api/submit-proposal';
import { ProposalBuilder } from '../components/proposal-builder';
import { newDraft } from '../proposal-draft';
import { useBranchOf, useLeadOf } from '../proposal-viewer';
import '../proposals.css';

export default function ProposalNewRoute() {
  const { leadId = '' } = useParams();
  const user = useCurrentUser();
  const navigate = useNavigate();
  const notify = useNotify();
  const lead = useLeadOf(leadId);
  const branch = useBranchOf(lead.data?.branchId);
  const items = usePriceBook(lead.data ? { branchId: lead.data.branchId, includeInactive: false } : null);
  const inspections = useLeadInspections(leadId);
  const existing = useLeadProposals(leadId);
  const create = useCreateProposal();
  const submit = useSubmitProposal();

  const initial = useMemo(() => {
    // The latest completed inspection's findings go with the proposal unless the salesperson picks another.
    const done = (inspections.data ?? [])
      .filter((i) => i.status === 'completed')
      .sort((a, b) => (b.completedAt ?? '').localeCompare(a.completedAt ?? ''));
    return newDraft(done[0]?.id ?? null);
  }, [inspections.data]);

  const failed = lead.error ?? branch.error ?? items.error ?? existing.error ?? null;
  const loading =
    lead.isPending || branch.isPending || items.isPending || inspections.isPending || existing.isPending;
  const live = existing.data?.find((p) => p.status !== 'declined' && p.status !== 'superseded');

  const createThen = async (request: CreateProposalRequest) => {
    try {
      return await create.mutateAsync({ leadId, input: request });
    } catch (error) {
      if (isApiError(error) && error.code === 'PROPOSAL.EXISTS') {
        const id = (error.details as { proposalId?: string } | null)?.proposalId;
        if (id) {
          notify.info(
            'This lead already has a proposal',
            'It is opened instead: edit it to make a new version.',
          );
          void navigate(paths.proposal.href(id), { replace: true });
          return null;
        }
      }
      throw error;
    }
  };

  return (
    <div className="page proposal-page">
      <Link to={paths.lead.href(leadId)} className="back-link">
        <i className="pi pi-arrow-left" aria-hidden="true" /> Back to the lead
      </Link>
      <PageHeader
        title="New proposal"
        description={
          lead.data
            ? `For ${lead.data.homeownerName}, ${lead.data.addressLine1}, ${lead.data.city}. Priced from the ${branch.data?.code ?? ''} price book.`
            : undefined
        }
      />
      {failed ? (
        <ApiErrorMessage error={failed} />
      ) : loading || !lead.data || !branch.data || !items.data || !inspections.data ? (
        <PageLoading label="Opening the price book…" />
      ) : live ? (
        <Card className="content-card">
          <Message
            severity="info"
            className="form-message"
            content={
              <span>
                This lead already has a proposal (version {live.version}).{' '}
                <Link to={paths.proposal.href(live.id)}>Open it</Link> and edit it to make a new version.
              </span>
            }
          />
        </Card>
      ) : items.data.filter((i) => i.active).length === 0 ? (
        <Card className="content-card">
          <EmptyState icon="pi-list" title="The price book is empty">
            A proposal is priced from the branch’s price book. Ask your branch manager to add the items first.
          </EmptyState>
        </Card>
      ) : (
        <Card className="content-card proposal-card">
          <ProposalBuilder
            initial={initial}
            saved={null}
            items={items.data}
            branch={branch.data}
            viewer={{ role: user.role, isSalesperson: lead.data.salespersonId === user.id }}
            inspections={inspections.data}
            mode="edit"
            canSubmit
            pending={
              create.isPending ? (submit.isPending ? 'submit' : 'save') : submit.isPending ? 'submit' : null
            }
            onSave={async (request) => {
              const created = await createThen(request);
              if (!created) return;
              notify.success('Draft saved', `Version ${created.version} for ${lead.data.homeownerName}.`);
              void navigate(paths.proposal.href(created.id), { replace: true });
            }}
            onSubmit={async (request) => {
              const created = await createThen(request);
              if (!created) return;
              let result;
              try {
                result = await submit.mutateAsync(created.id);
              } catch (error) {
                notify.error(
                  'Saved as a draft, not submitted',
                  isApiError(error) ? error.message : undefined,
                );
                void navigate(paths.proposal.href(created.id), { replace: true });
                return;
              }
              notify.success(
                result.status === 'pending_approval' ? 'Sent for approval' : 'Ready to send',
                result.status === 'pending_approval'
                  ? 'The branch’s managers have been asked to approve it.'
                  : 'Send it to the homeowner or have them sign in person.',
              );
              void navigate(paths.proposal.href(created.id), { replace: true });
            }}
          />
        </Card>
      )}
    </div>
  );
}
