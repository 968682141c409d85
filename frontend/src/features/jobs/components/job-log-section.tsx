import { ApiErrorMessage } from '@/components/api-error-message';
import { TableSkeleton } from '@/components/loading';
import { useInstallLog } from '../api/get-install-log';
import { LogList } from '../field/log-list';
import { mergeNotes, mergeRows, runningTotals } from '../field/log-rows';
import { formatDay, formatPersonHours, formatQty } from '../job-format';
import { JobPhotos } from './job-photos';

/** The crew's log as the office reads it: totals, every row, the day notes, the photos. */
export function JobLogSection({ jobId }: { jobId: string }) {
  const log = useInstallLog(jobId);
  if (log.isPending) return <TableSkeleton rows={3} label="Loading the install log" />;
  if (log.isError) return <ApiErrorMessage error={log.error} />;
  const rows = mergeRows(log.data, []);
  const notes = mergeNotes(log.data, []);
  const t = runningTotals(rows, notes);
  return (
    <section className="job-section" aria-labelledby="job-log-title">
      <h2 id="job-log-title" className="job-section__title">
        <i className="pi pi-book" aria-hidden="true" /> Install log{' '}
        <span className="count-pill">{rows.length}</span>
      </h2>
      <p className="muted">
        {t.injectionPoints} injection points, {formatQty(t.pounds)} lb · {t.pushPiers} push piers ·{' '}
        {t.helicalPiles} helical piles{t.flagged ? ` (${t.flagged} below design load)` : ''} ·{' '}
        {formatPersonHours(t.labourHours)} of labour
      </p>
      <details className="job-log__rows">
        <summary>Every row</summary>
        <LogList rows={rows} />
      </details>
      {notes.length ? (
        <ul className="note-list">
          {notes.map((n) => (
            <li key={n.clientRowId} className="note-list__item">
              <span className="strong">{formatDay(n.workDate)}</span> · {formatPersonHours(n.labourHours)}
              {n.crewSize ? ` · ${n.crewSize} ${n.crewSize === 1 ? 'person' : 'people'}` : ''}
              {n.writtenByName ? <span className="muted"> · {n.writtenByName}</span> : null}
              {n.note ? <p className="log-row__note">{n.note}</p> : null}
            </li>
          ))}
        </ul>
      ) : null}
      <h3 className="job-log__photos-title">Photos</h3>
      <JobPhotos photos={log.data.photos} />
    </section>
  );
}
