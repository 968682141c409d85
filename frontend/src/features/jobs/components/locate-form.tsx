import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import { CAUTION_CALL_811, type JobDetail } from '@loambook/common';
import { FormField, type ControlProps } from '@/components/form-field';
import { useNotify } from '@/components/notify';
import { serverFormErrors, type FieldErrors } from '@/lib/form-errors';
import { useSaveLocate } from '../api/save-locate';
import { formatDayLong } from '../job-format';
import { RefusalMessage } from './refusal-message';

type Field = 'ticketNumber' | 'filedOn' | 'expiresOn';
const DATE = /^\d{4}-\d{2}-\d{2}$/;

/** The 811 locate ticket: what was filed, and the earliest dig date the state pack gives for it. */
export function LocateSection({ job }: { job: JobDetail }) {
  const l = job.locate;
  const [editing, setEditing] = useState(false);
  return (
    <section className="job-section" aria-labelledby="locate-title">
      <div className="job-section__head">
        <h2 id="locate-title" className="job-section__title">
          <i className="pi pi-map" aria-hidden="true" /> 811 locate ticket
        </h2>
        {job.can.editPermits && !editing ? (
          <Button
            type="button"
            label={l.ticketNumber ? 'Replace ticket' : 'Enter ticket'}
            icon="pi pi-pencil"
            text
            size="small"
            onClick={() => setEditing(true)}
          />
        ) : null}
      </div>
      {l.earliestDigOn ? (
        <p className="dig-date" data-testid="earliest-dig">
          <span className="dig-date__label">Earliest dig date</span>
          <span className="dig-date__value">{formatDayLong(l.earliestDigOn)}</span>
        </p>
      ) : null}
      {editing ? (
        <LocateForm job={job} onDone={() => setEditing(false)} />
      ) : (
        <dl className="fact-list">
          <div>
            <dt>Ticket</dt>
            <dd>{l.ticketNumber ?? 'None on file'}</dd>
          </div>
          <div>
            <dt>Filed</dt>
            <dd>{formatDayLong(l.filedOn)}</dd>
          </div>
          <div>
            <dt>Expires</dt>
            <dd>{formatDayLong(l.expiresOn)}</dd>
          </div>
        </dl>
      )}
      <Message severity="warn" className="w-full" text={CAUTION_CALL_811} />
    </section>
  );
}

function LocateForm({ job, onDone }: { job: JobDetail; onDone: () => void }) {
  const save = useSaveLocate();
  const notify = useNotify();
  const [values, setValues] = useState<Record<Field, string>>({
    ticketNumber: job.locate.ticketNumber ?? '',
    filedOn: job.locate.filedOn ?? '',
    expiresOn: '',
  });
  const [submitted, setSubmitted] = useState(false);
  const [serverFields, setServerFields] = useState<FieldErrors<Field>>({});
  const [formError, setFormError] = useState<unknown>(null);

  const errors: FieldErrors<Field> = {};
  if (!values.ticketNumber.trim()) errors.ticketNumber = 'Enter the ticket number 811 gave you.';
  if (!DATE.test(values.filedOn)) errors.filedOn = 'Enter the day the ticket was filed.';
  if (values.expiresOn && !DATE.test(values.expiresOn)) errors.expiresOn = 'A date, or leave it empty.';
  const errorFor = (f: Field) => serverFields[f] ?? (submitted ? errors[f] : undefined);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setFormError(null);
    if (Object.values(errors).some(Boolean)) return;
    try {
      const saved = await save.mutateAsync({
        id: job.id,
        input: {
          ticketNumber: values.ticketNumber.trim(),
          filedOn: values.filedOn,
          expiresOn: values.expiresOn || null,
        },
      });
      notify.success(
        'Ticket saved',
        saved.locate.earliestDigOn
          ? `Earliest dig date: ${formatDayLong(saved.locate.earliestDigOn)}.`
          : undefined,
      );
      onDone();
    } catch (error) {
      const mapped = serverFormErrors(error, ['ticketNumber', 'filedOn', 'expiresOn'] as const);
      setServerFields(mapped.fields);
      setFormError(mapped.form ? error : null);
    }
  };

  const input =
    (f: Field, type: 'date' | 'text') =>
    ({ invalid, ...control }: ControlProps) => (
      <InputText
        {...control}
        type={type}
        value={values[f]}
        maxLength={type === 'text' ? 60 : undefined}
        onChange={(e) => {
          setValues((v) => ({ ...v, [f]: e.target.value }));
          setServerFields((s) => ({ ...s, [f]: undefined }));
        }}
        invalid={invalid}
        className="w-full"
      />
    );

  return (
    <form className="job-form" onSubmit={submit} noValidate aria-label="811 ticket">
      {formError ? <RefusalMessage error={formError} /> : null}
      <div className="form-grid form-grid--pair">
        <FormField id="locate-ticket" label="Ticket number" error={errorFor('ticketNumber')} required>
          {input('ticketNumber', 'text')}
        </FormField>
        <FormField id="locate-filed" label="Filed on" error={errorFor('filedOn')} required>
          {input('filedOn', 'date')}
        </FormField>
      </div>
      <FormField
        id="locate-expires"
        label="Expires on"
        error={errorFor('expiresOn')}
        hint="Leave empty to use the state’s rule; enter the date on the ticket if it says otherwise."
      >
        {input('expiresOn', 'date')}
      </FormField>
      <p className="muted">
        The earliest dig date is worked out from the filing day by the state’s one-call rule.
      </p>
      <div className="form-actions">
        <Button type="button" label="Cancel" text onClick={onDone} />
        <Button type="submit" label="Save ticket" icon="pi pi-check" loading={save.isPending} />
      </div>
    </form>
  );
}
