import { useState } from 'react';
import type { FormEvent } from 'react';
import { keepPreviousData, useQuery, useQueryClient } from '@tanstack/react-query';
import { Button } from 'primereact/button';
import { Checkbox } from 'primereact/checkbox';
import { Dialog } from 'primereact/dialog';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import {
  DEFAULT_INJECTION_SPACING_FT,
  type InjectionPlanResult,
  type PierPlanResult,
} from '@loambook/common';
import { FormField } from '@/components/form-field';
import { isApiError } from '@/lib/api-client';
import { runInjectionPlan, runPierPlan } from '../api/run-plan-calculator';

/** Which calculator fills the line: injection points / material, or piers along a run. */
export type PlanKind = 'injection' | 'pier';

export interface PlanTarget {
  kind: PlanKind;
  /** The line's unit: 'point' takes the points, 'lb' the material, 'each' the piers. */
  unit: string;
  itemLabel: string;
}

interface PlanDialogProps {
  target: PlanTarget | null;
  onClose: () => void;
  onUse: (quantity: string) => void;
}

const POSITIVE = /^(?:\d{1,7}(?:\.\d{1,4})?|\.\d{1,4})$/;
const looksPositive = (v: string) => POSITIVE.test(v.trim()) && /[1-9]/.test(v);

export function PlanDialog({ target, onClose, onUse }: PlanDialogProps) {
  return (
    <Dialog
      visible={target !== null}
      onHide={onClose}
      header={target?.kind === 'pier' ? 'Piers from run' : 'Points from injection plan'}
      className="app-dialog"
      style={{ width: '32rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1rem)' }}
      draggable={false}
      resizable={false}
    >
      {target ? (
        <PlanForm key={`${target.kind}-${target.unit}`} target={target} onClose={onClose} onUse={onUse} />
      ) : null}
    </Dialog>
  );
}

type Result = InjectionPlanResult | PierPlanResult;

function quantityFrom(target: PlanTarget, result: Result): string {
  if ('piers' in result) return String(result.piers);
  return target.unit === 'lb' ? result.totalLb : String(result.points);
}

