import { Tag } from 'primereact/tag';
import type { JobStatus, JobSummary } from '@loambook/common';
import { STATUS_LABELS, STATUS_SEVERITY } from '../job-format';

export function JobStatusTag({ status }: { status: JobStatus }) {
  return <Tag value={STATUS_LABELS[status]} severity={STATUS_SEVERITY[status]} className="job-status-tag" />;
}

/** The worst clock, in words and with an icon (never colour alone). */
export function RiskBadge({ risk }: { risk: JobSummary['risk'] }) {
  if (risk === 'none') return null;
  return risk === 'overdue' ? (
    <span className="job-flag job-flag--overdue">
      <i className="pi pi-exclamation-circle" aria-hidden="true" /> Clock overdue
    </span>
  ) : (
    <span className="job-flag job-flag--soon">
      <i className="pi pi-clock" aria-hidden="true" /> Clock due soon
    </span>
  );
}

export function ConflictBadge({
  conflict,
  label = 'Crew double-booked',
}: {
  conflict: boolean;
  label?: string;
}) {
  if (!conflict) return null;
  return (
    <span className="job-flag job-flag--conflict">
      <i className="pi pi-clone" aria-hidden="true" /> {label}
    </span>
  );
}

export function JobFlags({ job }: { job: Pick<JobSummary, 'risk' | 'conflict'> }) {
  if (job.risk === 'none' && !job.conflict) return null;
  return (
    <span className="job-flags">
      <RiskBadge risk={job.risk} />
      <ConflictBadge conflict={job.conflict} />
    </span>
  );
}
