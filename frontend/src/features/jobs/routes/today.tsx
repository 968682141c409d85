import '../jobs.css';
import { Link } from 'react-router';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { useToday } from '../api/get-today';
import { JobStatusTag } from '../components/job-badges';
import { OthersWaitingNote } from '../field/outbox-banner';
import { useOthersWaiting } from '../offline/field-queue';
import { daysFrom, formatDayLong, formatRun, todayFor } from '../job-format';

/** The crew lead's day: the jobs their crew is on today, each a big tap to its log. */
export default function TodayRoute() {
  const user = useCurrentUser();
  const { branch } = useCurrentBranch();
  const today = todayFor(branch?.timezone);
  const jobs = useToday();
  const others = useOthersWaiting();
  const firstName = user.name.split(/\s+/)[0] ?? user.name;
  return (
    <div className="page field-page">
      <header className="field-today">
        <h1 className="field-today__title">Today</h1>
        <p className="muted">
          {formatDayLong(today)} · {firstName}’s crew
        </p>
      </header>
      <OthersWaitingNote others={others} />
      {jobs.isPending ? (
        <TableSkeleton rows={3} label="Loading today’s jobs" />
      ) : jobs.isError ? (
        <ApiErrorMessage error={jobs.error} />
      ) : jobs.data.length === 0 ? (
        <EmptyState icon="pi-sun" title="No job on your crew today">
          The office puts jobs on your crew’s calendar; they show here on their days.
        </EmptyState>
      ) : (
        <ul className="today-list">
          {jobs.data.map((j) => {
            const day = j.startOn ? daysFrom(j.startOn, today) + 1 : null;
            return (
              <li key={j.id}>
                <Link to={paths.jobField.href(j.id)} className="today-card">
                  <span className="today-card__top">
                    <span className="today-card__number">{j.number}</span>
                    <JobStatusTag status={j.status} />
                  </span>
                  <span className="today-card__name">{j.homeownerName}</span>
                  <span className="today-card__address">
                    <i className="pi pi-map-marker" aria-hidden="true" /> {j.addressLine1}, {j.city}
                  </span>
                  <span className="today-card__days muted">
                    {day && j.durationDays > 1 ? `Day ${day} of ${j.durationDays} · ` : ''}
                    {formatRun(j.startOn, j.durationDays)}
                  </span>
                  <span className="today-card__go" aria-hidden="true">
                    Open <i className="pi pi-chevron-right" />
                  </span>
                </Link>
              </li>
            );
          })}
        </ul>
      )}
    </div>
  );
}
