import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { InputTextarea } from 'primereact/inputtextarea';
import type { DayNoteInput } from '@loambook/common';
import { FormField } from '@/components/form-field';
import type { FieldErrors } from '@/lib/form-errors';
import { DECIMAL } from '../job-format';

type Field = 'workDate' | 'crewSize' | 'labourHours' | 'note';

/** The day's note: what was done, who was there, the crew's hours (the labour actual). */
export function DayNoteForm({
  today,
  onSubmit,
}: {
  today: string;
  onSubmit: (note: Omit<DayNoteInput, 'clientRowId'>) => Promise<void>;
}) {
  const [workDate, setWorkDate] = useState(today);
  const [crewSize, setCrewSize] = useState('');
  const [hours, setHours] = useState('');
  const [note, setNote] = useState('');
  const [submitted, setSubmitted] = useState(false);
  const [saving, setSaving] = useState(false);

  const errors: FieldErrors<Field> = {};
  if (!/^\d{4}-\d{2}-\d{2}$/.test(workDate)) errors.workDate = 'Choose the day.';
  else if (workDate > today) errors.workDate = 'A day note is for today or a day already worked.';
  if (crewSize.trim() && (!/^\d{1,2}$/.test(crewSize.trim()) || Number(crewSize) < 1))
    errors.crewSize = 'How many people, from 1 to 50.';
  if (!hours.trim()) errors.labourHours = 'Enter the crew’s hours for the day (all people together).';
  else if (!DECIMAL.test(hours.trim()) || Number(hours) > 1000)
    errors.labourHours = 'A number of hours, e.g. 24 or 7.5.';
  const errorFor = (f: Field) => (submitted ? errors[f] : undefined);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    if (Object.values(errors).some(Boolean)) return;
    setSaving(true);
    try {
      await onSubmit({
        workDate,
        crewSize: crewSize.trim() ? Number(crewSize) : null,
        labourHours: hours.trim(),
        note: note.trim() || null,
      });
      setSubmitted(false);
      setHours('');
      setNote('');
    } finally {
      setSaving(false);
    }
  };

  return (
    <form className="entry-form" onSubmit={submit} noValidate aria-label="Day note">
      <div className="entry-form__row">
        <FormField id="note-date" label="Day" error={errorFor('workDate')} required>
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              type="date"
              value={workDate}
              max={today}
              onChange={(e) => setWorkDate(e.target.value)}
              invalid={invalid}
              className="w-full field-input"
            />
          )}
        </FormField>
        <FormField id="note-crew" label="People on site" error={errorFor('crewSize')}>
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              value={crewSize}
              inputMode="numeric"
              onChange={(e) => setCrewSize(e.target.value)}
              invalid={invalid}
              className="w-full field-input"
            />
          )}
        </FormField>
      </div>
      <FormField
        id="note-hours"
        label="Labour hours"
        error={errorFor('labourHours')}
        required
        hint="Everyone’s hours added up: 3 people for 8 hours is 24."
      >
        {({ invalid, ...control }) => (
          <span className="unit-input">
            <InputText
              {...control}
              value={hours}
              inputMode="decimal"
              onChange={(e) => setHours(e.target.value)}
              invalid={invalid}
              className="w-full field-input"
            />
            <span className="unit-input__unit" aria-hidden="true">
              h
            </span>
          </span>
        )}
      </FormField>
      <FormField id="note-text" label="What happened today" error={errorFor('note')}>
        {({ invalid, ...control }) => (
          <InputTextarea
            {...control}
            value={note}
            rows={3}
            maxLength={4000}
            onChange={(e) => setNote(e.target.value)}
            invalid={invalid}
            className="w-full field-input"
          />
        )}
      </FormField>
      <Button
        type="submit"
        label="Save day note"
        icon="pi pi-check"
        size="large"
        className="w-full field-save"
        loading={saving}
      />
    </form>
  );
}
