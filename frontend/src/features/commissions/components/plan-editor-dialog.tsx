import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Checkbox } from 'primereact/checkbox';
import { Dialog } from 'primereact/dialog';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import { RadioButton } from 'primereact/radiobutton';
import {
  COMMISSION_PLAN_BASES,
  COMMISSION_TIER_MEASURES,
  COMMISSION_TIER_MODES,
  type Branch,
  type CommissionPlanInput,
  type CommissionPlanView,
} from '@loambook/common';
import { FormField } from '@/components/form-field';
import { Select } from '@/components/select';
import { isApiError } from '@/lib/api-client';
import { useLastValue } from '@/lib/use-last-value';
import { BASIS_HINTS, BASIS_LABELS, MEASURE_LABELS, MODE_LABELS } from '../commission-format';
import {
  EMPTY_PLAN,
  toPlanInput,
  validatePlanValues,
  valuesFromPlan,
  type PlanFormValues,
} from '../plan-values';

const COMPANY = '';
const BASIS_OPTIONS = COMMISSION_PLAN_BASES.map((b) => ({ label: BASIS_LABELS[b], value: b }));
const MEASURE_OPTIONS = COMMISSION_TIER_MEASURES.map((m) => ({ label: MEASURE_LABELS[m], value: m }));
const MAX_TIERS = 20;

export interface PlanEditorState {
  /** null: a new plan. */
  plan: CommissionPlanView | null;
}

interface PlanEditorDialogProps {
  state: PlanEditorState | null;
  branches: Branch[];
  /** Saves; a rejection with an ApiError puts the server's field errors on the fields. */
  onSubmit: (input: CommissionPlanInput, plan: CommissionPlanView | null) => Promise<unknown>;
  onClose: () => void;
  pending: boolean;
}

/** The owner's plan editor: basis, a flat rate or tiers (measure, step or bracket), the first milestone. */
export function PlanEditorDialog({ state, ...rest }: PlanEditorDialogProps) {
  const shown = useLastValue(state);
  const editing = shown?.plan ?? null;
  return (
    <Dialog
      visible={state !== null}
      onHide={rest.onClose}
      header={editing ? `Edit ${editing.name}` : 'New commission plan'}
      className="app-dialog"
      style={{ width: '44rem' }}
      breakpoints={{ '720px': 'calc(100vw - 1rem)' }}
      draggable={false}
      resizable={false}
    >
      {shown ? <PlanForm key={editing?.id ?? 'new'} plan={editing} {...rest} /> : null}
    </Dialog>
  );
}

