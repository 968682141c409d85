import { useCallback, useMemo, useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Message } from 'primereact/message';
import {
  APPROVER_LABELS,
  formatUsd,
  money,
  type CreateProposalRequest,
  type ProposalDetail,
} from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { PageLoading } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { isApiError } from '@/lib/api-client';
import { formatDateTime } from '@/lib/format';
import { useAppAbility } from '@/features/auth/ability';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { usePriceBook } from '@/features/price-book/api/get-price-book';
import { openPdf } from '../api/download-pdf';
import { useLeadContract } from '../api/get-lead-contract';
import { useLeadInspections } from '../api/get-lead-inspections';
import { useProposal } from '../api/get-proposal';
import { useSendProposal } from '../api/send-proposal';
import { useSubmitProposal } from '../api/submit-proposal';
import { useUpdateProposal } from '../api/update-proposal';
import { submitterLimits, reasonText } from '../approval-wording';
import { ContractSummary } from '../components/contract-summary';
import { InPersonSigningDialog } from '../components/in-person-signing-dialog';
import { ProposalBuilder } from '../components/proposal-builder';
import { ProposalStatusTag } from '../components/proposal-status-tag';
import { SendDialog } from '../components/send-dialog';
import { VersionsList } from '../components/versions-list';
import { draftFromProposal } from '../proposal-draft';
import { useBranchOf, useLeadOf } from '../proposal-viewer';
import '../proposals.css';

const why = (error: unknown) => (isApiError(error) ? error.message : 'Try again in a moment.');

