import '../jobs.css';
import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Message } from 'primereact/message';
import { asSubject, type JobDetail } from '@loambook/common';
import { paths } from '@/app/paths';
import { NotFound } from '@/app/routes/not-found';
import { ApiErrorMessage } from '@/components/api-error-message';
import { PageLoading } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { isApiError } from '@/lib/api-client';
import { formatDateTime } from '@/lib/format';
import { useAppAbility } from '@/features/auth/ability';
import { useCrews } from '../api/get-crews';
import { useJob } from '../api/get-job';
import { ActualsPanel } from '../components/actuals-panel';
import { ClocksPanel } from '../components/clocks-panel';
import { JobCautions } from '../components/job-cautions';
import { JobHeader } from '../components/job-header';
import { JobLogSection } from '../components/job-log-section';
import { LocateSection } from '../components/locate-form';
import { PermitSection } from '../components/permit-form';
import { PlanSection } from '../components/plan-section';
import { ScheduleDialog } from '../components/schedule-dialog';
import { StartBlockers, StartJobButton } from '../components/start-panel';
import { SurveyComparisonSection } from '../components/survey-comparison-view';
import { WaiverDialog } from '../components/waiver-dialog';
import { WarrantySection } from '../components/warranty-section';
import { formatDay, formatDayLong, todayFor } from '../job-format';

export default function JobRoute() {
  const { jobId = '' } = useParams();
  const job = useJob(jobId);
  if (job.isPending) return <PageLoading label="Loading job" />;
  if (job.isError) {
    if (isApiError(job.error) && (job.error.status === 404 || job.error.status === 400)) return <NotFound />;
    return (
      <div className="page">
        <ApiErrorMessage error={job.error} />
      </div>
    );
  }
  return <JobPage key={job.data.id} job={job.data} />;
}

