import { Link } from 'react-router';
import { Tag } from 'primereact/tag';
import type { AtRiskJob } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { TableSkeleton } from '@/components/loading';
import { useAtRisk } from '../api/get-at-risk';
import { CLOCK_STATE_LABELS, CLOCK_STATE_SEVERITY, formatDayLong } from '../job-format';

function daysText(daysLeft: number | null): string {
  if (daysLeft === null) return '';
  if (daysLeft < 0) return `${-daysLeft} ${daysLeft === -1 ? 'day' : 'days'} late`;
  if (daysLeft === 0) return 'due today';
  return `${daysLeft} ${daysLeft === 1 ? 'day' : 'days'} left`;
}

/** Jobs whose permit, start or locate clock is close to running out (or has), worst first. */
export function AtRiskList({ branchId }: { branchId: string | null }) {
  const atRisk = useAtRisk(branchId);
  return (
    <section className="at-risk" aria-labelledby="at-risk-title">
      <h2 id="at-risk-title" className="job-section__title">
        <i className="pi pi-stopwatch" aria-hidden="true" /> Jobs at risk
        {atRisk.data ? <span className="count-pill">{atRisk.data.length}</span> : null}
      </h2>
      {atRisk.isPending ? (
        <TableSkeleton rows={2} label="Loading jobs at risk" />
      ) : atRisk.isError ? (
        <ApiErrorMessage error={atRisk.error} />
      ) : atRisk.data.length === 0 ? (
        <p className="muted">No permit, start or locate clock is due within 7 days.</p>
      ) : (
        <ul className="at-risk__list">
          {sortWorstFirst(atRisk.data).map((job) => (
            <li key={job.id} className="at-risk__item">
              <div className="at-risk__job">
                <Link to={paths.job.href(job.id)} className="strong">
                  {job.number}
                </Link>
                <span>{job.homeownerName}</span>
                <span className="muted">{job.city}</span>
              </div>
              <ul className="at-risk__clocks">
                {job.clocks
                  .filter((c) => c.state === 'due_soon' || c.state === 'overdue')
                  .map((c) => (
                    <li key={c.code}>
                      <Tag value={CLOCK_STATE_LABELS[c.state]} severity={CLOCK_STATE_SEVERITY[c.state]} />{' '}
                      <span>{c.title}</span>{' '}
                      <span className="muted">
                        by {formatDayLong(c.dueOn)} · {daysText(c.daysLeft)}
                      </span>
                    </li>
                  ))}
              </ul>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

function sortWorstFirst(jobs: AtRiskJob[]): AtRiskJob[] {
  const worst = (j: AtRiskJob) =>
    Math.min(
      ...j.clocks.filter((c) => c.daysLeft !== null && c.state !== 'met').map((c) => c.daysLeft!),
      999,
    );
  return [...jobs].sort((a, b) => worst(a) - worst(b));
}
