import '@/features/inspections/inspections.css';
import '@/features/signing/signing.css';
import { useEffect, useMemo, useRef, useState } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { InputTextarea } from 'primereact/inputtextarea';
import { Message } from 'primereact/message';
import {
  CalculatorInputError,
  money,
  settlement,
  type CompletionChecklist,
  type JobDetail,
  type SettlementResult,
  type SurveyComparison,
} from '@loambook/common';
import { FormField } from '@/components/form-field';
import { isApiError } from '@/lib/api-client';
import { SettlementPanel } from '@/features/inspections/components/settlement-panel';
import { SurveyGrid } from '@/features/inspections/components/survey-grid';
import {
  previewPoints,
  rowKey,
  startingRows,
  toPoints,
  validateSurvey,
  type SurveyRow,
} from '@/features/inspections/survey-draft';
import { SignaturePad } from '@/features/signing/components/signature-pad';
import { useCompleteJob } from '../api/complete-job';
import { RefusalMessage } from './refusal-message';
import { SurveyComparisonTables } from './survey-comparison-view';

export const CHECKLIST_ITEMS: { key: keyof CompletionChecklist; label: string; hint: string }[] = [
  { key: 'siteCleaned', label: 'Site cleaned up', hint: 'Spoil, cores, drums, fittings and packaging gone.' },
  {
    key: 'injectionHolesPatched',
    label: 'Injection holes and access pits closed',
    hint: 'Holes patched to match; pier and pile excavations back-filled and compacted.',
  },
  {
    key: 'plumbingChecked',
    label: 'Plumbing checked',
    hint: 'Lifting can break pipes: run water and check drains and the water meter for leaks.',
  },
  {
    key: 'doorsWindowsChecked',
    label: 'Doors and windows checked',
    hint: 'Open and close each one that stuck before; note any new cracks in finishes.',
  },
  {
    key: 'drainageRestored',
    label: 'Drainage put back',
    hint: 'Downspouts, extensions and grading as they were, or better.',
  },
  {
    key: 'homeownerWalkthrough',
    label: 'Walked the work with the homeowner',
    hint: 'Shown what was done and where.',
  },
];

type Answers = Partial<Record<keyof CompletionChecklist, boolean>>;
const STEPS = ['Checklist', 'Re-survey', 'Before and after', 'Homeowner sign-off', 'Confirm'] as const;
export const MIN_RESURVEY_POINTS = 3;

/** The inspection's points as the starting grid: same labels and positions, new readings to take. */
function rowsFromBefore(before: SurveyComparison['before']): { rows: SurveyRow[]; ref: string | null } {
  if (!before.length) {
    const rows = startingRows();
    return { rows, ref: rows[0]!.key };
  }
  const refIndex = Math.max(
    0,
    before.findIndex((p) => {
      try {
        return money(p.elevationIn).isZero();
      } catch {
        return false;
      }
    }),
  );
  const rows = before.map((p, i) => ({
    key: rowKey(),
    label: p.label,
    xFt: p.xFt,
    yFt: p.yFt,
    elevationIn: i === refIndex ? '0' : '',
  }));
  return { rows, ref: rows[refIndex]!.key };
}

function screen(rows: SurveyRow[]): { result: SettlementResult | null; problem: string | null } {
  const points = previewPoints(rows);
  if (!points) return { result: null, problem: 'Enter at least two readings to see the figures.' };
  try {
    return { result: settlement({ points }), problem: null };
  } catch (error) {
    if (error instanceof CalculatorInputError) return { result: null, problem: error.message };
    return { result: null, problem: 'These readings cannot be screened.' };
  }
}

const isZero = (v: string) => {
  try {
    return money(v).isZero();
  } catch {
    return false;
  }
};

