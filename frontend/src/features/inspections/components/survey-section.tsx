import { useMemo, useState } from 'react';
import { Button } from 'primereact/button';
import { Message } from 'primereact/message';
import type { Survey } from '@loambook/common';
import { useNotify } from '@/components/notify';
import { isApiError } from '@/lib/api-client';
import { useDebouncedValue } from '@/features/leads/use-debounced-value';
import { useSaveSurvey } from '../api/save-survey';
import { useSettlementPreview } from '../api/preview-settlement';
import {
  normalisedPoints,
  previewPoints,
  rowsFromPoints,
  startingRows,
  surveyServerErrors,
  toPoints,
  validateSurvey,
  type SurveyErrors,
  type SurveyRow,
} from '../survey-draft';
import { SettlementPanel } from './settlement-panel';
import { SurveyGrid } from './survey-grid';
import { SurveyPlan } from './survey-plan';

/** How long typing must pause before the screening is worked out again (ms). */
export const PREVIEW_DELAY_MS = 400;

interface SurveySectionProps {
  inspectionId: string;
  survey: Survey;
  editable: boolean;
}

/** The floor-elevation survey: the grid, a live screening from the calculator, a plan sketch, and saving. */
export function SurveySection({ inspectionId, survey, editable }: SurveySectionProps) {
  const notify = useNotify();
  const save = useSaveSurvey();
  const [initial] = useState(() => {
    const rows = survey.points.length ? rowsFromPoints(survey.points) : startingRows();
    const ref =
      rows.find((r) => r.label === survey.referenceLabel) ?? (survey.points.length ? null : rows[0]);
    return { rows, referenceKey: ref?.key ?? null };
  });
  const [rows, setRows] = useState<SurveyRow[]>(initial.rows);
  const [referenceKey, setReferenceKey] = useState<string | null>(initial.referenceKey);
  const [savedJson, setSavedJson] = useState(() => normalisedPoints(survey.points));
  const [savedReference, setSavedReference] = useState(survey.referenceLabel);
  const [submitted, setSubmitted] = useState(false);
  const [serverCells, setServerCells] = useState<SurveyErrors>({});
  const [formMessage, setFormMessage] = useState<string | null>(null);

  const clientErrors = validateSurvey(rows, referenceKey);
  const errors: SurveyErrors = {
    ...(submitted ? clientErrors : liveErrors(clientErrors, rows)),
    ...serverCells,
  };

  const referenceLabel = rows.find((r) => r.key === referenceKey)?.label.trim() ?? null;
  const dirty = normalisedPoints(toPoints(rows)) !== savedJson || referenceLabel !== savedReference;

  // The screening follows the grid once typing pauses, from the rows complete enough to use.
  const pointsKey = useDebouncedValue(JSON.stringify(previewPoints(rows)), PREVIEW_DELAY_MS);
  const points = useMemo(() => JSON.parse(pointsKey) as ReturnType<typeof previewPoints>, [pointsKey]);
  const preview = useSettlementPreview(dirty ? points : null);
  const result = dirty ? (points ? preview.data : null) : survey.result;
  const problem = !points
    ? 'Enter at least two complete points to see the screening.'
    : dirty && preview.isError
      ? isApiError(preview.error)
        ? [preview.error.message, ...preview.error.fieldErrors.map((f) => f.message)].join(' ')
        : 'The screening could not be worked out.'
      : null;

  const changeRows = (update: (r: SurveyRow[]) => SurveyRow[]) => {
    setRows(update);
    setServerCells({});
    setFormMessage(null);
  };

  const submit = async () => {
    setSubmitted(true);
    setFormMessage(null);
    if (Object.keys(clientErrors).length) {
      setFormMessage('Some readings need attention before the survey can be saved.');
      return;
    }
    try {
      const saved = await save.mutateAsync({
        id: inspectionId,
        kind: 'inspection',
        request: { points: toPoints(rows), referenceLabel: referenceLabel! },
      });
      setSavedJson(normalisedPoints(saved.points));
      setSavedReference(saved.referenceLabel);
      setSubmitted(false);
      notify.success(
        'Survey saved',
        saved.result?.worstRatio
          ? `Worst neighbouring pair ${saved.result.worstRatio}.`
          : `${saved.points.length} points.`,
      );
    } catch (error) {
      const mapped = surveyServerErrors(error, rows);
      setServerCells(mapped.cells);
      setFormMessage(mapped.form);
    }
  };

  const planPoints = points ?? [];
  return (
    <div className="survey">
      <div className="survey__work">
        <div className="survey__grid">
          {formMessage ? <Message severity="error" text={formMessage} className="form-message" /> : null}
          <SurveyGrid
            rows={rows}
            referenceKey={referenceKey}
            onRowsChange={changeRows}
            onReferenceChange={(k) => {
              setReferenceKey(k);
              setServerCells({});
            }}
            errors={errors}
            disabled={!editable}
          />
          {editable ? (
            <div className="section-actions">
              {dirty ? (
                <span className="unsaved">Unsaved changes</span>
              ) : (
                <span className="muted">Saved</span>
              )}
              <Button
                type="button"
                label="Save survey"
                icon="pi pi-save"
                onClick={() => void submit()}
                loading={save.isPending}
              />
            </div>
          ) : null}
        </div>
        <div className="survey__result">
          <SettlementPanel
            result={result}
            busy={dirty && preview.isFetching}
            problem={problem}
            live={dirty}
          />
          <SurveyPlan
            points={planPoints.length ? planPoints : dirty ? [] : survey.points}
            referenceLabel={referenceLabel}
            worstPair={result?.worstPair ?? null}
          />
        </div>
      </div>
    </div>
  );
}

/** Before the first save attempt, only faults in what has been typed show (not the empty new row). */
function liveErrors(errors: SurveyErrors, rows: SurveyRow[]): SurveyErrors {
  const shown: SurveyErrors = {};
  for (const r of rows) {
    for (const c of ['label', 'xFt', 'yFt', 'elevationIn'] as const) {
      const e = errors[`${r.key}.${c}`];
      if (e && (r[c].trim() !== '' || c === 'label')) shown[`${r.key}.${c}`] = e;
    }
  }
  return shown;
}
