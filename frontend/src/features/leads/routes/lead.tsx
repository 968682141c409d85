import '../leads.css';
import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Message } from 'primereact/message';
import { asSubject, FOUNDATION_TYPE_LABELS, type LeadDetail, type LeadJobLink } from '@loambook/common';
import { paths } from '@/app/paths';
import { NotFound } from '@/app/routes/not-found';
import { ApiErrorMessage } from '@/components/api-error-message';
import { PageLoading } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { isApiError } from '@/lib/api-client';
import { formatDate } from '@/lib/format';
import { useAppAbility } from '@/features/auth/ability';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { LeadCommissionSplits } from '@/features/commissions/components/contract-splits-editor';
import { LeadInspections } from '@/features/inspections/components/lead-inspections';
import { STATUS_LABELS as JOB_STATUS_LABELS } from '@/features/jobs/job-format';
import { LeadProposals } from '@/features/proposals/components/lead-proposals';
import { useLeadContract } from '@/features/proposals/api/get-lead-contract';
import { RecordCancellationDialog } from '@/features/signing/components/record-cancellation-dialog';
import { LeadPayments } from '@/features/payments/components/lead-payments';
import { useLead } from '../api/get-lead';
import { EditLeadDialog } from '../components/edit-lead-dialog';
import { LeadHeader } from '../components/lead-header';
import { LeadTimeline } from '../components/lead-timeline';
import { LogActivityForm } from '../components/log-activity-form';
import { MarkLostDialog } from '../components/mark-lost-dialog';
import { TransferDialog } from '../components/transfer-dialog';
import { formatInBranchZone, withWeekday } from '../lead-format';

export default function LeadRoute() {
  const { leadId = '' } = useParams();
  const lead = useLead(leadId);
  if (lead.isPending) return <PageLoading label="Loading lead" />;
  if (lead.isError) {
    if (isApiError(lead.error) && (lead.error.status === 404 || lead.error.status === 400))
      return <NotFound />;
    return (
      <div className="page">
        <ApiErrorMessage error={lead.error} />
      </div>
    );
  }
  return <LeadPage key={lead.data.id} lead={lead.data} />;
}

type Open = null | 'edit' | 'lost' | 'transfer' | 'cancel';