/** The re-survey on screen against the inspection's, worked out here before anything is sent. */
function afterComparison(
  before: SurveyComparison,
  rows: SurveyRow[],
  referenceLabel: string | null,
  result: SettlementResult | null,
): SurveyComparison {
  const after = toPoints(rows);
  // The inspection's reference is its point reading 0; the same label here means like is compared with like.
  const beforeRef = before.before.find((p) => isZero(p.elevationIn))?.label ?? null;
  const changes = after.flatMap((a) => {
    const b = before.before.find((p) => p.label === a.label);
    if (!b) return [];
    try {
      return [
        {
          label: a.label,
          beforeIn: b.elevationIn,
          afterIn: a.elevationIn,
          changeIn: money(a.elevationIn).minus(money(b.elevationIn)).toFixed(2),
        },
      ];
    } catch {
      return [];
    }
  });
  return {
    ...before,
    after,
    afterMaxDifferentialIn: result?.maxDifferentialIn ?? null,
    afterWorstRatio: result?.worstRatio ?? null,
    afterBand: result?.band.label ?? null,
    sameReference: beforeRef !== null && referenceLabel !== null ? beforeRef === referenceLabel : undefined,
    changes,
  };
}

/**
 * Completion with the homeowner on site: the checklist, a new floor survey against the inspection's, the
 * homeowner's signature, then the confirmation. Nothing is sent before the last step.
 */
