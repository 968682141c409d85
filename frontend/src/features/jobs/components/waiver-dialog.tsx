import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Checkbox } from 'primereact/checkbox';
import { Dialog } from 'primereact/dialog';
import { InputTextarea } from 'primereact/inputtextarea';
import type { JobDetail } from '@loambook/common';
import { FormField } from '@/components/form-field';
import { serverFormErrors } from '@/lib/form-errors';
import { useWaiveWindow } from '../api/waive-window';
import { formatDayLong } from '../job-format';
import { RefusalMessage } from './refusal-message';

const MIN_NOTE = 20;

/**
 * Recording the homeowner's emergency waiver of the 3-day right to cancel. The rule's default is to wait;
 * the dialog says when a waiver is allowed and asks for the homeowner's own statement, then a confirmation.
 */
export function WaiverDialog({
  job,
  visible,
  onClose,
  onDone,
}: {
  job: JobDetail;
  visible: boolean;
  onClose: () => void;
  onDone: (job: JobDetail) => void;
}) {
  return (
    <Dialog
      visible={visible}
      onHide={onClose}
      header="Emergency waiver of the right to cancel"
      className="app-dialog"
      style={{ width: '40rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      {visible ? <WaiverForm job={job} onClose={onClose} onDone={onDone} /> : null}
    </Dialog>
  );
}

function WaiverForm({
  job,
  onClose,
  onDone,
}: {
  job: JobDetail;
  onClose: () => void;
  onDone: (j: JobDetail) => void;
}) {
  const waive = useWaiveWindow();
  const [note, setNote] = useState('');
  const [hasStatement, setHasStatement] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const [submitted, setSubmitted] = useState(false);
  const [serverNote, setServerNote] = useState<string | null>(null);
  const [error, setError] = useState<unknown>(null);

  const noteError =
    serverNote ??
    (submitted && note.trim().length < MIN_NOTE
      ? `Copy the homeowner’s statement, at least ${MIN_NOTE} characters: what the emergency is, in their words.`
      : null);
  const statementError =
    submitted && !hasStatement ? 'The homeowner’s own signed and dated statement is required.' : null;

  const review = (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    if (note.trim().length < MIN_NOTE || !hasStatement) return;
    setConfirming(true);
  };

  const record = async () => {
    setError(null);
    try {
      onDone(await waive.mutateAsync({ id: job.id, input: { note: note.trim() } }));
    } catch (e) {
      const mapped = serverFormErrors(e, ['note'] as const);
      setServerNote(mapped.fields.note ?? null);
      setError(mapped.form ? e : null);
      setConfirming(false);
    }
  };

  return (
    <form className="dialog-form waiver" onSubmit={review} noValidate aria-label="Emergency waiver">
      <div className="waiver__rule">
        <p>
          <strong>The default is to wait.</strong> {job.homeownerName} may cancel until midnight at the end of{' '}
          {formatDayLong(job.lastDayToCancel)}; the job can start the day after.
        </p>
        <p>
          Under the FTC’s cooling-off rule (16 CFR 429.1(e)), the homeowner may give up that right only when
          the work is needed for a <strong>bona fide immediate personal emergency</strong>, and only with a{' '}
          <strong>separate statement written, dated and signed by the homeowner</strong> in their own words,
          describing the emergency and saying that they give up the right to cancel. A printed or pre-written
          form does not count, and the office must not suggest it.
        </p>
      </div>
      {error ? <RefusalMessage error={error} /> : null}
      <FormField
        id="waiver-note"
        label="The homeowner’s statement, as they wrote it"
        error={noteError}
        required
        hint="Copy it word for word; keep the signed paper with the contract."
      >
        {({ invalid, ...control }) => (
          <InputTextarea
            {...control}
            value={note}
            rows={5}
            maxLength={2000}
            onChange={(e) => {
              setNote(e.target.value);
              setServerNote(null);
              setConfirming(false);
            }}
            invalid={invalid}
            className="w-full"
          />
        )}
      </FormField>
      <div className="checkbox-row">
        <Checkbox
          inputId="waiver-statement"
          checked={hasStatement}
          onChange={(e) => {
            setHasStatement(!!e.checked);
            setConfirming(false);
          }}
          invalid={!!statementError}
          aria-describedby={statementError ? 'waiver-statement-error' : undefined}
        />
        <label htmlFor="waiver-statement">
          I have the homeowner’s separate statement, in their own handwriting, dated and signed, describing
          the emergency.
        </label>
      </div>
      {statementError ? (
        <small id="waiver-statement-error" className="form-field__error">
          <i className="pi pi-exclamation-circle" aria-hidden="true" /> {statementError}
        </small>
      ) : null}
      {confirming ? (
        <div className="confirm-box" role="alertdialog" aria-labelledby="waiver-confirm-title">
          <p id="waiver-confirm-title" className="strong">
            Record the waiver? The job may then start before {formatDayLong(job.lastDayToCancel)} ends.
          </p>
          <p className="muted">
            It is kept on the job with your name and the time, and cannot be taken back.
          </p>
          <div className="dialog-actions">
            <Button type="button" label="Go back" text onClick={() => setConfirming(false)} />
            <Button
              type="button"
              label="Yes, record the waiver"
              severity="danger"
              loading={waive.isPending}
              onClick={() => void record()}
            />
          </div>
        </div>
      ) : (
        <div className="dialog-actions">
          <Button type="button" label="Wait for the window to close" icon="pi pi-clock" onClick={onClose} />
          <Button type="submit" label="Review waiver" severity="secondary" outlined />
        </div>
      )}
    </form>
  );
}
