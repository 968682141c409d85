import { useEffect, useMemo, useRef, useState } from 'react';
import type { FormEvent, ReactNode } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { InputTextarea } from 'primereact/inputtextarea';
import { Message } from 'primereact/message';
import {
  FOUNDATION_TYPES,
  FOUNDATION_TYPE_LABELS,
  LEAD_SOURCES,
  PREFERRED_CONTACTS,
  US_STATES,
  type Branch,
} from '@loambook/common';
import { FormField } from '@/components/form-field';
import { Select } from '@/components/select';
import { hasErrors, serverFormErrors, type FieldErrors } from '@/lib/form-errors';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { useDuplicateCheck, type DuplicateCheckInput } from '../api/check-duplicates';
import { useSalespeople } from '../api/get-salespeople';
import { PREFERRED_CONTACT_LABELS } from '../lead-format';
import {
  duplicateCheckInput,
  LEAD_FIELDS,
  validateLead,
  type LeadField,
  type LeadFormValues,
} from '../lead-form-values';
import { useDebouncedValue } from '../use-debounced-value';
import { DuplicateWarning } from './duplicate-warning';

const STATE_OPTIONS = US_STATES.map((s) => ({ label: s, value: s }));
const CONTACT_OPTIONS = PREFERRED_CONTACTS.map((c) => ({ label: PREFERRED_CONTACT_LABELS[c], value: c }));
const FOUNDATION_OPTIONS = FOUNDATION_TYPES.map((f) => ({ label: FOUNDATION_TYPE_LABELS[f], value: f }));
const UNASSIGNED = '__none__';
const ATTENTION = 'Some fields need attention.';

/** How long typing must pause before the duplicate check runs (ms). */
export const DUPLICATE_CHECK_DELAY_MS = 450;

interface LeadFormProps {
  initialValues: LeadFormValues;
  /** Saves; a rejection with an ApiError puts the server's field errors on the fields. */
  onSubmit: (values: LeadFormValues) => Promise<unknown>;
  onCancel: () => void;
  pending: boolean;
  submitLabel: string;
  /** A new lead names its branch; an existing one moves only by a transfer. */
  mode: 'create' | 'edit';
  /** The branches the person may enter leads for (create only). */
  branches: Branch[];
  /** Managers and owners choose the salesperson; a salesperson's leads are their own. */
  chooseSalesperson: boolean;
  /** The lead being edited, left out of its own duplicate check. */
  leadId?: string;
  /** The branch of the lead being edited, for its salesperson list. */
  leadBranchId?: string;
  /** An id prefix, so the form can sit in a dialog beside another. */
  idPrefix?: string;
}

