import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { InputTextarea } from 'primereact/inputtextarea';
import { money, type DayNoteInput } from '@loambook/common';
import { FormField } from '@/components/form-field';
import type { FieldErrors } from '@/lib/form-errors';
import { DECIMAL, formatQty } from '../job-format';

type Field = 'workDate' | 'crewSize' | 'hoursOnSite' | 'labourHours' | 'note';

const PEOPLE = /^\d{1,2}$/;

/** People × hours on site, when both are filled in and sensible ('3' × '8' → '24'); null otherwise. */
export function personHours(crewSize: string, hoursOnSite: string): string | null {
  const people = crewSize.trim();
  const hours = hoursOnSite.trim();
  if (!PEOPLE.test(people) || Number(people) < 1 || Number(people) > 50) return null;
  if (!DECIMAL.test(hours) || money(hours).isZero() || money(hours).greaterThan(24)) return null;
  return money(people).times(money(hours)).toString();
}

/**
 * The day's note: what was done, who was there and the labour, the actual set against the plan's labour
 * lines. Labour is in person-hours, everyone's hours added up: the form multiplies the people on site by
 * the hours they were there, shows the total, and lets the crew lead correct it (someone left at noon).
 */
export function DayNoteForm({
  today,
  onSubmit,
}: {
  today: string;
  onSubmit: (note: Omit<DayNoteInput, 'clientRowId'>) => Promise<void>;
}) {
  const [workDate, setWorkDate] = useState(today);
  const [crewSize, setCrewSize] = useState('');
  const [hoursOnSite, setHoursOnSite] = useState('');
  /** The total as typed over the product; null while it follows people × hours. */
  const [typedTotal, setTypedTotal] = useState<string | null>(null);
  const [note, setNote] = useState('');
  const [submitted, setSubmitted] = useState(false);
  const [saving, setSaving] = useState(false);

  const errors: FieldErrors<Field> = {};
  if (!/^\d{4}-\d{2}-\d{2}$/.test(workDate)) errors.workDate = 'Choose the day.';
  else if (workDate > today) errors.workDate = 'A day note is for today or a day already worked.';
  if (crewSize.trim() && (!PEOPLE.test(crewSize.trim()) || Number(crewSize) < 1 || Number(crewSize) > 50))
    errors.crewSize = 'How many people, from 1 to 50.';
  if (hoursOnSite.trim() && (!DECIMAL.test(hoursOnSite.trim()) || money(hoursOnSite.trim()).greaterThan(24)))
    errors.hoursOnSite = 'Hours in the day, e.g. 8 or 7.5 (at most 24).';
  const product = personHours(crewSize, hoursOnSite);
  const hours = typedTotal ?? product ?? '';
  if (!hours.trim())
    errors.labourHours = 'Enter the people on site and their hours, or the person-hours for the day.';
  else if (!DECIMAL.test(hours.trim()) || money(hours.trim()).greaterThan(1000))
    errors.labourHours = 'A number of person-hours, e.g. 24 or 7.5.';
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
      // The same crew usually comes back tomorrow: the people stay; the hours and the note go.
      setSubmitted(false);
      setHoursOnSite('');
      setTypedTotal(null);
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
      <div className="entry-form__row">
        <FormField
          id="note-on-site"
          label="Hours on site"
          error={errorFor('hoursOnSite')}
          hint="Each person’s day"
        >
          {({ invalid, ...control }) => (
            <span className="unit-input">
              <InputText
                {...control}
                value={hoursOnSite}
                inputMode="decimal"
                onChange={(e) => setHoursOnSite(e.target.value)}
                invalid={invalid}
                className="w-full field-input"
              />
              <span className="unit-input__unit" aria-hidden="true">
                h
              </span>
            </span>
          )}
        </FormField>
        <FormField
          id="note-hours"
          label="Person-hours"
          error={errorFor('labourHours')}
          required
          hint={
            <span data-testid="person-hours-sum">
              {product
                ? `${crewSize.trim()} ${crewSize.trim() === '1' ? 'person' : 'people'} × ${formatQty(hoursOnSite.trim())} h = ${formatQty(product)}`
                : 'People × hours on site'}
              {typedTotal !== null && product && typedTotal.trim() !== product ? (
                <>
                  {' · '}
                  <Button
                    type="button"
                    link
                    size="small"
                    className="person-hours__reset"
                    label={`Use ${formatQty(product)}`}
                    onClick={() => setTypedTotal(null)}
                  />
                </>
              ) : null}
            </span>
          }
        >
          {({ invalid, ...control }) => (
            <span className="unit-input unit-input--wide">
              <InputText
                {...control}
                value={hours}
                inputMode="decimal"
                onChange={(e) => setTypedTotal(e.target.value)}
                invalid={invalid}
                className="w-full field-input"
              />
              <span className="unit-input__unit" aria-hidden="true">
                person-h
              </span>
            </span>
          )}
        </FormField>
      </div>
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