function PlanForm({
  plan,
  branches,
  onSubmit,
  onClose,
  pending,
}: Omit<PlanEditorDialogProps, 'state'> & { plan: CommissionPlanView | null }) {
  const [values, setValues] = useState<PlanFormValues>(plan ? valuesFromPlan(plan) : EMPTY_PLAN);
  const [submitted, setSubmitted] = useState(false);
  const [server, setServer] = useState<Record<string, string>>({});
  const [formMessage, setFormMessage] = useState<string | null>(null);
  const locked = plan?.inUse ?? false;

  const clientErrors = validatePlanValues(values);
  const errorFor = (field: string) => server[field] ?? (submitted ? clientErrors[field] : undefined);
  const set = <K extends keyof PlanFormValues>(field: K, value: PlanFormValues[K]) => {
    setValues((v) => ({ ...v, [field]: value }));
    setServer({});
  };
  const setTier = (i: number, field: 'from' | 'ratePct', value: string) =>
    set(
      'tiers',
      values.tiers.map((t, j) => (j === i ? { ...t, [field]: value } : t)),
    );

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setFormMessage(null);
    if (Object.keys(clientErrors).length > 0) {
      setFormMessage('Some fields need attention.');
      return;
    }
    const input = toPlanInput(values);
    try {
      await onSubmit(input, plan);
    } catch (error) {
      if (!isApiError(error)) {
        setFormMessage('Something went wrong. Try again.');
        return;
      }
      const fields = Object.fromEntries(error.fieldErrors.map((f) => [f.field, f.message]));
      setServer(fields);
      setFormMessage(error.fieldErrors.length ? 'Some fields need attention.' : error.message);
    }
  };

  const volume = values.measure === 'monthly_volume';
  const branchOptions = [
    { label: 'Company-wide default (every branch without its own plan)', value: COMPANY },
    ...branches.map((b) => ({ label: `${b.code} · ${b.name}`, value: b.id })),
  ];

  return (
    <form
      onSubmit={submit}
      noValidate
      className="dialog-form commission-plan-form"
      aria-label="Commission plan"
    >
      {locked ? (
        <Message
          severity="info"
          className="form-message"
          text="Contracts are already computed under this plan: only its name and whether it is offered can change. For a new rate, make a new plan with a later start date."
        />
      ) : null}
      {formMessage ? <Message severity="error" text={formMessage} className="form-message" /> : null}
      <FormField id="plan-name" label="Name" error={errorFor('name')} required>
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={values.name}
            onChange={(e) => set('name', e.target.value)}
            invalid={invalid}
            maxLength={80}
            autoComplete="off"
          />
        )}
      </FormField>
      <div className="form-grid">
        <FormField
          id="plan-branch"
          label="Applies to"
          error={errorFor('branchId')}
          hint="A branch’s own plan wins over the company-wide default."
        >
          {({ invalid, id, ...aria }) => (
            <Select
              inputId={id}
              {...aria}
              value={values.branchId}
              options={branchOptions}
              onChange={(e) => set('branchId', e.value as string)}
              invalid={invalid}
              disabled={locked}
              panelClassName="app-overlay"
            />
          )}
        </FormField>
        <FormField
          id="plan-from"
          label="Starts on"
          error={errorFor('effectiveFrom')}
          hint="For contracts signed on or after this day."
          required
        >
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              type="date"
              value={values.effectiveFrom}
              onChange={(e) => set('effectiveFrom', e.target.value)}
              invalid={invalid}
              disabled={locked}
            />
          )}
        </FormField>
      </div>
      <FormField
        id="plan-basis"
        label="Commission basis"
        error={errorFor('basis')}
        hint={BASIS_HINTS[values.basis]}
        required
      >
        {({ invalid, id, ...aria }) => (
          <Select
            inputId={id}
            {...aria}
            value={values.basis}
            options={BASIS_OPTIONS}
            onChange={(e) => set('basis', e.value as PlanFormValues['basis'])}
            invalid={invalid}
            disabled={locked}
            panelClassName="app-overlay"
          />
        )}
      </FormField>

      <fieldset className="commission-rate" disabled={locked}>
        <legend className="form-field__label">Rate</legend>
        <div className="commission-rate__kinds">
          {(['flat', 'tiered'] as const).map((kind) => (
            <div key={kind} className="radio-field">
              <RadioButton
                inputId={`plan-rate-${kind}`}
                name="rateKind"
                value={kind}
                checked={values.rateKind === kind}
                onChange={() => set('rateKind', kind)}
                disabled={locked}
              />
              <label htmlFor={`plan-rate-${kind}`}>{kind === 'flat' ? 'One flat rate' : 'Tiers'}</label>
            </div>
          ))}
        </div>
        {errorFor('rate.kind') ? <small className="form-field__error">{errorFor('rate.kind')}</small> : null}
        {values.rateKind === 'flat' ? (
          <FormField id="plan-rate" label="Rate (%)" error={errorFor('rate.ratePct')} required>
            {({ invalid, ...control }) => (
              <InputText
                {...control}
                value={values.ratePct}
                onChange={(e) => set('ratePct', e.target.value)}
                invalid={invalid}
                inputMode="decimal"
                autoComplete="off"
                maxLength={10}
                disabled={locked}
              />
            )}
          </FormField>
        ) : (
          <>
            <div className="form-grid">
              <FormField
                id="plan-measure"
                label="Tiers measured on"
                error={errorFor('rate.measure')}
                required
              >
                {({ invalid, id, ...aria }) => (
                  <Select
                    inputId={id}
                    {...aria}
                    value={values.measure}
                    options={MEASURE_OPTIONS}
                    onChange={(e) => set('measure', e.value as PlanFormValues['measure'])}
                    invalid={invalid}
                    disabled={locked}
                    panelClassName="app-overlay"
                  />
                )}
              </FormField>
              <div className="form-field" role="radiogroup" aria-labelledby="plan-mode-label">
                <span id="plan-mode-label" className="form-field__label">
                  How a tier applies
                </span>
                {COMMISSION_TIER_MODES.map((mode) => (
                  <div key={mode} className="radio-field">
                    <RadioButton
                      inputId={`plan-mode-${mode}`}
                      name="mode"
                      value={mode}
                      checked={values.mode === mode}
                      onChange={() => set('mode', mode)}
                      disabled={locked}
                    />
                    <label htmlFor={`plan-mode-${mode}`}>{MODE_LABELS[mode]}</label>
                  </div>
                ))}
              </div>
            </div>
            <table className="commission-tiers" aria-label="Tiers">
              <thead>
                <tr>
                  <th scope="col">{volume ? 'From monthly volume ($)' : 'From margin (%)'}</th>
                  <th scope="col">Rate (%)</th>
                  <th scope="col">
                    <span className="visually-hidden">Remove</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {values.tiers.map((tier, i) => {
                  const fromError = errorFor(`rate.tiers[${i}].from`);
                  const rateError = errorFor(`rate.tiers[${i}].ratePct`);
                  return (
                    <tr key={i}>
                      <td>
                        <label htmlFor={`tier-${i}-from`} className="visually-hidden">
                          Tier {i + 1} starts at
                        </label>
                        <InputText
                          id={`tier-${i}-from`}
                          value={tier.from}
                          onChange={(e) => setTier(i, 'from', e.target.value)}
                          invalid={!!fromError}
                          aria-invalid={fromError ? true : undefined}
                          aria-describedby={fromError ? `tier-${i}-from-error` : undefined}
                          inputMode="decimal"
                          autoComplete="off"
                          maxLength={16}
                          disabled={locked}
                        />
                        {fromError ? (
                          <small id={`tier-${i}-from-error`} className="form-field__error">
                            {fromError}
                          </small>
                        ) : null}
                      </td>
                      <td>
                        <label htmlFor={`tier-${i}-rate`} className="visually-hidden">
                          Tier {i + 1} rate
                        </label>
                        <InputText
                          id={`tier-${i}-rate`}
                          value={tier.ratePct}
                          onChange={(e) => setTier(i, 'ratePct', e.target.value)}
                          invalid={!!rateError}
                          aria-invalid={rateError ? true : undefined}
                          aria-describedby={rateError ? `tier-${i}-rate-error` : undefined}
                          inputMode="decimal"
                          autoComplete="off"
                          maxLength={10}
                          disabled={locked}
                        />
                        {rateError ? (
                          <small id={`tier-${i}-rate-error`} className="form-field__error">
                            {rateError}
                          </small>
                        ) : null}
                      </td>
                      <td>
                        <Button
                          type="button"
                          icon="pi pi-trash"
                          text
                          severity="secondary"
                          aria-label={`Remove tier ${i + 1}`}
                          disabled={locked || values.tiers.length === 1}
                          onClick={() =>
                            set(
                              'tiers',
                              values.tiers.filter((_, j) => j !== i),
                            )
                          }
                        />
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
            {errorFor('rate.tiers') ? (
              <small className="form-field__error">{errorFor('rate.tiers')}</small>
            ) : null}
            <p className="form-field__hint">
              Each tier runs from its start up to the next tier’s start; below the first tier nothing is paid.
            </p>
            <Button
              type="button"
              label="Add tier"
              icon="pi pi-plus"
              outlined
              size="small"
              disabled={locked || values.tiers.length >= MAX_TIERS}
              onClick={() => set('tiers', [...values.tiers, { from: '', ratePct: '' }])}
            />
          </>
        )}
      </fieldset>

      <FormField
        id="plan-first"
        label="Earned when the deposit has cleared and the cancellation window has closed (%)"
        error={errorFor('firstMilestonePct')}
        hint="The rest is earned when the job is completed. Nothing is earned while the homeowner may still cancel."
        required
      >
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={values.firstMilestonePct}
            onChange={(e) => set('firstMilestonePct', e.target.value)}
            invalid={invalid}
            inputMode="decimal"
            autoComplete="off"
            maxLength={10}
            disabled={locked}
          />
        )}
      </FormField>
      <div className="checkbox-field">
        <Checkbox
          inputId="plan-active"
          checked={values.active}
          onChange={(e) => set('active', !!e.checked)}
        />
        <label htmlFor="plan-active">Active (used for contracts signed from its start date)</label>
      </div>
      <div className="dialog-actions">
        <Button
          type="button"
          label="Cancel"
          severity="secondary"
          outlined
          onClick={onClose}
          disabled={pending}
        />
        <Button
          type="submit"
          label={plan ? 'Save changes' : 'Add plan'}
          icon="pi pi-check"
          loading={pending}
        />
      </div>
    </form>
  );
}