export function LeadForm({
  initialValues,
  onSubmit,
  onCancel,
  pending,
  submitLabel,
  mode,
  branches,
  chooseSalesperson,
  leadId,
  leadBranchId,
  idPrefix = 'lead',
}: LeadFormProps) {
  const user = useCurrentUser();
  const [values, setValues] = useState<LeadFormValues>(initialValues);
  const [submitted, setSubmitted] = useState(false);
  const [serverFields, setServerFields] = useState<FieldErrors<LeadField>>({});
  const [formMessage, setFormMessage] = useState<string | null>(null);
  const formRef = useRef<HTMLFormElement>(null);
  const [attempt, setAttempt] = useState(0);

  const branchId = mode === 'create' ? values.branchId : (leadBranchId ?? values.branchId);
  const salespeople = useSalespeople(branchId || null, { enabled: chooseSalesperson && !!branchId });

  // Debounced as text, so that an unchanged check is the same value from one render to the next.
  const checkKey = useDebouncedValue(
    JSON.stringify(duplicateCheckInput(values, leadId)),
    DUPLICATE_CHECK_DELAY_MS,
  );
  const checkInput = useMemo(() => JSON.parse(checkKey) as DuplicateCheckInput | null, [checkKey]);
  const duplicates = useDuplicateCheck(checkInput);

  // After a refused save, bring the first field at fault into view and put the cursor there.
  useEffect(() => {
    if (attempt === 0) return;
    const field = formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]');
    if (field) {
      field.focus({ preventScroll: true });
      field.scrollIntoView?.({ block: 'center' });
    }
  }, [attempt]);

  const clientErrors = validateLead(values, { needsBranch: mode === 'create' });
  const errorFor = (field: LeadField) => serverFields[field] ?? (submitted ? clientErrors[field] : undefined);

  const set = (field: LeadField, value: string) => {
    setValues((v) => {
      const next = { ...v, [field]: value };
      // A salesperson of one branch is not one of another's.
      if (field === 'branchId' && value !== v.branchId && chooseSalesperson) next.salespersonId = '';
      // Most houses are in the branch's own state.
      if (field === 'branchId' && !v.state) next.state = branches.find((b) => b.id === value)?.state ?? '';
      return next;
    });
    setServerFields((s) => {
      // A phone or an e-mail answers the "one of them" complaint on either field.
      const clear: LeadField[] =
        field === 'email' || field === 'phonePrimary' ? ['email', 'phonePrimary'] : [field];
      return clear.some((f) => s[f]) ? { ...s, ...Object.fromEntries(clear.map((f) => [f, undefined])) } : s;
    });
  };

  const handleSubmit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setFormMessage(null);
    if (hasErrors(clientErrors)) {
      setFormMessage(ATTENTION);
      setAttempt((a) => a + 1);
      return;
    }
    try {
      await onSubmit(values);
    } catch (error) {
      const mapped = serverFormErrors(error, LEAD_FIELDS);
      setServerFields(mapped.fields);
      setFormMessage(mapped.form ?? ATTENTION);
      setAttempt((a) => a + 1);
    }
  };

  const id = (field: LeadField) => `${idPrefix}-${field}`;

  const text = (
    field: LeadField,
    label: string,
    opts: {
      hint?: ReactNode;
      required?: boolean;
      autoComplete?: string;
      maxLength?: number;
      inputMode?: 'tel' | 'numeric' | 'email';
      type?: 'text' | 'tel' | 'email';
      className?: string;
    } = {},
  ) => (
    <FormField
      id={id(field)}
      label={label}
      error={errorFor(field)}
      hint={opts.hint}
      required={opts.required}
      className={opts.className}
    >
      {({ invalid, ...control }) => (
        <InputText
          {...control}
          type={opts.type ?? 'text'}
          value={values[field]}
          onChange={(e) => set(field, e.target.value)}
          invalid={invalid}
          autoComplete={opts.autoComplete ?? 'off'}
          maxLength={opts.maxLength}
          inputMode={opts.inputMode}
          className="w-full"
        />
      )}
    </FormField>
  );

  const dropdown = (
    field: LeadField,
    label: string,
    options: { label: string; value: string }[],
    opts: {
      hint?: ReactNode;
      required?: boolean;
      filter?: boolean;
      placeholder: string;
      showClear?: boolean;
    },
  ) => (
    <FormField id={id(field)} label={label} error={errorFor(field)} hint={opts.hint} required={opts.required}>
      {({ invalid, id: inputId, ...aria }) => (
        <Select
          inputId={inputId}
          {...aria}
          value={values[field] || null}
          options={options}
          onChange={(e) => set(field, (e.value as string | null) ?? '')}
          invalid={invalid}
          filter={opts.filter}
          filterInputAutoFocus
          showClear={opts.showClear}
          placeholder={opts.placeholder}
          className="w-full"
        />
      )}
    </FormField>
  );

  const branchOptions = branches.map((b) => ({ label: `${b.code} · ${b.name}`, value: b.id }));
  const chosenBranch = branches.find((b) => b.id === values.branchId);
  const salespersonOptions = [
    { label: 'Nobody yet', value: UNASSIGNED },
    ...(salespeople.data ?? []).map((u) => ({
      label: u.id === user.id ? `${u.name} (you)` : u.name,
      value: u.id,
    })),
  ];
  // A source typed in the past, outside today's list, stays a choice.
  const sourceOptions = [
    ...LEAD_SOURCES,
    ...(initialValues.source && !(LEAD_SOURCES as readonly string[]).includes(initialValues.source)
      ? [initialValues.source]
      : []),
  ].map((s) => ({ label: s, value: s }));

  return (
    <form ref={formRef} className="lead-form" onSubmit={handleSubmit} noValidate aria-label="Lead">
      {formMessage && (hasErrors(clientErrors) || hasErrors(serverFields) || formMessage !== ATTENTION) ? (
        <Message severity="error" text={formMessage} className="form-message" />
      ) : null}

      <section className="form-section">
        <h2 className="form-section__title">Homeowner</h2>
        <div className="form-grid">
          {text('homeownerName', 'Name', { required: true, maxLength: 120, autoComplete: 'off' })}
          {dropdown('preferredContact', 'Preferred contact', CONTACT_OPTIONS, {
            required: true,
            placeholder: 'Choose one',
          })}
          {text('phonePrimary', 'Phone', {
            hint: errorFor('phonePrimary') ? undefined : 'A phone or an e-mail is needed.',
            maxLength: 32,
            inputMode: 'tel',
            type: 'tel',
          })}
          {text('phoneSecondary', 'Second phone', { maxLength: 32, inputMode: 'tel', type: 'tel' })}
          {text('email', 'E-mail', { maxLength: 254, inputMode: 'email', type: 'email' })}
        </div>
      </section>

      <DuplicateWarning result={checkInput ? duplicates.data : undefined} />

      <section className="form-section">
        <h2 className="form-section__title">Property</h2>
        <div className="form-grid">
          {text('addressLine1', 'Street address', { required: true, maxLength: 120, className: 'span-2' })}
          {text('city', 'City', { required: true, maxLength: 80 })}
          <div className="form-grid form-grid--pair">
            {dropdown('state', 'State', STATE_OPTIONS, {
              required: true,
              filter: true,
              placeholder: 'State',
            })}
            {text('postalCode', 'ZIP code', { required: true, maxLength: 10, inputMode: 'numeric' })}
          </div>
          {text('yearBuilt', 'Year built', {
            maxLength: 4,
            inputMode: 'numeric',
            hint: 'Four digits, e.g. 1978.',
          })}
          {dropdown('foundationType', 'Foundation type', FOUNDATION_OPTIONS, {
            placeholder: 'Not known yet',
            showClear: true,
          })}
          {dropdown('source', 'Source', sourceOptions, {
            placeholder: 'How they found us',
            showClear: true,
          })}
          <FormField
            id={id('notes')}
            label="Notes"
            error={errorFor('notes')}
            className="span-2"
            hint="What the homeowner said about the problem, gate codes, dogs, best times to call."
          >
            {({ invalid, ...control }) => (
              <InputTextarea
                {...control}
                value={values.notes}
                onChange={(e) => set('notes', e.target.value)}
                invalid={invalid}
                rows={3}
                autoResize
                maxLength={4000}
                className="w-full"
              />
            )}
          </FormField>
        </div>
      </section>

      {mode === 'create' || chooseSalesperson ? (
        <section className="form-section">
          <h2 className="form-section__title">Assignment</h2>
          <div className="form-grid">
            {mode === 'create' ? (
              branches.length > 1 ? (
                dropdown('branchId', 'Branch', branchOptions, {
                  required: true,
                  placeholder: 'Choose a branch',
                })
              ) : (
                <div className="form-field">
                  <span className="form-field__label">Branch</span>
                  <span className="static-value">
                    {chosenBranch ? `${chosenBranch.code} · ${chosenBranch.name}` : 'No branch'}
                  </span>
                  {errorFor('branchId') ? (
                    <small className="form-field__error">{errorFor('branchId')}</small>
                  ) : null}
                </div>
              )
            ) : null}
            {chooseSalesperson ? (
              <FormField
                id={id('salespersonId')}
                label="Salesperson"
                error={errorFor('salespersonId')}
                hint={branchId ? 'Who follows up with the homeowner.' : 'Choose the branch first.'}
              >
                {({ invalid, id: inputId, ...aria }) => (
                  <Select
                    inputId={inputId}
                    {...aria}
                    value={values.salespersonId || UNASSIGNED}
                    options={salespersonOptions}
                    onChange={(e) =>
                      set('salespersonId', e.value === UNASSIGNED ? '' : ((e.value as string | null) ?? ''))
                    }
                    invalid={invalid}
                    disabled={!branchId}
                    loading={salespeople.isFetching}
                    className="w-full"
                  />
                )}
              </FormField>
            ) : (
              <div className="form-field">
                <span className="form-field__label">Salesperson</span>
                <span className="static-value">{user.name} (you)</span>
              </div>
            )}
          </div>
        </section>
      ) : null}

      <div className="form-actions">
        <Button
          type="button"
          label="Cancel"
          severity="secondary"
          outlined
          onClick={onCancel}
          disabled={pending}
        />
        <Button type="submit" label={submitLabel} icon="pi pi-check" loading={pending} />
      </div>
    </form>
  );
}
