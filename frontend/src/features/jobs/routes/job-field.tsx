import '../jobs.css';
import { useMemo, useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router';
import { Button } from 'primereact/button';
import { Message } from 'primereact/message';
import { SelectButton } from 'primereact/selectbutton';
import { money, type InstallKind, type JobDetail } from '@loambook/common';
import { paths } from '@/app/paths';
import { NotFound } from '@/app/routes/not-found';
import { ApiErrorMessage } from '@/components/api-error-message';
import { PageLoading } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { isApiError } from '@/lib/api-client';
import { useJob } from '../api/get-job';
import { useInstallLog } from '../api/get-install-log';
import { JobStatusTag } from '../components/job-badges';
import { JobCautions } from '../components/job-cautions';
import { JobPhotos } from '../components/job-photos';
import { StartBlockers, StartJobButton } from '../components/start-panel';
import { SurveyComparisonSection } from '../components/survey-comparison-view';
import { DayNoteForm } from '../field/day-note-form';
import { EntryForm, type EntrySubmit } from '../field/entry-form';
import { LogList } from '../field/log-list';
import { mergeNotes, mergeRows, nextNumber, runningTotals, type LogRow } from '../field/log-rows';
import { OthersWaitingNote, OutboxBanner, othersWaitingText } from '../field/outbox-banner';
import { defaultShaft } from '../field/shaft-default';
import { useFieldQueue } from '../offline/field-queue';
import { queuedBase } from '../offline/row-queue';
import {
  dialable,
  formatDay,
  formatPersonHours,
  formatQty,
  formatRun,
  KIND_LABELS,
  mapsHref,
  todayFor,
} from '../job-format';

export default function JobFieldRoute() {
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
  return <FieldPage key={job.data.id} job={job.data} />;
}

function kindsOf(job: JobDetail): InstallKind[] {
  const has = (v: string) => {
    try {
      return !money(v || '0').isZero();
    } catch {
      return false;
    }
  };
  const kinds: InstallKind[] = [];
  if (has(job.planned.injectionPoints) || has(job.planned.materialLb)) kinds.push('injection');
  if (has(job.planned.pushPiers)) kinds.push('push_pier');
  if (has(job.planned.helicalPiles)) kinds.push('helical_pile');
  return kinds.length ? kinds : ['injection', 'push_pier', 'helical_pile'];
}

/** The crew lead's phone screen for one job: start it, log each point or pier, the day's note. */
function FieldPage({ job }: { job: JobDetail }) {
  const navigate = useNavigate();
  const notify = useNotify();
  const started = job.status === 'in_progress' || job.status === 'completed';
  const log = useInstallLog(job.id, { enabled: started });
  const outbox = useFieldQueue(job.id);
  const kinds = kindsOf(job);
  const [kind, setKind] = useState<InstallKind>(kinds[0]!);
  const [retrying, setRetrying] = useState(false);
  const today = todayFor(job.timezone);

  const rows = useMemo(() => mergeRows(log.data, outbox.rows), [log.data, outbox.rows]);
  const notes = useMemo(() => mergeNotes(log.data, outbox.rows), [log.data, outbox.rows]);
  const totals = runningTotals(rows, notes);
  // Numbers and the shaft also count the rows another crew lead left on this phone for this job (they are
  // sent when that person signs in again): no number twice, the same piles.
  const allRows = useMemo(
    () => (outbox.othersRows.length ? mergeRows(log.data, [...outbox.rows, ...outbox.othersRows]) : rows),
    [log.data, outbox.rows, outbox.othersRows, rows],
  );
  const used = useMemo(
    () => new Set(allRows.filter((r) => r.kind === kind).map((r) => r.number)),
    [allRows, kind],
  );
  const shaft = useMemo(() => defaultShaft(allRows, job.plan), [allRows, job.plan]);

  const keepFailed = (error: unknown) =>
    notify.error(
      'Not kept on this phone',
      error instanceof Error
        ? `${error.message} Write it on the paper sheet.`
        : 'Write it on the paper sheet.',
    );

  const saveEntry = async ({ body, photo }: EntrySubmit) => {
    const base = queuedBase(job.id, outbox.user);
    try {
      await outbox.add({
        ...base,
        type: 'entry',
        body: { ...body, clientRowId: base.clientRowId, loggedAt: new Date().toISOString() },
      });
      if (photo) {
        await outbox.add({
          ...queuedBase(job.id, outbox.user),
          type: 'photo',
          file: photo,
          fileName: photo.name || `${body.kind}-${body.number}.jpg`,
          caption: `${KIND_LABELS[body.kind]} ${body.number}`,
          entryClientRowId: base.clientRowId,
          installEntryId: null,
        });
      }
    } catch (error) {
      keepFailed(error);
      throw error;
    }
  };

  const addPhoto = async (row: LogRow, file: File) => {
    try {
      await outbox.add({
        ...queuedBase(job.id, outbox.user),
        type: 'photo',
        file,
        fileName: file.name || `${row.kind}-${row.number}.jpg`,
        caption: `${KIND_LABELS[row.kind]} ${row.number}`,
        entryClientRowId: null,
        installEntryId: row.id,
      });
    } catch (error) {
      keepFailed(error);
    }
  };

  const retry = async () => {
    setRetrying(true);
    try {
      const r = await outbox.retry();
      if (r.offline)
        notify.info('Still no signal', 'The rows stay on this phone and go when the signal is back.');
    } finally {
      setRetrying(false);
    }
  };

  const address = `${job.addressLine1}, ${job.city}, ${job.state} ${job.postalCode}`;
  const canLog = job.can.log && job.status === 'in_progress';

  return (
    <div className="page field-page">
      <Link to={paths.today.href()} className="back-link">
        <i className="pi pi-arrow-left" aria-hidden="true" /> Today
      </Link>
      <header className="field-header">
        <p className="field-header__number">
          {job.number} · {formatRun(job.startOn, job.durationDays)}
        </p>
        <h1 className="field-header__name">{job.homeownerName}</h1>
        <p className="field-header__address">
          <a href={mapsHref(address)} target="_blank" rel="noreferrer">
            <i className="pi pi-map-marker" aria-hidden="true" /> {address}
          </a>
        </p>
        <div className="field-header__row">
          <JobStatusTag status={job.status} />
          {job.phonePrimary ? (
            <a className="field-call" href={`tel:${dialable(job.phonePrimary)}`}>
              <i className="pi pi-phone" aria-hidden="true" /> Call homeowner
            </a>
          ) : null}
          <Link className="field-call" to={paths.jobSheet.href(job.id)}>
            <i className="pi pi-print" aria-hidden="true" /> Job sheet
          </Link>
        </div>
      </header>

      {job.status === 'scheduled' ? (
        <section className="field-card">
          <StartBlockers job={job} />
          <StartJobButton
            job={job}
            large
            onStarted={(j) => notify.success(`${j.number} started`, 'Log each point or pier as you go.')}
          />
        </section>
      ) : null}

      <details className="field-card field-cautions" open={job.status === 'scheduled'}>
        <summary>
          <i className="pi pi-exclamation-triangle" aria-hidden="true" /> Safety on this job
        </summary>
        <JobCautions cautions={job.cautions} compact />
      </details>

      {started || outbox.rows.length ? (
        <OutboxBanner
          rows={outbox.rows}
          offline={outbox.offline}
          durable={outbox.durable}
          onRetry={() => void retry()}
          retrying={retrying}
        />
      ) : null}
      <OthersWaitingNote others={outbox.others} />

      {started ? (
        <dl className="field-totals" aria-label="Running totals">
          {kinds.includes('injection') ? (
            <>
              <div>
                <dt>Points</dt>
                <dd data-testid="total-points">
                  {totals.injectionPoints}
                  <span className="muted"> / {formatQty(job.planned.injectionPoints)}</span>
                </dd>
              </div>
              <div>
                <dt>Material</dt>
                <dd>
                  {formatQty(totals.pounds)} lb
                  <span className="muted"> / {formatQty(job.planned.materialLb)}</span>
                </dd>
              </div>
            </>
          ) : null}
          {kinds.includes('push_pier') ? (
            <div>
              <dt>Push piers</dt>
              <dd>
                {totals.pushPiers}
                <span className="muted"> / {formatQty(job.planned.pushPiers)}</span>
              </dd>
            </div>
          ) : null}
          {kinds.includes('helical_pile') ? (
            <div>
              <dt>Helical piles</dt>
              <dd>
                {totals.helicalPiles}
                <span className="muted"> / {formatQty(job.planned.helicalPiles)}</span>
              </dd>
            </div>
          ) : null}
          <div>
            <dt>Labour</dt>
            <dd>{formatQty(totals.labourHours)} person-h</dd>
          </div>
          {totals.flagged ? (
            <div className="field-totals__flag">
              <dt>Below design load</dt>
              <dd>{totals.flagged}</dd>
            </div>
          ) : null}
        </dl>
      ) : null}

      {canLog ? (
        <section className="field-card" aria-labelledby="log-form-title">
          <h2 id="log-form-title" className="job-section__title">
            Log {kinds.length === 1 ? KIND_LABELS[kind].toLowerCase() : 'a row'}
          </h2>
          {kinds.length > 1 ? (
            <SelectButton
              value={kind}
              options={kinds.map((k) => ({ value: k, label: KIND_LABELS[k] }))}
              onChange={(e) => e.value && setKind(e.value as InstallKind)}
              aria-label="What you are logging"
              allowEmpty={false}
              className="kind-switch"
            />
          ) : null}
          <EntryForm
            key={kind}
            kind={kind}
            nextNumber={nextNumber(allRows, kind)}
            usedNumbers={used}
            defaultShaft={shaft}
            onSubmit={saveEntry}
          />
        </section>
      ) : job.status === 'completed' ? (
        <>
          <Message
            severity="success"
            className="w-full"
            text="This job is completed. The log below is the record."
          />
          <section className="field-card">
            <SurveyComparisonSection jobId={job.id} />
          </section>
        </>
      ) : job.status === 'scheduled' ? (
        <p className="muted field-hint">Start the job to log points and piers.</p>
      ) : null}

      {started ? (
        <section className="field-card" aria-labelledby="log-title">
          <h2 id="log-title" className="job-section__title">
            The log <span className="count-pill">{rows.length}</span>
          </h2>
          {log.isError ? <ApiErrorMessage error={log.error} /> : null}
          <LogList
            rows={rows}
            onAddPhoto={canLog ? (r, f) => void addPhoto(r, f) : undefined}
            onDiscard={(r) => void outbox.discard(r.clientRowId)}
          />
          {log.data?.photos.length ? (
            <>
              <h3 className="job-log__photos-title">Photos sent</h3>
              <JobPhotos photos={log.data.photos} />
            </>
          ) : null}
        </section>
      ) : null}

      {canLog ? (
        <section className="field-card" aria-labelledby="day-note-title">
          <h2 id="day-note-title" className="job-section__title">
            Day note and hours
          </h2>
          <DayNoteForm
            today={today}
            onSubmit={async (n) => {
              const base = queuedBase(job.id, outbox.user);
              try {
                await outbox.add({ ...base, type: 'dayNote', body: { ...n, clientRowId: base.clientRowId } });
              } catch (error) {
                keepFailed(error);
                throw error;
              }
            }}
          />
          {notes.length ? (
            <ul className="note-list">
              {notes.map((n) => (
                <li key={n.clientRowId} className="note-list__item">
                  <span className="strong">{formatDay(n.workDate)}</span> · {formatPersonHours(n.labourHours)}
                  {n.crewSize ? ` · ${n.crewSize} ${n.crewSize === 1 ? 'person' : 'people'}` : ''}
                  {n.state !== 'stored' ? (
                    <span className="log-row__state log-row__state--waiting">
                      {' '}
                      · {n.state === 'waiting' ? 'Waiting to send' : 'Not accepted'}
                    </span>
                  ) : null}
                  {n.note ? <p className="log-row__note">{n.note}</p> : null}
                </li>
              ))}
            </ul>
          ) : null}
        </section>
      ) : null}

      {job.can.complete && job.status === 'in_progress' ? (
        <section className="field-card">
          <h2 className="job-section__title">Finished on site?</h2>
          <p className="muted">
            Walk the job with the homeowner: the final checklist, a new floor survey and their signature.
            {outbox.rows.length ? ' Send every waiting row first.' : ''}
          </p>
          {outbox.others.length ? (
            <p className="muted">
              {outbox.others.map((o) => `${othersWaitingText(o)}.`).join(' ')} Completing now leaves them out
              of the record: the log takes no rows once the job is completed.
            </p>
          ) : null}
          <Button
            type="button"
            label="Complete the job"
            icon="pi pi-flag"
            size="large"
            className="w-full"
            disabled={outbox.rows.length > 0}
            onClick={() => void navigate(paths.jobComplete.href(job.id))}
          />
        </section>
      ) : null}
    </div>
  );
}
