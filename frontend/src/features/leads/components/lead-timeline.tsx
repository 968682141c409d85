import type { LeadActivity } from '@loambook/common';
import { activityKind, formatInBranchZone, formatRecentInBranchZone } from '../lead-format';

/**
 * What happened with the lead, newest first, each with who and when — on the branch's clock (`timeZone`,
 * the lead's branch), with the zone's abbreviation, like the inspections, whatever zone the browser is in.
 */
export function LeadTimeline({ activities, timeZone }: { activities: LeadActivity[]; timeZone?: string }) {
  if (activities.length === 0) return <p className="muted">Nothing on the timeline yet.</p>;
  return (
    <ol className="timeline">
      {activities.map((a) => {
        const kind = activityKind(a.kind);
        return (
          <li key={a.id} className={`timeline__item timeline__item--${a.kind}`}>
            <span className="timeline__icon" aria-hidden="true">
              <i className={`pi ${kind.icon}`} />
            </span>
            <div className="timeline__body">
              <p className="timeline__meta">
                <span className="timeline__kind">{kind.label}</span>
                <span aria-hidden="true"> · </span>
                <span>{a.actorName ?? 'Loambook'}</span>
                <span aria-hidden="true"> · </span>
                <time dateTime={a.createdAt} title={formatInBranchZone(a.createdAt, timeZone)}>
                  {formatRecentInBranchZone(a.createdAt, timeZone)}
                </time>
                {a.branchCode ? <span className="muted"> · {a.branchCode}</span> : null}
              </p>
              {a.body ? <p className="timeline__text">{a.body}</p> : null}
            </div>
          </li>
        );
      })}
    </ol>
  );
}