function JobPage({ job }: { job: JobDetail }) {
  const ability = useAppAbility();
  const navigate = useNavigate();
  const notify = useNotify();
  const [open, setOpen] = useState<null | 'schedule' | 'waiver'>(null);
  const subject = asSubject('Job', {
    branchId: job.branchId,
    salespersonId: job.salespersonId,
    crewLeadId: job.crewLeadId,
  });
  const mayUpdate = ability.can('update', subject);
  const can = {
    ...job.can,
    schedule: job.can.schedule && mayUpdate,
    editPermits: job.can.editPermits && mayUpdate,
    log: job.can.log && mayUpdate,
    complete: job.can.complete && mayUpdate,
  };
  const shown: JobDetail = { ...job, can };
  const manages = ability.can('manage', subject);
  const crews = useCrews(job.branchId, { enabled: can.schedule });
  const closed = job.status === 'completed' || job.status === 'cancelled';
  const started = job.status === 'in_progress' || job.status === 'completed';

  const actions = (
    <>
      {can.schedule && !started && !closed ? (
        <Button
          type="button"
          label={job.startOn ? 'Reschedule' : 'Schedule'}
          icon="pi pi-calendar"
          outlined
          onClick={() => setOpen('schedule')}
        />
      ) : null}
      {mayUpdate && !closed ? (
        <Button
          type="button"
          label="Field log"
          icon="pi pi-mobile"
          outlined
          onClick={() => void navigate(paths.jobField.href(job.id))}
        />
      ) : null}
      {can.complete && job.status === 'in_progress' ? (
        <Button
          type="button"
          label="Complete job"
          icon="pi pi-flag"
          onClick={() => void navigate(paths.jobComplete.href(job.id))}
        />
      ) : null}
      <Button
        type="button"
        label="Job sheet"
        icon="pi pi-print"
        text
        onClick={() => void navigate(paths.jobSheet.href(job.id))}
      />
    </>
  );

  return (
    <div className="page page--wide job-page">
      <div className="job-page__links">
        <Link to={paths.jobs.href()} className="back-link">
          <i className="pi pi-arrow-left" aria-hidden="true" /> Jobs
        </Link>
        {ability.can('read', 'Lead') ? (
          <Link to={paths.lead.href(job.leadId)} className="back-link">
            Lead <i className="pi pi-arrow-right" aria-hidden="true" />
          </Link>
        ) : null}
      </div>

      {!mayUpdate ? (
        <Message
          severity="info"
          className="w-full"
          text="Read only: you follow this job; the branch office and the crew run it."
        />
      ) : null}
      {job.status === 'cancelled' ? (
        <Message
          severity="warn"
          className="w-full"
          text="Cancelled: the contract was cancelled. Nothing more is done on this job."
        />
      ) : null}
      {job.windowWaivedAt ? (
        <Message
          severity="warn"
          className="w-full"
          text={`The homeowner waived the right to cancel for an emergency on ${formatDateTime(job.windowWaivedAt)}: “${job.windowWaiverNote ?? ''}”`}
        />
      ) : null}
      {job.conflicts.length ? (
        <Message
          severity="warn"
          className="w-full"
          content={
            <span>
              <strong>Conflict:</strong> {job.crewName ?? 'The crew'} is also on{' '}
              {job.conflicts.map((c, i) => (
                <span key={c.jobId}>
                  {i ? ', ' : ''}
                  <Link to={paths.job.href(c.jobId)}>{c.number}</Link> from {formatDay(c.startOn)} (
                  {c.durationDays} {c.durationDays === 1 ? 'day' : 'days'})
                </span>
              ))}
              .
            </span>
          }
        />
      ) : null}

      <Card className="content-card">
        <JobHeader job={shown} actions={actions} />
        <StartJobButton
          job={shown}
          onStarted={(j) => notify.success(`${j.number} started`, 'The crew can log points and piers now.')}
        />
      </Card>

      <div className="job-layout">
        <div className="job-layout__main">
          {!closed || job.status === 'completed' ? (
            <Card className="content-card">
              <StartBlockers job={shown} onWaive={can.schedule ? () => setOpen('waiver') : undefined} />
              {job.status === 'in_progress' || job.status === 'completed' ? null : (
                <hr className="job-rule" />
              )}
              <PlanSection job={shown} showMoney={ability.can('read', 'Proposal')} />
            </Card>
          ) : null}
          {started && job.can.seeCosts !== false ? (
            <Card className="content-card">
              <ActualsPanel jobId={job.id} completed={job.status === 'completed'} />
            </Card>
          ) : null}
          {started ? (
            <Card className="content-card">
              <JobLogSection jobId={job.id} />
            </Card>
          ) : null}
          {job.status === 'completed' ? (
            <>
              <Card className="content-card">
                <SurveyComparisonSection jobId={job.id} />
              </Card>
              <Card className="content-card">
                <WarrantySection job={shown} canIssue={manages} />
              </Card>
            </>
          ) : null}
        </div>
        <aside className="job-layout__side">
          <Card className="content-card">
            <ClocksPanel clocks={job.clocks} />
          </Card>
          <Card className="content-card">
            <LocateSection job={shown} />
          </Card>
          <Card className="content-card">
            <PermitSection job={shown} />
          </Card>
          <Card className="content-card">
            <JobCautions cautions={job.cautions} />
          </Card>
        </aside>
      </div>

      {can.schedule ? (
        <ScheduleDialog
          job={open === 'schedule' ? job : null}
          crews={(crews.data ?? []).filter((c) => c.active)}
          defaultStartOn={todayFor(job.timezone)}
          onClose={() => setOpen(null)}
          onDone={(j, what) => {
            setOpen(null);
            notify.success(
              what === 'scheduled' ? `${j.number} scheduled` : `${j.number} unscheduled`,
              what === 'scheduled'
                ? `${j.crewName ?? 'Crew'} from ${formatDayLong(j.startOn)}. The homeowner gets an e-mail.`
                : undefined,
            );
          }}
        />
      ) : null}
      {can.schedule ? (
        <WaiverDialog
          job={job}
          visible={open === 'waiver'}
          onClose={() => setOpen(null)}
          onDone={(j) => {
            setOpen(null);
            notify.success('Waiver recorded', `${j.number} may start before the window closes.`);
          }}
        />
      ) : null}
    </div>
  );
}