function LeadPage({ lead }: { lead: LeadDetail }) {
  const ability = useAppAbility();
  const user = useCurrentUser();
  const notify = useNotify();
  const [open, setOpen] = useState<Open>(null);

  const subject = asSubject('Lead', { branchId: lead.branchId, salespersonId: lead.salespersonId });
  const canUpdate = !lead.readOnly && ability.can('update', subject);
  const manages = user.role === 'owner' || user.role === 'branch_manager';
  const lost = lead.moves.find((m) => m.to === 'lost');
  const closed = lead.stage === 'lost' || lead.stage === 'cancelled';
  const canBook =
    !lead.readOnly &&
    !closed &&
    ability.can(
      'create',
      asSubject('Inspection', { branchId: lead.branchId, salespersonId: lead.salespersonId }),
    );

  // The contract only while its cancellation clock runs (the lead says so): staff may then record a
  // cancellation the homeowner made by phone or mail. After the window a manager still can (the API
  // allows it, with the reason), but not from here: that is an exception, not a routine step.
  const contract = useLeadContract(lead.id, { enabled: Boolean(lead.lastDayToCancel) && !lead.readOnly });
  const cancellable =
    contract.data?.canCancel && contract.data.windowOpen && contract.data.status !== 'cancelled'
      ? contract.data
      : null;
  const canRecordCancellation =
    cancellable !== null &&
    ability.can(
      'update',
      asSubject('Contract', { branchId: cancellable.branchId, salespersonId: cancellable.salespersonId }),
    );

  const cancelButton = canRecordCancellation ? (
    <Button
      type="button"
      label="Record cancellation"
      icon="pi pi-ban"
      severity="danger"
      outlined
      onClick={() => setOpen('cancel')}
    />
  ) : null;

  const actions = canUpdate ? (
    <>
      <Button type="button" label="Edit lead" icon="pi pi-pencil" outlined onClick={() => setOpen('edit')} />
      {manages ? (
        <Button
          type="button"
          label="Transfer"
          icon="pi pi-arrow-right-arrow-left"
          outlined
          onClick={() => setOpen('transfer')}
        />
      ) : null}
      {lost?.allowed ? (
        <Button
          type="button"
          label="Mark lost"
          icon="pi pi-times"
          severity="danger"
          outlined
          onClick={() => setOpen('lost')}
        />
      ) : null}
      {cancelButton}
    </>
  ) : (
    cancelButton
  );

  return (
    <div className="page page--wide lead-page">
      <Link to={paths.leads.href()} className="back-link">
        <i className="pi pi-arrow-left" aria-hidden="true" /> Leads
      </Link>

      {lead.readOnly ? (
        <Message
          severity="info"
          className="w-full"
          text={`Read only: this lead was transferred to ${lead.branchCode}. ${lead.branchCode}’s team works it now; you see it for the record.`}
        />
      ) : null}
      {lead.stage === 'lost' ? (
        <Message
          severity="warn"
          className="w-full"
          text={`Lost${lead.lostReason ? `: ${lead.lostReason}` : '.'}`}
        />
      ) : null}
      {lead.lastDayToCancel ? (
        <Message
          severity="info"
          className="w-full"
          text={`The homeowner can cancel the signed contract until ${withWeekday(lead.lastDayToCancel)} (3-day right to cancel, 16 CFR 429). Order no materials and start no work before then.`}
        />
      ) : null}

      <Card className="content-card">
        <LeadHeader lead={lead} actions={actions} />
      </Card>

      <div className="lead-layout">
        <div className="lead-layout__main">
          {lead.readOnly ? (
            <Card className="content-card">
              <p className="muted lead-readonly-note">
                Its inspections, photos and proposals moved with it to {lead.branchCode}; the timeline below
                is the history up to now.
              </p>
            </Card>
          ) : (
            <>
              <Card className="content-card">
                <LeadInspections
                  leadId={lead.id}
                  branchId={lead.branchId}
                  homeownerName={lead.homeownerName}
                  canBook={canBook}
                />
              </Card>
              <Card className="content-card">
                <section className="lead-section" aria-labelledby="lead-proposals-title">
                  <div className="lead-section__head">
                    <h2 id="lead-proposals-title" className="lead-section__title">
                      Proposals
                    </h2>
                    {lead.job ? <JobLink job={lead.job} /> : null}
                  </div>
                  <LeadProposals leadId={lead.id} />
                </section>
              </Card>
              <LeadPaymentsCard lead={lead} />
              <LeadCommissionSplits leadId={lead.id} />
            </>
          )}
          <Card className="content-card">
            {/* Not labelled by its heading: "Timeline" would also answer to the booking dialog's "Time". */}
            <section className="lead-section">
              <h2 id="lead-timeline-title" className="lead-section__title">
                Timeline
              </h2>
              {canUpdate ? <LogActivityForm leadId={lead.id} /> : null}
              <LeadTimeline activities={lead.activities} timeZone={lead.timezone} />
            </section>
          </Card>
        </div>

        <aside className="lead-layout__side">
          <Card className="content-card">
            <section className="lead-section" aria-labelledby="lead-property-title">
              <h2 id="lead-property-title" className="lead-section__title">
                Property
              </h2>
              <dl className="fact-list">
                <div>
                  <dt>Year built</dt>
                  <dd>{lead.yearBuilt ?? '—'}</dd>
                </div>
                <div>
                  <dt>Foundation</dt>
                  <dd>
                    {lead.foundationType ? FOUNDATION_TYPE_LABELS[lead.foundationType] : 'Not known yet'}
                  </dd>
                </div>
                <div>
                  <dt>Source</dt>
                  <dd>{lead.source ?? '—'}</dd>
                </div>
                <div>
                  <dt>Entered</dt>
                  <dd>{formatDate(lead.createdAt)}</dd>
                </div>
              </dl>
              {lead.notes ? <p className="lead-notes">{lead.notes}</p> : null}
            </section>
          </Card>
          {lead.transfers.length ? (
            <Card className="content-card">
              <section className="lead-section" aria-labelledby="lead-transfers-title">
                <h2 id="lead-transfers-title" className="lead-section__title">
                  Transfers
                </h2>
                <ol className="transfer-list">
                  {lead.transfers.map((t) => (
                    <li key={t.id}>
                      <span className="strong">
                        {t.fromBranchCode} → {t.toBranchCode}
                      </span>{' '}
                      <span className="muted">
                        {formatInBranchZone(t.createdAt, lead.timezone)} · {t.transferredByName}
                      </span>
                      {t.note ? <p className="transfer-list__note">{t.note}</p> : null}
                    </li>
                  ))}
                </ol>
              </section>
            </Card>
          ) : null}
        </aside>
      </div>

      {canRecordCancellation ? (
        <RecordCancellationDialog
          contract={cancellable}
          visible={open === 'cancel'}
          onClose={() => setOpen(null)}
          onDone={(c) => {
            setOpen(null);
            notify.success(
              'Cancellation recorded',
              `${c.homeownerName}’s contract is cancelled; any payment received is due back within 10 business days.`,
            );
          }}
        />
      ) : null}
      {canUpdate ? (
        <>
          <EditLeadDialog
            lead={lead}
            visible={open === 'edit'}
            chooseSalesperson={manages}
            onClose={() => setOpen(null)}
          />
          <MarkLostDialog
            lead={lead}
            visible={open === 'lost'}
            onClose={() => setOpen(null)}
            onDone={(l) => {
              setOpen(null);
              notify.success('Marked lost', `${l.homeownerName} has left the open pipeline.`);
            }}
          />
          {manages ? (
            <TransferDialog
              lead={lead}
              visible={open === 'transfer'}
              onClose={() => setOpen(null)}
              onDone={(l) => {
                setOpen(null);
                notify.success('Lead transferred', `${l.homeownerName} now belongs to ${l.branchCode}.`);
              }}
            />
          ) : null}
        </>
      ) : null}
    </div>
  );
}

/** The contract's money (issue #5), in its own card once the lead has a contract the person may see. */
function LeadPaymentsCard({ lead }: { lead: LeadDetail }) {
  if (
    !lead.lastDayToCancel &&
    ![
      'contract_signed',
      'deposit_received',
      'scheduled',
      'in_progress',
      'completed',
      'paid_in_full',
      'cancelled',
    ].includes(lead.stage)
  ) {
    return null;
  }
  return (
    <Card className="content-card lead-payments-card">
      <LeadPayments
        leadId={lead.id}
        homeownerName={lead.homeownerName}
        homeownerEmail={lead.email ?? null}
        timeZone={lead.timezone}
      />
    </Card>
  );
}

/** The lead's field job, beside its contract: its number and where it stands, one click from the job page. */
function JobLink({ job }: { job: LeadJobLink }) {
  return (
    <Link to={paths.job.href(job.id)} className="lead-job-link">
      <i className="pi pi-wrench" aria-hidden="true" /> Job {job.number}
      <span className="muted"> · {JOB_STATUS_LABELS[job.status]}</span>
    </Link>
  );
}
