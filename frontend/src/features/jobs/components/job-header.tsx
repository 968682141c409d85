import type { ReactNode } from 'react';
import { formatUsd, money, type JobDetail } from '@loambook/common';
import { formatDateTime } from '@/lib/format';
import { dialable, formatDayLong, formatRun } from '../job-format';
import { JobFlags, JobStatusTag } from './job-badges';

/** Who, where, which crew on which days, and what was signed. */
export function JobHeader({ job, actions }: { job: JobDetail; actions?: ReactNode }) {
  const deposit = money(job.depositAmount);
  return (
    <header className="job-header">
      <div className="job-header__main">
        <p className="job-header__number">
          Job {job.number} <span className="muted">· {job.branchCode}</span>
        </p>
        <div className="job-header__title-row">
          <h1 className="job-header__name">{job.homeownerName}</h1>
          <JobStatusTag status={job.status} />
          <JobFlags job={job} />
        </div>
        <p className="job-header__address">
          <i className="pi pi-map-marker" aria-hidden="true" /> {job.addressLine1}, {job.city}, {job.state}{' '}
          {job.postalCode}
        </p>
        <dl className="job-header__facts">
          <div>
            <dt>Crew</dt>
            <dd>{job.crewName ?? 'No crew yet'}</dd>
          </div>
          <div>
            <dt>Days</dt>
            <dd>{formatRun(job.startOn, job.durationDays)}</dd>
          </div>
          <div>
            <dt>Salesperson</dt>
            <dd>{job.salespersonName ?? '—'}</dd>
          </div>
          <div>
            <dt>Contract</dt>
            <dd className="strong">{formatUsd(job.price)}</dd>
          </div>
          <div>
            <dt>Signed</dt>
            <dd>{formatDayLong(job.signedOn)}</dd>
          </div>
          <div>
            <dt>Right to cancel until</dt>
            <dd>
              {formatDayLong(job.lastDayToCancel)}
              {job.windowWaivedAt ? <span className="muted"> · waived (emergency)</span> : null}
            </dd>
          </div>
          <div>
            <dt>Deposit</dt>
            <dd>
              {deposit.isZero()
                ? 'None asked'
                : job.depositReceivedAt
                  ? `${formatUsd(job.depositAmount)} received`
                  : `${formatUsd(job.depositAmount)} not received yet`}
            </dd>
          </div>
          {job.startedAt ? (
            <div>
              <dt>Started</dt>
              <dd>{formatDateTime(job.startedAt)}</dd>
            </div>
          ) : null}
          {job.completedAt ? (
            <div>
              <dt>Completed</dt>
              <dd>{formatDateTime(job.completedAt)}</dd>
            </div>
          ) : null}
          {job.phonePrimary ? (
            <div>
              <dt>Phone</dt>
              <dd>
                <a href={`tel:${dialable(job.phonePrimary)}`}>{job.phonePrimary}</a>
              </dd>
            </div>
          ) : null}
        </dl>
      </div>
      {actions ? <div className="job-header__actions">{actions}</div> : null}
    </header>
  );
}
