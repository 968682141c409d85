import { useEffect, useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { InputTextarea } from 'primereact/inputtextarea';
import {
  HELICAL_SHAFTS,
  type HelicalShaft,
  type InstallEntryInput,
  type InstallKind,
  type StopReason,
} from '@loambook/common';
import { FormField } from '@/components/form-field';
import { Select } from '@/components/select';
import type { FieldErrors } from '@/lib/form-errors';
import { DECIMAL, formatQty, KIND_LABELS, KIND_SHORT, STOP_REASON_LABELS } from '../job-format';
import { localCapacity } from './log-rows';
import type { ShaftDefault } from './shaft-default';

type Field =
  | 'number'
  | 'location'
  | 'locationFt'
  | 'depthFt'
  | 'pounds'
  | 'stopReason'
  | 'finalPressurePsi'
  | 'torqueFtLb'
  | 'shaft'
  | 'designLoadLb'
  | 'note';

const STOP_REASONS: StopReason[] = ['surface_return', 'lift_observed', 'planned_quantity', 'other'];
const SHAFT_LABELS: Record<HelicalShaft, string> = {
  '1.5in-square': '1½ in square',
  '1.75in-square': '1¾ in square',
  '2.875in-round': '2⅞ in round',
  '3.5in-round': '3½ in round',
};

export interface EntrySubmit {
  body: Omit<InstallEntryInput, 'clientRowId' | 'loggedAt'>;
  photo: File | null;
}

interface EntryFormProps {
  kind: InstallKind;
  nextNumber: number;
  /** Numbers already in the log for this kind (the server keeps one row per number). */
  usedNumbers: Set<number>;
  /** The shaft a new pile starts on (the last pile's, else the plan's); null: the crew lead chooses. */
  defaultShaft?: ShaftDefault | null;
  onSubmit: (entry: EntrySubmit) => Promise<void>;
}

const numberOrNull = (v: string) => (v.trim() ? v.trim() : null);

/** One row of the install log, for the kind of work in hand; big targets for a gloved thumb. */
export function EntryForm({ kind, nextNumber, usedNumbers, defaultShaft = null, onSubmit }: EntryFormProps) {
  const [number, setNumber] = useState(String(nextNumber));
  const [location, setLocation] = useState('');
  const [locationFt, setLocationFt] = useState('');
  const [depthFt, setDepthFt] = useState('');
  const [pounds, setPounds] = useState('');
  const [stopReason, setStopReason] = useState<StopReason | null>(null);
  const [pressure, setPressure] = useState('');
  const [torque, setTorque] = useState('');
  // Until the crew lead picks one, the shaft follows the job (the last pile logged, else the plan).
  const [chosenShaft, setChosenShaft] = useState<HelicalShaft | null>(null);
  const shaft = chosenShaft ?? defaultShaft?.shaft ?? null;
  const [designLoad, setDesignLoad] = useState('');
  const [note, setNote] = useState('');
  const [photo, setPhoto] = useState<File | null>(null);
  const [photoKey, setPhotoKey] = useState(0);
  const [submitted, setSubmitted] = useState(false);
  const [saving, setSaving] = useState(false);

  // The next number follows the log (a row sent from another phone, the kind switched).
  const [lastNext, setLastNext] = useState(nextNumber);
  if (lastNext !== nextNumber) {
    setLastNext(nextNumber);
    setNumber(String(nextNumber));
  }

  const [preview, setPreview] = useState<string | null>(null);
  useEffect(() => {
    if (!photo || typeof URL.createObjectURL !== 'function') {
      setPreview(null);
      return;
    }
    const url = URL.createObjectURL(photo);
    setPreview(url);
    return () => URL.revokeObjectURL(url);
  }, [photo]);

  const n = Number(number);
  const errors: FieldErrors<Field> = {};
  if (!/^\d{1,4}$/.test(number.trim()) || n < 1) errors.number = 'A whole number from 1 to 9999.';
  else if (usedNumbers.has(n)) errors.number = `${KIND_SHORT[kind]} ${n} is already in the log.`;
  const decimal = (f: Field, v: string, label: string, required: boolean) => {
    if (!v.trim()) {
      if (required) errors[f] = `Enter the ${label}.`;
    } else if (!DECIMAL.test(v.trim())) errors[f] = 'A number, at most 2 decimals (e.g. 12.5).';
  };
  decimal('locationFt', locationFt, 'distance', false);
  decimal('depthFt', depthFt, 'depth reached', kind !== 'injection');
  if (depthFt.trim() && DECIMAL.test(depthFt.trim()) && Number(depthFt) > 200)
    errors.depthFt = 'At most 200 ft.';
  if (kind === 'injection') {
    decimal('pounds', pounds, 'pounds pumped', true);
    if (!stopReason) errors.stopReason = 'Say why the injection stopped.';
    if (stopReason === 'other' && !note.trim()) errors.note = 'Say what the other reason was.';
  }
  if (kind === 'push_pier') decimal('finalPressurePsi', pressure, 'final pressure', true);
  if (kind === 'helical_pile') {
    decimal('torqueFtLb', torque, 'final torque', true);
    decimal('designLoadLb', designLoad, 'design load', true);
    if (!shaft) errors.shaft = 'Choose the pile’s shaft: it sets the torque factor behind the capacity.';
  }
  const errorFor = (f: Field) => (submitted ? errors[f] : undefined);

  const capacity =
    kind === 'helical_pile' && shaft && !errors.torqueFtLb && !errors.designLoadLb
      ? localCapacity({ shaft, torqueFtLb: torque.trim(), designLoadLb: designLoad.trim() })
      : null;

  const label = KIND_SHORT[kind];

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    if (Object.values(errors).some(Boolean)) {
      const first = document.querySelector<HTMLElement>('.entry-form [aria-invalid="true"]');
      first?.focus();
      return;
    }
    setSaving(true);
    try {
      await onSubmit({
        body: {
          kind,
          number: n,
          location: location.trim() || null,
          locationFt: numberOrNull(locationFt),
          depthFt: numberOrNull(depthFt),
          ...(kind === 'injection'
            ? { pounds: pounds.trim(), stopReason }
            : kind === 'push_pier'
              ? { finalPressurePsi: pressure.trim() }
              : { torqueFtLb: torque.trim(), shaft, designLoadLb: designLoad.trim() }),
          note: note.trim() || null,
        },
        photo,
      });
      // Ready for the next one: the wall, the shaft and the design load usually stay the same.
      setSubmitted(false);
      setLocationFt('');
      setDepthFt(kind === 'injection' ? depthFt : '');
      setPounds('');
      setStopReason(null);
      setPressure('');
      setTorque('');
      setNote('');
      setPhoto(null);
      setPhotoKey((k) => k + 1);
    } finally {
      setSaving(false);
    }
  };

  const text = (
    f: Field,
    value: string,
    set: (v: string) => void,
    fieldLabel: string,
    opts: { unit?: string; required?: boolean; hint?: string; mode?: 'decimal' | 'numeric' | 'text' } = {},
  ) => (
    <FormField
      id={`entry-${f}`}
      label={fieldLabel}
      error={errorFor(f)}
      required={opts.required}
      hint={opts.hint}
    >
      {({ invalid, ...control }) => (
        <span className={opts.unit ? 'unit-input' : undefined}>
          <InputText
            {...control}
            value={value}
            inputMode={opts.mode ?? 'decimal'}
            enterKeyHint="next"
            autoComplete="off"
            maxLength={opts.mode === 'text' ? 120 : 12}
            onChange={(e) => set(e.target.value)}
            invalid={invalid}
            className="w-full field-input"
          />
          {opts.unit ? (
            <span className="unit-input__unit" aria-hidden="true">
              {opts.unit}
            </span>
          ) : null}
        </span>
      )}
    </FormField>
  );

  return (
    <form
      className="entry-form"
      onSubmit={submit}
      noValidate
      aria-label={`Log ${KIND_LABELS[kind].toLowerCase()}`}
    >
      <div className="entry-form__row">
        {text('number', number, setNumber, `${label} number`, { required: true, mode: 'numeric' })}
        {text('depthFt', depthFt, setDepthFt, 'Depth reached', {
          unit: 'ft',
          required: kind !== 'injection',
        })}
      </div>
      <div className="entry-form__row">
        {text('location', location, setLocation, 'Wall or side', { mode: 'text', hint: 'e.g. North wall' })}
        {text('locationFt', locationFt, setLocationFt, 'Along the wall', {
          unit: 'ft',
          hint: 'From the corner',
        })}
      </div>

      {kind === 'injection' ? (
        <>
          {text('pounds', pounds, setPounds, 'Pounds pumped', { unit: 'lb', required: true })}
          <fieldset
            className="stop-reasons"
            aria-describedby={errorFor('stopReason') ? 'entry-stop-error' : undefined}
            aria-invalid={errorFor('stopReason') ? true : undefined}
          >
            <legend className="form-field__label">
              Why it stopped{' '}
              <span className="form-field__required" aria-hidden="true">
                *
              </span>
            </legend>
            {STOP_REASONS.map((r) => (
              <label key={r} className={stopReason === r ? 'stop-reason stop-reason--on' : 'stop-reason'}>
                <input
                  type="radio"
                  name="stop-reason"
                  value={r}
                  checked={stopReason === r}
                  onChange={() => setStopReason(r)}
                />
                <span>{STOP_REASON_LABELS[r]}</span>
              </label>
            ))}
            {errorFor('stopReason') ? (
              <small id="entry-stop-error" className="form-field__error">
                <i className="pi pi-exclamation-circle" aria-hidden="true" /> {errorFor('stopReason')}
              </small>
            ) : null}
          </fieldset>
        </>
      ) : null}

      {kind === 'push_pier'
        ? text('finalPressurePsi', pressure, setPressure, 'Final hydraulic pressure', {
            unit: 'psi',
            required: true,
          })
        : null}

      {kind === 'helical_pile' ? (
        <>
          <div className="entry-form__row">
            {text('torqueFtLb', torque, setTorque, 'Final torque', { unit: 'ft·lb', required: true })}
            {text('designLoadLb', designLoad, setDesignLoad, 'Design load', { unit: 'lb', required: true })}
          </div>
          <FormField
            id="entry-shaft"
            label="Shaft"
            required
            error={errorFor('shaft')}
            hint={chosenShaft === null && defaultShaft ? defaultShaft.from : undefined}
          >
            {({ invalid, ...control }) => (
              <Select
                inputId={control.id}
                value={shaft}
                options={HELICAL_SHAFTS.map((s) => ({ value: s, label: SHAFT_LABELS[s] }))}
                onChange={(e) => setChosenShaft(e.value as HelicalShaft)}
                placeholder="Choose the shaft"
                invalid={invalid}
                className="w-full"
              />
            )}
          </FormField>
          {capacity?.allowableLb ? (
            <div
              className={capacity.below ? 'capacity capacity--below' : 'capacity'}
              role="status"
              aria-live="polite"
              data-testid="capacity"
            >
              <span className="capacity__figure">
                Allowable capacity <strong>{formatQty(capacity.allowableLb)} lb</strong>
              </span>
              {capacity.below ? (
                <span className="capacity__flag">
                  <i className="pi pi-exclamation-triangle" aria-hidden="true" /> Below design load (
                  {formatQty(designLoad.trim())} lb): keep advancing the pile or call the engineer of record.
                </span>
              ) : (
                <span className="capacity__ok">
                  <i className="pi pi-check" aria-hidden="true" /> Meets the design load
                </span>
              )}
              <span className="capacity__source muted">
                From the torque: Qu = Kt × T, allowable = Qu ÷ 2.
              </span>
            </div>
          ) : null}
        </>
      ) : null}

      <FormField
        id="entry-note"
        label="Note"
        error={errorFor('note')}
        required={kind === 'injection' && stopReason === 'other'}
      >
        {({ invalid, ...control }) => (
          <InputTextarea
            {...control}
            value={note}
            rows={2}
            maxLength={2000}
            onChange={(e) => setNote(e.target.value)}
            invalid={invalid}
            className="w-full field-input"
          />
        )}
      </FormField>

      <div className="photo-pick">
        <input
          key={photoKey}
          id="entry-photo"
          type="file"
          accept="image/*"
          capture="environment"
          className="photo-pick__input"
          onChange={(e) => setPhoto(e.target.files?.[0] ?? null)}
        />
        <label htmlFor="entry-photo" className="photo-pick__button">
          <i className="pi pi-camera" aria-hidden="true" />
          <span>
            {photo ? 'Retake photo' : `Photo of ${label.toLowerCase()} ${Number.isFinite(n) ? n : ''}`}
          </span>
        </label>
        {photo ? (
          <span className="photo-pick__chosen">
            {preview ? <img src={preview} alt="" className="photo-pick__thumb" /> : null}
            <span className="muted">{photo.name}</span>
            <Button
              type="button"
              icon="pi pi-times"
              text
              rounded
              aria-label="Remove the photo"
              onClick={() => {
                setPhoto(null);
                setPhotoKey((k) => k + 1);
              }}
            />
          </span>
        ) : null}
      </div>

      <Button
        type="submit"
        label={`Save ${label.toLowerCase()} ${Number.isFinite(n) && n > 0 ? n : ''}`.trim()}
        icon="pi pi-check"
        size="large"
        className="w-full field-save"
        loading={saving}
      />
    </form>
  );
}
