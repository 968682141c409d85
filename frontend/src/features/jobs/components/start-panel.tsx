import { useState } from 'react';
import { Button } from 'primereact/button';
import { Checkbox } from 'primereact/checkbox';
import type { JobDetail, StartBlocker } from '@loambook/common';
import { useStartJob } from '../api/start-job';
import { formatDayLong } from '../job-format';
import { REFUSAL_TITLES } from '../refusals';
import { RefusalMessage } from './refusal-message';

/** What clears each blocker, in the office's and the crew's terms. */
function fixFor(b: StartBlocker, job: JobDetail): string {
  switch (b.code) {
    case 'JOB.INSIDE_CANCELLATION_WINDOW':
      return `Wait for the homeowner’s right to cancel to end (midnight after ${formatDayLong(job.lastDayToCancel)}). Only a bona fide emergency, in the homeowner’s own signed and dated statement, allows an earlier start.`;
    case 'JOB.BEFORE_DIG_DATE':
      return `The utilities have until ${formatDayLong(job.locate.earliestDigOn)} to mark their lines. Do not dig or drive anything before then.`;
    case 'JOB.NO_LOCATE_TICKET':
      return 'Call 811 (or file online), then enter the ticket number and the day it was filed in the 811 ticket form.';
    case 'JOB.LOCATE_EXPIRED':
      return `Ticket ${job.locate.ticketNumber ?? ''} ran out on ${formatDayLong(job.locate.expiresOn)}. Ask 811 for a new ticket and enter it.`;
    case 'JOB.DEPOSIT_NOT_RECEIVED':
      return 'The office marks the deposit received when the money is in. Do not start on a promise.';
    default:
      return '';
  }
}

export function StartBlockers({
  job,
  onWaive,
}: {
  job: JobDetail;
  /** Offered beside the cancellation-window blocker, to those who may record a waiver. */
  onWaive?: () => void;
}) {
  if (job.status === 'completed' || job.status === 'cancelled' || job.status === 'in_progress') return null;
  if (job.startBlockers.length === 0) {
    return (
      <section className="start-blockers start-blockers--clear" aria-labelledby="start-blockers-title">
        <h2 id="start-blockers-title" className="job-section__title">
          <i className="pi pi-check-circle" aria-hidden="true" /> Ready to start
        </h2>
        <p className="muted">
          The right to cancel has ended{job.windowWaivedAt ? ' (waived for an emergency)' : ''}, the 811
          ticket is on file and the deposit is in{job.startOn ? ` for ${formatDayLong(job.startOn)}` : ''}.
        </p>
      </section>
    );
  }
  return (
    <section className="start-blockers" aria-labelledby="start-blockers-title">
      <h2 id="start-blockers-title" className="job-section__title">
        <i className="pi pi-ban" aria-hidden="true" /> Why this job cannot start yet
      </h2>
      <ul className="start-blockers__list">
        {job.startBlockers.map((b) => (
          <li key={b.code} className="start-blockers__item">
            <p className="strong">{REFUSAL_TITLES[b.code] ?? b.code}</p>
            <p>{b.message}</p>
            {fixFor(b, job) ? <p className="muted">{fixFor(b, job)}</p> : null}
            {b.code === 'JOB.INSIDE_CANCELLATION_WINDOW' && onWaive && !job.windowWaivedAt ? (
              <Button
                type="button"
                label="Record an emergency waiver…"
                size="small"
                severity="secondary"
                outlined
                onClick={onWaive}
              />
            ) : null}
          </li>
        ))}
      </ul>
    </section>
  );
}

/**
 * The Start button, with the crew's last check that the utilities are marked. Shown when the server says
 * the person may start this job (`can.start`: scheduled, and they are its crew lead or the branch office).
 */
export function StartJobButton({
  job,
  onStarted,
  large = false,
}: {
  job: JobDetail;
  onStarted: (j: JobDetail) => void;
  large?: boolean;
}) {
  const start = useStartJob();
  const [asking, setAsking] = useState(false);
  const [marked, setMarked] = useState(false);
  const [error, setError] = useState<unknown>(null);
  if (job.status !== 'scheduled' || !job.can.start) return null;

  const go = async () => {
    setError(null);
    try {
      onStarted(await start.mutateAsync(job.id));
      setAsking(false);
    } catch (e) {
      setError(e);
    }
  };

  return (
    <div className={large ? 'start-job start-job--large' : 'start-job'}>
      {error ? <RefusalMessage error={error} /> : null}
      {asking ? (
        <div className="confirm-box" role="group" aria-labelledby="start-confirm-title">
          <p id="start-confirm-title" className="strong">
            Start {job.number} now?
          </p>
          <div className="checkbox-row">
            <Checkbox inputId="start-marked" checked={marked} onChange={(e) => setMarked(!!e.checked)} />
            <label htmlFor="start-marked">
              The utilities’ marks are on the ground at this address, and the crew has the PPE the material’s
              safety data sheet requires.
            </label>
          </div>
          <div className="dialog-actions">
            <Button type="button" label="Not yet" text onClick={() => setAsking(false)} />
            <Button
              type="button"
              label="Yes, start the job"
              icon="pi pi-play"
              disabled={!marked}
              loading={start.isPending}
              onClick={() => void go()}
            />
          </div>
        </div>
      ) : (
        <Button
          type="button"
          label="Start job"
          icon="pi pi-play"
          size={large ? 'large' : undefined}
          className={large ? 'w-full' : undefined}
          onClick={() => {
            setMarked(false);
            setAsking(true);
          }}
        />
      )}
    </div>
  );
}