export default function ProposalRoute() {
  const { proposalId = '' } = useParams();
  const user = useCurrentUser();
  const ability = useAppAbility();
  const navigate = useNavigate();
  const notify = useNotify();
  const proposal = useProposal(proposalId);
  const p = proposal.data;
  const lead = useLeadOf(p?.leadId);
  const branch = useBranchOf(p?.branchId);
  const items = usePriceBook(p ? { branchId: p.branchId, includeInactive: true } : null);
  const inspections = useLeadInspections(p?.leadId ?? '', { enabled: !!p });
  const contract = useLeadContract(p?.leadId ?? '', { enabled: p?.status === 'signed' });
  const update = useUpdateProposal();
  const submit = useSubmitProposal();
  const send = useSendProposal();

  const [editingNewVersion, setEditingNewVersion] = useState(false);
  const [dirty, setDirty] = useState(false);
  const [sendOpen, setSendOpen] = useState(false);
  const [signOpen, setSignOpen] = useState(false);
  const [pdfOpening, setPdfOpening] = useState(false);
  const onDirtyChange = useCallback((d: boolean) => setDirty(d), []);

  // A fresh draft every time the saved version changes (after a save, a submit, an approval).
  const initial = useMemo(() => (p ? draftFromProposal(p) : null), [p]);

  const failed = proposal.error ?? lead.error ?? branch.error ?? items.error ?? inspections.error ?? null;
  if (failed) {
    return (
      <div className="page proposal-page">
        <PageHeader title="Proposal" />
        <ApiErrorMessage error={failed} />
      </div>
    );
  }
  if (!p || !lead.data || !branch.data || !items.data || !inspections.data || !initial) {
    return <PageLoading label="Opening the proposal…" />;
  }

  const status = p.status;
  const mayUpdate = p.editable || p.canSubmit;
  const editInPlace = p.editable && ['draft', 'refused', 'approved'].includes(status);
  const editingSent = status === 'sent' && p.editable && editingNewVersion;
  const mode = editInPlace || editingSent ? 'edit' : 'read';
  const canSubmit =
    mode === 'edit' &&
    (status === 'draft' || status === 'refused' || editingSent || (status === 'approved' && dirty));
  const canSend = mayUpdate && (status === 'approved' || status === 'sent');
  const inspection = inspections.data.find((i) => i.id === p.inspectionId) ?? null;
  const lowestTotal = p.options.reduce<string | null>(
    (min, o) =>
      min === null || money(o.totals.customerTotal).lessThan(money(min)) ? o.totals.customerTotal : min,
    null,
  );

  const save = async (request: CreateProposalRequest): Promise<ProposalDetail> => {
    const saved = await update.mutateAsync({ id: p.id, input: request });
    if (saved.id !== p.id) {
      setEditingNewVersion(false);
      notify.success(
        `Version ${saved.version} drafted`,
        `Version ${p.version} stays as it was sent; its signing link stops working.`,
      );
      void navigate(paths.proposal.href(saved.id));
    }
    return saved;
  };

  const onSave = async (request: CreateProposalRequest) => {
    const saved = await save(request);
    if (saved.id === p.id) notify.success('Draft saved', `Version ${saved.version}.`);
  };

  const onSubmit = async (request: CreateProposalRequest, mustSave: boolean) => {
    const target = mustSave || status !== 'draft' ? await save(request) : p;
    const result = await submit.mutateAsync(target.id);
    notify.success(
      result.status === 'pending_approval' ? 'Sent for approval' : 'Ready to send',
      result.status === 'pending_approval'
        ? `${APPROVER_LABELS[result.approval.approver]} asked to approve version ${result.version}.`
        : 'Send it to the homeowner, or have them sign in person.',
    );
  };

  const downloadPdf = async () => {
    setPdfOpening(true);
    try {
      await openPdf(`/proposals/${encodeURIComponent(p.id)}/pdf`, `proposal-v${p.version}.pdf`);
    } catch (error) {
      notify.error('The PDF did not open', why(error));
    } finally {
      setPdfOpening(false);
    }
  };

  const latest = p.versions[0];
  const request = p.approvalRequest;
  const limits = request ? submitterLimits(request.figures.submitterRole, request.figures) : null;

  const actions = (
    <>
      <Button
        type="button"
        label="Download PDF"
        icon="pi pi-file-pdf"
        outlined
        loading={pdfOpening}
        onClick={() => void downloadPdf()}
      />
      {status === 'sent' && p.editable && !editingNewVersion ? (
        <Button
          type="button"
          label="Edit (new version)"
          icon="pi pi-pencil"
          outlined
          onClick={() => setEditingNewVersion(true)}
        />
      ) : null}
      {canSend ? (
        <Button
          type="button"
          label="Sign in person"
          icon="pi pi-tablet"
          outlined
          disabled={dirty}
          onClick={() => setSignOpen(true)}
        />
      ) : null}
      {canSend ? (
        // The text as content rather than `label`: PrimeReact would copy a label into aria-label, and a
        // search by the label "Send to" (the dialog's e-mail field) would find this button too.
        <Button type="button" icon="pi pi-send" disabled={dirty} onClick={() => setSendOpen(true)}>
          <span className="p-button-label">{status === 'sent' ? 'Send again' : 'Send to homeowner'}</span>
        </Button>
      ) : null}
    </>
  );

  return (
    <div className="page proposal-page">
      <Link to={paths.lead.href(p.leadId)} className="back-link">
        <i className="pi pi-arrow-left" aria-hidden="true" /> {lead.data.homeownerName}
      </Link>
      <PageHeader
        title={`Proposal · version ${p.version}`}
        description={
          <span className="proposal-page__meta">
            <ProposalStatusTag status={status} />
            <span>
              {lead.data.homeownerName} · {lead.data.addressLine1}, {lead.data.city} · {branch.data.code}
            </span>
          </span>
        }
        actions={actions}
      />

      {status === 'pending_approval' && request ? (
        <Message
          severity="warn"
          className="proposal-banner"
          content={
            <div>
              <p className="proposal-banner__title">
                Waiting for the {APPROVER_LABELS[request.approver].toLowerCase()}’s approval since{' '}
                {formatDateTime(request.requestedAt)}
              </p>
              {limits ? (
                <ul className="proposal-banner__list">
                  {request.reasons.map((r) => (
                    <li key={r}>{reasonText(r, limits)}</li>
                  ))}
                </ul>
              ) : null}
              <p className="proposal-banner__text">
                It cannot be changed until it is approved or refused.
                {ability.can('approve', 'Proposal') ? (
                  <>
                    {' '}
                    <Link to={paths.approvals.href()}>Open the approval queue</Link>.
                  </>
                ) : null}
              </p>
            </div>
          }
        />
      ) : null}
      {status === 'refused' && request ? (
        <Message
          severity="error"
          className="proposal-banner"
          content={
            <div>
              <p className="proposal-banner__title">
                Refused by {request.decidedBy?.name ?? 'a manager'}
                {request.decidedAt ? ` on ${formatDateTime(request.decidedAt)}` : ''}
              </p>
              {request.decisionNote ? (
                <blockquote className="proposal-banner__note">{request.decisionNote}</blockquote>
              ) : null}
              <p className="proposal-banner__text">Change the options, then submit it again.</p>
            </div>
          }
        />
      ) : null}
      {status === 'approved' ? (
        <Message
          severity="success"
          className="proposal-banner"
          content={
            <div>
              <p className="proposal-banner__title">
                {request?.status === 'approved'
                  ? `Approved by ${request.decidedBy?.name ?? 'a manager'}${request.decidedAt ? ` on ${formatDateTime(request.decidedAt)}` : ''}`
                  : 'Ready to send'}
              </p>
              {request?.status === 'approved' && request.decisionNote ? (
                <blockquote className="proposal-banner__note">{request.decisionNote}</blockquote>
              ) : null}
              <p className="proposal-banner__text">
                Send it to the homeowner or have them sign in person. Saving a change returns it to draft.
              </p>
            </div>
          }
        />
      ) : null}
      {status === 'sent' ? (
        <Message
          severity="info"
          className="proposal-banner"
          content={
            <div>
              <p className="proposal-banner__title">
                Sent to the homeowner{p.sentAt ? ` on ${formatDateTime(p.sentAt)}` : ''} — read-only
              </p>
              <p className="proposal-banner__text">
                {editingSent
                  ? `Saving makes version ${(latest?.version ?? p.version) + 1}; version ${p.version} stays as it was sent and its signing link stops working.`
                  : 'To change it, use “Edit (new version)”: the version sent stays as it was.'}
              </p>
            </div>
          }
        />
      ) : null}
      {status === 'signed' ? (
        <Message
          severity="success"
          className="proposal-banner"
          content={
            <p className="proposal-banner__title">
              Signed — this version is the contract and is kept as it is.
            </p>
          }
        />
      ) : null}
      {status === 'superseded' ? (
        <Message
          severity="info"
          className="proposal-banner"
          content={
            <p className="proposal-banner__title">
              Replaced by a later version — read-only.{' '}
              {latest && latest.id !== p.id ? (
                <Link to={paths.proposal.href(latest.id)}>Open version {latest.version}</Link>
              ) : null}
            </p>
          }
        />
      ) : null}
      {status === 'declined' ? (
        <Message
          severity="info"
          className="proposal-banner"
          content={<p className="proposal-banner__title">Declined by the homeowner — read-only.</p>}
        />
      ) : null}

      {contract.data ? <ContractSummary contract={contract.data} timeZone={branch.data.timezone} /> : null}

      <Card className="content-card proposal-card">
        <ProposalBuilder
          key={`${p.id}:${p.updatedAt}:${mode}`}
          initial={initial}
          saved={p}
          items={items.data}
          branch={branch.data}
          viewer={{ role: user.role, isSalesperson: p.salespersonId === user.id }}
          inspections={inspections.data}
          mode={mode}
          canSubmit={canSubmit}
          saveHint={
            editingSent
              ? `Saving makes version ${(latest?.version ?? p.version) + 1}.`
              : status === 'approved'
                ? 'Saving a change returns it to draft: submit it again.'
                : undefined
          }
          pending={update.isPending ? 'save' : submit.isPending ? 'submit' : null}
          onSave={onSave}
          onSubmit={onSubmit}
          onDirtyChange={onDirtyChange}
        />
        {mode === 'read' && !p.readOnly && !mayUpdate ? (
          <p className="table-footnote">
            Only the salesperson on the lead or a manager of the branch can change it.
          </p>
        ) : null}
      </Card>

      <Card className="content-card">
        <VersionsList versions={p.versions} currentId={p.id} />
      </Card>

      <SendDialog
        visible={sendOpen}
        defaultEmail={lead.data.email ?? null}
        homeownerName={lead.data.homeownerName}
        version={p.version}
        resend={status === 'sent'}
        lowestTotal={lowestTotal}
        pending={send.isPending}
        onClose={() => setSendOpen(false)}
        onSend={async (input) => {
          const result = await send.mutateAsync({ id: p.id, input });
          setSendOpen(false);
          notify.success(
            `Proposal sent to ${result.signingLink.sentTo}`,
            `The signing link works until ${formatDateTime(result.signingLink.expiresAt)}${
              result.signingLink.depositAmount
                ? `; deposit ${formatUsd(result.signingLink.depositAmount)}`
                : ''
            }.`,
          );
        }}
      />
      <InPersonSigningDialog
        visible={signOpen}
        proposal={p}
        lead={lead.data}
        branch={branch.data}
        inspection={inspection}
        onClose={() => setSignOpen(false)}
        onSigned={(c) =>
          notify.success(
            'Contract signed',
            `${c.signedByName} signed option ${c.option.position} for ${formatUsd(c.price)}.`,
          )
        }
      />
    </div>
  );
}
