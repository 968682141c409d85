import { Tag } from 'primereact/tag';
import type { JobClock } from '@loambook/common';
import { CLOCK_STATE_LABELS, CLOCK_STATE_SEVERITY, formatDayLong } from '../job-format';

function left(c: JobClock): string {
  if (c.state === 'met') return c.doneOn ? `Done ${formatDayLong(c.doneOn)}` : 'Done';
  if (c.daysLeft === null) return c.state === 'not_started' ? 'Starts when the earlier step is done' : '';
  if (c.daysLeft < 0) return `${-c.daysLeft} ${c.daysLeft === -1 ? 'day' : 'days'} late`;
  if (c.daysLeft === 0) return 'Due today';
  return `${c.daysLeft} ${c.daysLeft === 1 ? 'day' : 'days'} left`;
}

/** The state pack's and the locate ticket's due dates, with a warning 7 days ahead and after they pass. */
export function ClocksPanel({ clocks }: { clocks: JobClock[] }) {
  return (
    <section className="clocks" aria-labelledby="clocks-title">
      <h2 id="clocks-title" className="job-section__title">
        <i className="pi pi-stopwatch" aria-hidden="true" /> Due dates
      </h2>
      {clocks.length === 0 ? (
        <p className="muted">No clock applies to this job yet.</p>
      ) : (
        <ul className="clocks__list">
          {clocks.map((c) => (
            <li key={c.code} className={`clocks__item clocks__item--${c.state}`}>
              <div className="clocks__head">
                <span className="strong">{c.title}</span>
                <Tag value={CLOCK_STATE_LABELS[c.state]} severity={CLOCK_STATE_SEVERITY[c.state]} />
              </div>
              <p className="clocks__due">
                {c.dueOn ? <>By {formatDayLong(c.dueOn)}</> : c.state === 'met' ? null : 'No due date yet'}
                <span className="muted">
                  {(c.dueOn || c.state !== 'met') && left(c) ? ' · ' : ''}
                  {left(c)}
                </span>
              </p>
              <p className="clocks__source muted">{c.source}</p>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