function PlanForm({
  target,
  onClose,
  onUse,
}: {
  target: PlanTarget;
  onClose: () => void;
  onUse: (q: string) => void;
}) {
  const queryClient = useQueryClient();
  const [runLengthFt, setRunLength] = useState('');
  // Injection points about every 5 ft (common practice); pier spacing comes from the design: no default.
  const [spacingFt, setSpacing] = useState(target.kind === 'injection' ? DEFAULT_INJECTION_SPACING_FT : '');
  const [closed, setClosed] = useState(false);
  const [submitted, setSubmitted] = useState(false);
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [pending, setPending] = useState(false);

  const input = { runLengthFt: runLengthFt.trim(), spacingFt: spacingFt.trim(), closed };
  const ready = looksPositive(input.runLengthFt) && looksPositive(input.spacingFt);
  const queryKey = ['calculators', target.kind === 'pier' ? 'pier-plan' : 'injection-plan', input] as const;
  const run = (): Promise<Result> => (target.kind === 'pier' ? runPierPlan(input) : runInjectionPlan(input));
  const result = useQuery<Result>({
    queryKey,
    queryFn: run,
    enabled: ready,
    staleTime: Infinity,
    placeholderData: keepPreviousData,
    retry: false,
  });

  const clientErrors: Record<string, string> = {};
  if (!looksPositive(input.runLengthFt))
    clientErrors.runLengthFt = 'Enter the length of the run in feet, e.g. 42.';
  if (!looksPositive(input.spacingFt))
    clientErrors.spacingFt =
      target.kind === 'pier'
        ? 'Enter the pier spacing from the design, in feet.'
        : 'Enter the spacing in feet, e.g. 5.';
  const liveError = result.error && isApiError(result.error) ? result.error : null;
  const liveFields = Object.fromEntries((liveError?.fieldErrors ?? []).map((f) => [f.field, f.message]));
  const errorFor = (f: 'runLengthFt' | 'spacingFt') =>
    serverErrors[f] ?? (submitted ? clientErrors[f] : undefined) ?? (ready ? liveFields[f] : undefined);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    // The dialog is portalled, but React still bubbles its submit to a form around the dialog's owner.
    event.stopPropagation();
    setSubmitted(true);
    setServerErrors({});
    if (!ready) return;
    setPending(true);
    try {
      const data = await queryClient.fetchQuery<Result>({
        queryKey,
        queryFn: run,
        staleTime: Infinity,
        retry: false,
      });
      onUse(quantityFrom(target, data));
    } catch (error) {
      const fields = isApiError(error)
        ? Object.fromEntries(error.fieldErrors.map((f) => [f.field, f.message]))
        : {};
      setServerErrors(
        Object.keys(fields).length
          ? fields
          : { runLengthFt: isApiError(error) ? error.message : 'Try again.' },
      );
    } finally {
      setPending(false);
    }
  };

  const data = ready && !result.isPlaceholderData ? result.data : undefined;
  const useLabel = target.kind === 'pier' ? 'Use these piers' : 'Use these points';

  return (
    <form onSubmit={submit} noValidate className="dialog-form plan-form" aria-label={useLabel}>
      <p className="dialog-intro">For {target.itemLabel}</p>
      <div className="form-grid">
        <FormField id="plan-run-length" label="Run length (ft)" error={errorFor('runLengthFt')} required>
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              value={runLengthFt}
              onChange={(e) => setRunLength(e.target.value)}
              invalid={invalid}
              inputMode="decimal"
              autoComplete="off"
              autoFocus
            />
          )}
        </FormField>
        <FormField
          id="plan-spacing"
          label="Spacing (ft)"
          error={errorFor('spacingFt')}
          hint={
            target.kind === 'pier'
              ? 'From the design: loads, footing and pier capacity set it.'
              : 'About 5 ft is common practice.'
          }
          required
        >
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              value={spacingFt}
              onChange={(e) => setSpacing(e.target.value)}
              invalid={invalid}
              inputMode="decimal"
              autoComplete="off"
            />
          )}
        </FormField>
      </div>
      <div className="checkbox-field">
        <Checkbox inputId="plan-closed" checked={closed} onChange={(e) => setClosed(!!e.checked)} />
        <label htmlFor="plan-closed">Closed perimeter (the run goes all the way round)</label>
      </div>
      <div className="plan-result" aria-live="polite">
        {data ? (
          'piers' in data ? (
            <>
              <p className="plan-result__main">
                <strong>{data.piers}</strong> piers
              </p>
              {data.endGapFt !== null && data.endGapFt !== '0' ? (
                <p className="plan-result__detail">
                  The last pier stands {data.endGapFt} ft short of the end.
                </p>
              ) : null}
            </>
          ) : (
            <>
              <p className="plan-result__main">
                <strong>{data.points}</strong> points · <strong>{data.totalLb}</strong> lb of material
              </p>
              <p className="plan-result__detail">
                {data.lbPerPoint} lb per point, {data.drumSets} drum set{data.drumSets === 1 ? '' : 's'}
                {data.endGapFt !== null && data.endGapFt !== '0'
                  ? `; the last point stands ${data.endGapFt} ft short of the end`
                  : ''}
                .
              </p>
              <p className="plan-result__fills">
                Fills the quantity with{' '}
                {target.unit === 'lb' ? `${data.totalLb} lb` : `${data.points} points`}.
              </p>
            </>
          )
        ) : (
          <p className="plan-result__detail muted">
            {result.isFetching ? 'Working it out…' : 'Enter the run to see the count.'}
          </p>
        )}
        {data?.cautions.length ? (
          <ul className="plan-result__cautions">
            {data.cautions.slice(0, 1).map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        ) : null}
      </div>
      {serverErrors.form ? <Message severity="error" text={serverErrors.form} /> : null}
      <div className="dialog-actions">
        <Button
          type="button"
          label="Cancel"
          severity="secondary"
          outlined
          onClick={onClose}
          disabled={pending}
        />
        <Button type="submit" label={useLabel} icon="pi pi-check" loading={pending} />
      </div>
    </form>
  );
}