export function CompletionWizard({
  job,
  before,
  onCompleted,
  onCancel,
}: {
  job: JobDetail;
  before: SurveyComparison;
  onCompleted: (job: JobDetail) => void;
  onCancel: () => void;
}) {
  const complete = useCompleteJob();
  const [step, setStep] = useState(0);
  const [answers, setAnswers] = useState<Answers>({});
  const initial = useMemo(() => rowsFromBefore(before.before), [before.before]);
  const [rows, setRows] = useState<SurveyRow[]>(initial.rows);
  const [referenceKey, setReferenceKey] = useState<string | null>(initial.ref);
  const [homeownerName, setHomeownerName] = useState(job.homeownerName);
  const [signature, setSignature] = useState<string | null>(null);
  const [note, setNote] = useState('');
  const [tried, setTried] = useState<Record<number, boolean>>({});
  const [error, setError] = useState<unknown>(null);

  const unanswered = CHECKLIST_ITEMS.filter((i) => answers[i.key] === undefined);
  const surveyErrors = validateSurvey(rows, referenceKey);
  const tooFew = rows.length < MIN_RESURVEY_POINTS;
  const surveyOk = Object.keys(surveyErrors).length === 0 && !tooFew;
  const nameError = homeownerName.trim() ? null : 'The homeowner’s name, as they sign.';
  const signatureError = signature ? null : 'The homeowner’s signature is needed to complete the job.';
  const { result, problem } = useMemo(() => screen(rows), [rows]);

  const stepOk = (s: number) =>
    s === 0 ? unanswered.length === 0 : s === 1 ? surveyOk : s === 3 ? !nameError && !signatureError : true;

  const next = () => {
    setTried((t) => ({ ...t, [step]: true }));
    if (!stepOk(step)) return;
    setStep((s) => Math.min(s + 1, STEPS.length - 1));
  };

  // Each new step starts at its heading: focus for a screen reader, scrolled into view on a phone.
  const titleRef = useRef<HTMLHeadingElement>(null);
  const firstRender = useRef(true);
  useEffect(() => {
    if (firstRender.current) {
      firstRender.current = false;
      return;
    }
    titleRef.current?.focus();
    titleRef.current?.scrollIntoView?.({ block: 'start' });
  }, [step]);

  const finish = async () => {
    setTried({ 0: true, 1: true, 3: true, 4: true });
    setError(null);
    const firstBad = [0, 1, 3].find((s) => !stepOk(s));
    if (firstBad !== undefined) {
      setStep(firstBad);
      return;
    }
    const ref = rows.find((r) => r.key === referenceKey);
    try {
      const done = await complete.mutateAsync({
        id: job.id,
        input: {
          checklist: Object.fromEntries(
            CHECKLIST_ITEMS.map((i) => [i.key, answers[i.key]!]),
          ) as unknown as CompletionChecklist,
          resurvey: toPoints(rows).map((p) => ({ ...p, isReference: p.label === ref?.label.trim() })),
          homeownerName: homeownerName.trim(),
          signaturePng: signature!,
          note: note.trim() || null,
        },
      });
      onCompleted(done);
    } catch (e) {
      setError(e);
    }
  };

  const shown = tried[step];

  return (
    <div className="wizard">
      <ol className="wizard__steps" aria-label="Steps">
        {STEPS.map((s, i) => (
          <li
            key={s}
            className={
              i === step
                ? 'wizard__step wizard__step--on'
                : i < step
                  ? 'wizard__step wizard__step--done'
                  : 'wizard__step'
            }
            aria-current={i === step ? 'step' : undefined}
          >
            <span className="wizard__step-n">
              {i < step ? <i className="pi pi-check" aria-hidden="true" /> : i + 1}
            </span>
            <span className="wizard__step-label">{s}</span>
          </li>
        ))}
      </ol>

      <section className="wizard__body" aria-labelledby="wizard-step-title">
        <h2 id="wizard-step-title" className="wizard__title" ref={titleRef} tabIndex={-1}>
          {step + 1}. {STEPS[step]}
        </h2>

        {step === 0 ? (
          <fieldset className="checklist">
            <legend className="muted">Answer each one; a “No” is recorded with the job.</legend>
            {CHECKLIST_ITEMS.map((item) => {
              const missing = shown && answers[item.key] === undefined;
              return (
                <div
                  key={item.key}
                  className={missing ? 'checklist__item checklist__item--missing' : 'checklist__item'}
                >
                  <div className="checklist__text" id={`check-${item.key}`}>
                    <span className="strong">{item.label}</span>
                    <span className="muted">{item.hint}</span>
                  </div>
                  <div className="checklist__answers" role="radiogroup" aria-labelledby={`check-${item.key}`}>
                    {[true, false].map((v) => (
                      <label
                        key={String(v)}
                        className={answers[item.key] === v ? 'yes-no yes-no--on' : 'yes-no'}
                      >
                        <input
                          type="radio"
                          name={`check-${item.key}`}
                          checked={answers[item.key] === v}
                          onChange={() => setAnswers((a) => ({ ...a, [item.key]: v }))}
                        />
                        <span>{v ? 'Yes' : 'No'}</span>
                      </label>
                    ))}
                  </div>
                  {missing ? <small className="form-field__error">Answer Yes or No.</small> : null}
                </div>
              );
            })}
          </fieldset>
        ) : null}

        {step === 1 ? (
          <div className="wizard__survey">
            <p className="muted">
              The inspection’s points are listed with their positions: take a new reading at each, with the
              same reference point reading 0. At least {MIN_RESURVEY_POINTS} points.
            </p>
            <SurveyGrid
              rows={rows}
              referenceKey={referenceKey}
              onRowsChange={(update) => setRows(update)}
              onReferenceChange={setReferenceKey}
              errors={shown ? surveyErrors : {}}
              disabled={false}
            />
            {shown && tooFew ? (
              <p className="form-field__error">A re-survey needs at least {MIN_RESURVEY_POINTS} points.</p>
            ) : null}
            <SettlementPanel result={result} busy={false} problem={problem} live />
          </div>
        ) : null}

        {step === 2 ? (
          <SurveyComparisonTables
            comparison={afterComparison(
              before,
              rows,
              rows.find((r) => r.key === referenceKey)?.label.trim() ?? null,
              result,
            )}
          />
        ) : null}

        {/* Kept mounted while hidden: the drawn signature stays when the crew lead steps back and forth. */}
        <div className="signoff" hidden={step !== 3}>
          <p id="signoff-meaning" className="signoff__meaning">
            By signing, {homeownerName.trim() || 'the homeowner'} confirms that the crew has finished the work
            on this job at {job.addressLine1} and walked it through with them. It does not waive any warranty
            or any right under the contract.
          </p>
          <FormField
            id="signoff-name"
            label="Homeowner’s full name"
            error={shown ? nameError : null}
            required
          >
            {({ invalid, ...control }) => (
              <InputText
                {...control}
                value={homeownerName}
                maxLength={120}
                autoComplete="off"
                onChange={(e) => setHomeownerName(e.target.value)}
                invalid={invalid}
                className="w-full field-input"
              />
            )}
          </FormField>
          <SignaturePad onChange={setSignature} describedBy="signoff-meaning" />
          {shown && signatureError ? (
            <p className="form-field__error" role="alert">
              <i className="pi pi-exclamation-circle" aria-hidden="true" /> {signatureError}
            </p>
          ) : null}
          <FormField id="signoff-note" label="Anything the homeowner wants noted">
            {({ invalid, ...control }) => (
              <InputTextarea
                {...control}
                value={note}
                rows={2}
                maxLength={4000}
                onChange={(e) => setNote(e.target.value)}
                invalid={invalid}
                className="w-full field-input"
              />
            )}
          </FormField>
        </div>

        {step === 4 ? (
          <div className="wizard__confirm">
            <ul className="wizard__summary">
              <li>
                <i className="pi pi-check-square" aria-hidden="true" /> Checklist:{' '}
                {CHECKLIST_ITEMS.filter((i) => answers[i.key]).length} of {CHECKLIST_ITEMS.length} “Yes”
                {CHECKLIST_ITEMS.some((i) => answers[i.key] === false)
                  ? ` (No: ${CHECKLIST_ITEMS.filter((i) => answers[i.key] === false)
                      .map((i) => i.label.toLowerCase())
                      .join(', ')})`
                  : ''}
              </li>
              <li>
                <i className="pi pi-sliders-h" aria-hidden="true" /> Re-survey: {rows.length} points
                {result ? `, max differential ${result.maxDifferentialIn} in` : ''}
              </li>
              <li>
                <i className="pi pi-pencil" aria-hidden="true" />{' '}
                {signature ? `Signed by ${homeownerName.trim()}` : 'Not signed yet'}
              </li>
            </ul>
            {shown && signatureError ? (
              <Message severity="error" className="w-full" text={signatureError} />
            ) : null}
            <p className="muted">
              Completing moves the job and the lead to completed, and tells the office to invoice the balance.
              It cannot be undone from the phone.
            </p>
            {error ? (
              <>
                <RefusalMessage error={error} />
                {isApiError(error) && error.fieldErrors.length ? (
                  <ul className="form-field__error">
                    {error.fieldErrors.map((f) => (
                      <li key={f.field}>{f.message}</li>
                    ))}
                  </ul>
                ) : null}
              </>
            ) : null}
          </div>
        ) : null}
      </section>

      <div className="wizard__nav">
        {step === 0 ? (
          <Button type="button" label="Back to the job" text onClick={onCancel} />
        ) : (
          <Button
            type="button"
            label="Back"
            icon="pi pi-arrow-left"
            text
            onClick={() => setStep((s) => s - 1)}
          />
        )}
        {step < STEPS.length - 1 ? (
          <Button
            type="button"
            label="Next"
            icon="pi pi-arrow-right"
            iconPos="right"
            size="large"
            onClick={next}
          />
        ) : (
          <Button
            type="button"
            label="Complete the job"
            icon="pi pi-flag"
            size="large"
            loading={complete.isPending}
            onClick={() => void finish()}
          />
        )}
      </div>
      {shown && !stepOk(step) && step === 0 ? (
        <p className="form-field__error wizard__left" role="alert">
          {unanswered.length === 1 ? '1 item is' : `${unanswered.length} items are`} not answered yet.
        </p>
      ) : null}
    </div>
  );
}
