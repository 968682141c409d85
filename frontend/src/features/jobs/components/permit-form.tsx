import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { SelectButton } from 'primereact/selectbutton';
import type { JobDetail } from '@loambook/common';
import { FormField } from '@/components/form-field';
import { useNotify } from '@/components/notify';
import { serverFormErrors, type FieldErrors } from '@/lib/form-errors';
import { useSavePermit } from '../api/save-permit';
import { formatDayLong } from '../job-format';
import { RefusalMessage } from './refusal-message';

type Field = 'appliedOn' | 'number' | 'issuedOn' | 'inspectionPassedOn';
const NEEDED = [
  { label: 'Needed', value: 'yes' },
  { label: 'Not needed', value: 'no' },
  { label: 'Not decided', value: 'unknown' },
];
const DATE = /^\d{4}-\d{2}-\d{2}$/;

function Facts({ job }: { job: JobDetail }) {
  const p = job.permit;
  return (
    <dl className="fact-list">
      <div>
        <dt>Permit</dt>
        <dd>{p.needed === null ? 'Not decided yet' : p.needed ? 'Needed' : 'Not needed'}</dd>
      </div>
      {p.needed ? (
        <>
          <div>
            <dt>Applied</dt>
            <dd>{formatDayLong(p.appliedOn, 'Not yet')}</dd>
          </div>
          <div>
            <dt>Number</dt>
            <dd>{p.number ?? '—'}</dd>
          </div>
          <div>
            <dt>Issued</dt>
            <dd>{formatDayLong(p.issuedOn, 'Not yet')}</dd>
          </div>
          <div>
            <dt>Inspection passed</dt>
            <dd>{formatDayLong(p.inspectionPassedOn, 'Not yet')}</dd>
          </div>
        </>
      ) : null}
    </dl>
  );
}

/** The building permit: needed or not, and its dates. Read only without the right to change it. */
export function PermitSection({ job }: { job: JobDetail }) {
  const [editing, setEditing] = useState(false);
  return (
    <section className="job-section" aria-labelledby="permit-title">
      <div className="job-section__head">
        <h2 id="permit-title" className="job-section__title">
          <i className="pi pi-file-check" aria-hidden="true" /> Permit
        </h2>
        {job.can.editPermits && !editing ? (
          <Button
            type="button"
            label="Edit permit"
            icon="pi pi-pencil"
            text
            size="small"
            onClick={() => setEditing(true)}
          />
        ) : null}
      </div>
      {editing ? <PermitForm job={job} onDone={() => setEditing(false)} /> : <Facts job={job} />}
    </section>
  );
}

function PermitForm({ job, onDone }: { job: JobDetail; onDone: () => void }) {
  const save = useSavePermit();
  const notify = useNotify();
  const p = job.permit;
  const [needed, setNeeded] = useState(p.needed === null ? 'unknown' : p.needed ? 'yes' : 'no');
  const [values, setValues] = useState<Record<Field, string>>({
    appliedOn: p.appliedOn ?? '',
    number: p.number ?? '',
    issuedOn: p.issuedOn ?? '',
    inspectionPassedOn: p.inspectionPassedOn ?? '',
  });
  const [serverFields, setServerFields] = useState<FieldErrors<Field>>({});
  const [formError, setFormError] = useState<unknown>(null);

  const errors: FieldErrors<Field> = {};
  for (const f of ['appliedOn', 'issuedOn', 'inspectionPassedOn'] as const) {
    if (values[f] && !DATE.test(values[f])) errors[f] = 'A date, or leave it empty.';
  }
  if (values.issuedOn && values.appliedOn && values.issuedOn < values.appliedOn)
    errors.issuedOn = 'A permit is issued on or after the day it was applied for.';
  if (values.issuedOn && !values.number.trim())
    errors.number = 'Enter the permit number from the building department.';
  const errorFor = (f: Field) => serverFields[f] ?? errors[f];

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setFormError(null);
    if (Object.values(errors).some(Boolean)) return;
    const isNeeded = needed === 'unknown' ? null : needed === 'yes';
    try {
      await save.mutateAsync({
        id: job.id,
        input: isNeeded
          ? {
              needed: true,
              appliedOn: values.appliedOn || null,
              number: values.number.trim() || null,
              issuedOn: values.issuedOn || null,
              inspectionPassedOn: values.inspectionPassedOn || null,
            }
          : { needed: isNeeded },
      });
      notify.success('Permit saved');
      onDone();
    } catch (error) {
      const mapped = serverFormErrors(error, [
        'appliedOn',
        'number',
        'issuedOn',
        'inspectionPassedOn',
      ] as const);
      setServerFields(mapped.fields);
      setFormError(mapped.form ? error : null);
    }
  };

  const field = (f: Field, label: string, type: 'date' | 'text') => (
    <FormField id={`permit-${f}`} label={label} error={errorFor(f)}>
      {({ invalid, ...control }) => (
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
      )}
    </FormField>
  );

  return (
    <form className="job-form" onSubmit={submit} noValidate aria-label="Permit">
      {formError ? <RefusalMessage error={formError} /> : null}
      <div className="form-field">
        <span className="form-field__label" id="permit-needed-label">
          Does the building department require a permit?
        </span>
        <SelectButton
          value={needed}
          options={NEEDED}
          onChange={(e) => e.value && setNeeded(e.value as string)}
          aria-labelledby="permit-needed-label"
          allowEmpty={false}
        />
      </div>
      {needed === 'yes' ? (
        <div className="form-grid form-grid--pair">
          {field('appliedOn', 'Applied on', 'date')}
          {field('number', 'Permit number', 'text')}
          {field('issuedOn', 'Issued on', 'date')}
          {field('inspectionPassedOn', 'Inspection passed on', 'date')}
        </div>
      ) : null}
      <div className="form-actions">
        <Button type="button" label="Cancel" text onClick={onDone} />
        <Button type="submit" label="Save permit" icon="pi pi-check" loading={save.isPending} />
      </div>
    </form>
  );
}
