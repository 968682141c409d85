import { useEffect, useRef, useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Select } from '@/components/select';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import {
  SALES_TAX_TREATMENTS,
  SALES_TAX_TREATMENT_LABELS,
  US_STATES,
  US_TIMEZONES,
  type BranchInput,
} from '@loambook/common';
import { FormField } from '@/components/form-field';
import { hasErrors, serverFormErrors, type FieldErrors } from '@/lib/form-errors';
import {
  BRANCH_FIELDS,
  toBranchInput,
  validateBranch,
  type BranchField,
  type BranchFormValues,
} from '../branch-form-values';

const STATE_OPTIONS = US_STATES.map((s) => ({ label: s, value: s }));
const TAX_OPTIONS = SALES_TAX_TREATMENTS.map((t) => ({ label: SALES_TAX_TREATMENT_LABELS[t], value: t }));

interface BranchFormProps {
  initialValues: BranchFormValues;
  /** Saves; a rejection with an ApiError puts the server's field errors on the fields. */
  onSubmit: (input: BranchInput) => Promise<unknown>;
  onCancel: () => void;
  pending: boolean;
}

export function BranchForm({ initialValues, onSubmit, onCancel, pending }: BranchFormProps) {
  const [values, setValues] = useState<BranchFormValues>(initialValues);
  const [submitted, setSubmitted] = useState(false);
  const [serverFields, setServerFields] = useState<FieldErrors<BranchField>>({});
  const [formMessage, setFormMessage] = useState<string | null>(null);
  const formRef = useRef<HTMLFormElement>(null);
  const [attempt, setAttempt] = useState(0);

  // After a refused save, bring the first field at fault into view and put the cursor there.
  useEffect(() => {
    if (attempt === 0) return;
    const field = formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]');
    if (field) {
      field.focus({ preventScroll: true });
      field.scrollIntoView?.({ block: 'center' });
    } else {
      formRef.current?.scrollIntoView?.({ block: 'start' });
    }
  }, [attempt]);

  const clientErrors = validateBranch(values);
  // Faults show from the first attempt to save, then update as the person types. (Not on leaving a field:
  // a message appearing then moves the buttons under the pointer between press and release.)
  const errorFor = (field: BranchField): string | undefined =>
    serverFields[field] ?? (submitted ? clientErrors[field] : undefined);

  // A branch saved with a zone outside the usual list keeps it as a choice.
  const timezoneOptions = [
    ...US_TIMEZONES,
    ...(US_TIMEZONES.some((z) => z === initialValues.timezone) || !initialValues.timezone
      ? []
      : [initialValues.timezone]),
  ].map((z) => ({ label: z, value: z }));

  const set = (field: BranchField, value: string) => {
    setValues((v) => ({ ...v, [field]: value }));
    setServerFields((s) => (s[field] ? { ...s, [field]: undefined } : s));
  };

  const handleSubmit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setFormMessage(null);
    if (hasErrors(clientErrors)) {
      setFormMessage('Some fields need attention.');
      setAttempt((a) => a + 1);
      return;
    }
    try {
      await onSubmit(toBranchInput(values));
    } catch (error) {
      const mapped = serverFormErrors(error, BRANCH_FIELDS);
      setServerFields(mapped.fields);
      setFormMessage(mapped.form ?? 'Some fields need attention.');
      setAttempt((a) => a + 1);
    }
  };

  const text = (
    field: BranchField,
    label: string,
    opts: {
      hint?: string;
      required?: boolean;
      autoComplete?: string;
      maxLength?: number;
      upper?: boolean;
      inputMode?: 'tel' | 'numeric';
    } = {},
  ) => (
    <FormField
      id={`branch-${field.replace('.', '-')}`}
      label={label}
      error={errorFor(field)}
      hint={opts.hint}
      required={opts.required}
    >
      {({ invalid, ...control }) => (
        <InputText
          {...control}
          value={values[field]}
          onChange={(e) => set(field, opts.upper ? e.target.value.toUpperCase() : e.target.value)}
          invalid={invalid}
          autoComplete={opts.autoComplete ?? 'off'}
          maxLength={opts.maxLength}
          inputMode={opts.inputMode}
          className="w-full"
        />
      )}
    </FormField>
  );

  const percent = (field: BranchField, label: string, hint: string) => (
    <FormField
      id={`branch-${field.replace('.', '-')}`}
      label={label}
      error={errorFor(field)}
      hint={hint}
      required
    >
      {({ invalid, ...control }) => (
        <div className="p-inputgroup percent-input">
          <InputText
            {...control}
            value={values[field]}
            onChange={(e) => set(field, e.target.value)}
            invalid={invalid}
            inputMode="decimal"
            autoComplete="off"
            maxLength={6}
          />
          <span className="p-inputgroup-addon" aria-hidden="true">
            %
          </span>
        </div>
      )}
    </FormField>
  );

  const dropdown = (
    field: BranchField,
    label: string,
    options: { label: string; value: string }[],
    opts: { hint?: string; filter?: boolean; placeholder: string },
  ) => (
    <FormField id={`branch-${field}`} label={label} error={errorFor(field)} hint={opts.hint} required>
      {({ invalid, id, ...aria }) => (
        <Select
          inputId={id}
          {...aria}
          value={values[field] || null}
          options={options}
          onChange={(e) => set(field, (e.value as string | null) ?? '')}
          invalid={invalid}
          filter={opts.filter}
          filterInputAutoFocus
          placeholder={opts.placeholder}
          className="w-full"
        />
      )}
    </FormField>
  );

  return (
    <form ref={formRef} className="branch-form" onSubmit={handleSubmit} noValidate aria-label="Branch">
      {formMessage ? <Message severity="error" text={formMessage} className="form-message" /> : null}

      <section className="form-section">
        <h2 className="form-section__title">Branch</h2>
        <div className="form-grid">
          {text('code', 'Code', {
            hint: '2–8 capital letters or digits, starting with a letter (e.g. MRW).',
            required: true,
            maxLength: 8,
            upper: true,
          })}
          {text('name', 'Name', { required: true, maxLength: 80 })}
        </div>
      </section>

      <section className="form-section">
        <h2 className="form-section__title">Address and hours</h2>
        <div className="form-grid">
          {text('addressLine1', 'Street address', {
            required: true,
            autoComplete: 'address-line1',
            maxLength: 120,
          })}
          {text('city', 'City', { required: true, autoComplete: 'address-level2', maxLength: 80 })}
          {dropdown('state', 'State', STATE_OPTIONS, { filter: true, placeholder: 'Choose a state' })}
          {text('postalCode', 'ZIP code', {
            required: true,
            autoComplete: 'postal-code',
            maxLength: 10,
            inputMode: 'numeric',
          })}
          {text('phone', 'Phone', {
            hint: 'Optional. The number customers call.',
            autoComplete: 'tel',
            maxLength: 32,
            inputMode: 'tel',
          })}
          {dropdown('timezone', 'Time zone', timezoneOptions, {
            placeholder: 'Choose a time zone',
            hint: 'Appointments and deadlines for this branch use this zone.',
          })}
        </div>
      </section>

      <section className="form-section">
        <h2 className="form-section__title">Margin and discounts</h2>
        <div className="form-grid form-grid--thirds">
          {percent(
            'marginFloorPct',
            'Margin floor %',
            'A proposal with a lower gross margin needs approval.',
          )}
          {percent(
            'discountAuthority.salesperson',
            'Salesperson discount limit %',
            'The most a salesperson may take off list price without approval.',
          )}
          {percent(
            'discountAuthority.branch_manager',
            'Manager discount limit %',
            'The most a branch manager may approve; beyond it only an owner may.',
          )}
        </div>
      </section>

      <section className="form-section">
        <h2 className="form-section__title">Tax</h2>
        <div className="form-grid">
          {dropdown('salesTaxTreatment', 'Sales tax', TAX_OPTIONS, {
            placeholder: 'Choose how tax is handled',
            hint: 'Rules for repair work differ from state to state: confirm the treatment with your tax adviser.',
          })}
          {percent(
            'salesTaxRatePct',
            'Sales tax rate %',
            'The combined rate that applies where this branch works.',
          )}
        </div>
      </section>

      <div className="form-actions">
        <Button
          type="button"
          label="Cancel"
          severity="secondary"
          outlined
          onClick={onCancel}
          disabled={pending}
        />
        <Button type="submit" label="Save branch" icon="pi pi-check" loading={pending} />
      </div>
    </form>
  );
}
