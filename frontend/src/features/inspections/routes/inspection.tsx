import '@/features/leads/leads.css';
import '../inspections.css';
import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { ConfirmDialog } from 'primereact/confirmdialog';
import { InputTextarea } from 'primereact/inputtextarea';
import { Message } from 'primereact/message';
import { Skeleton } from 'primereact/skeleton';
import { Tag } from 'primereact/tag';
import {
  asSubject,
  CAUTION_CALL_811,
  FINDINGS_CAUTION,
  FINDINGS_ITEM_KEYS,
  type FindingsItemKey,
  type Inspection,
} from '@loambook/common';
import { paths } from '@/app/paths';
import { NotFound } from '@/app/routes/not-found';
import { ApiErrorMessage } from '@/components/api-error-message';
import { PageLoading } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { isApiError } from '@/lib/api-client';
import { formatDateTime } from '@/lib/format';
import { useAppAbility } from '@/features/auth/ability';
import { useCompleteInspection } from '../api/complete-inspection';
import { useInspection } from '../api/get-inspection';
import { useSurvey } from '../api/get-survey';
import { useUpdateInspection } from '../api/update-inspection';
import { CancelInspectionDialog } from '../components/cancel-inspection-dialog';
import { FindingsChecklist } from '../components/findings-checklist';
import { PhotosSection } from '../components/photos-section';
import { RescheduleInspectionDialog } from '../components/reschedule-inspection-dialog';
import { SurveySection } from '../components/survey-section';
import {
  draftDiffers,
  draftFromFindings,
  ITEM_LABEL,
  toFindingsPatch,
  unanswered,
  validateDraft,
  type DraftErrors,
  type FindingsDraft,
} from '../findings-draft';
import { formatWallClock, minutes, STATUS_LABELS, STATUS_SEVERITY, zoneLabel } from '../inspection-format';

export default function InspectionRoute() {
  const { inspectionId = '' } = useParams();
  const inspection = useInspection(inspectionId);
  if (inspection.isPending) return <PageLoading label="Loading inspection" />;
  if (inspection.isError) {
    if (isApiError(inspection.error) && (inspection.error.status === 404 || inspection.error.status === 400))
      return <NotFound />;
    return (
      <div className="page">
        <ApiErrorMessage error={inspection.error} />
      </div>
    );
  }
  return <InspectionPage key={inspection.data.id} inspection={inspection.data} />;
}

/** The server's "findings.interiorCracks.0.widthIn" as the checklist keys it. */
function findingsServerErrors(error: unknown): { fields: DraftErrors; form: string | null } {
  if (!isApiError(error)) return { fields: {}, form: 'Something went wrong. Try again.' };
  const fields: DraftErrors = {};
  const loose: string[] = [];
  for (const f of error.fieldErrors) {
    if (f.field.startsWith('findings.')) fields[f.field.slice('findings.'.length)] = f.message;
    else loose.push(f.message);
  }
  return {
    fields,
    form: loose.length || !Object.keys(fields).length ? [error.message, ...loose].join(' ') : null,
  };
}

function InspectionPage({ inspection }: { inspection: Inspection }) {
  const ability = useAppAbility();
  const notify = useNotify();
  const update = useUpdateInspection();
  const complete = useCompleteInspection();
  const survey = useSurvey(inspection.id);

  const subject = asSubject('Inspection', {
    branchId: inspection.branchId,
    salespersonId: inspection.salespersonId,
  });
  const mayUpdate = ability.can('update', subject);
  const booked = inspection.status === 'booked';
  const editable = mayUpdate && booked;

  const [draft, setDraft] = useState<FindingsDraft>(() => draftFromFindings(inspection.findings));
  const [summary, setSummary] = useState(inspection.summary ?? '');
  const [triedSave, setTriedSave] = useState(false);
  const [serverErrors, setServerErrors] = useState<DraftErrors>({});
  const [findingsMessage, setFindingsMessage] = useState<string | null>(null);
  const [confirming, setConfirming] = useState(false);
  const [changing, setChanging] = useState<null | 'reschedule' | 'cancel'>(null);
  const [refusal, setRefusal] = useState<{ message: string; keys: FindingsItemKey[] } | null>(null);

  const clientErrors = validateDraft(draft);
  const errors = { ...(triedSave ? clientErrors : {}), ...serverErrors };
  const dirty = draftDiffers(draft, inspection.findings) || summary.trim() !== (inspection.summary ?? '');
  const missing = unanswered(draft);

  const changeDraft = (fn: (d: FindingsDraft) => FindingsDraft) => {
    setDraft(fn);
    setServerErrors({});
    setFindingsMessage(null);
  };

  /** Saves the answered items and the summary; false when something stopped it. */
  const saveFindings = async (): Promise<boolean> => {
    setTriedSave(true);
    setFindingsMessage(null);
    if (Object.keys(clientErrors).length) {
      setFindingsMessage('Some findings need attention before they can be saved.');
      return false;
    }
    try {
      await update.mutateAsync({
        id: inspection.id,
        patch: { findings: toFindingsPatch(draft), summary: summary.trim() || null },
      });
      setTriedSave(false);
      return true;
    } catch (error) {
      const mapped = findingsServerErrors(error);
      setServerErrors(mapped.fields);
      setFindingsMessage(mapped.form ?? 'Some findings need attention.');
      return false;
    }
  };

  const doComplete = async () => {
    setRefusal(null);
    if (dirty && !(await saveFindings())) {
      setRefusal({
        message: 'The findings could not be saved, so the inspection was not completed.',
        keys: [],
      });
      return;
    }
    try {
      await complete.mutateAsync({ id: inspection.id, summary: summary.trim() || undefined });
      notify.success('Inspection completed', `${inspection.lead.homeownerName}’s lead is now Inspected.`);
    } catch (error) {
      if (isApiError(error) && error.status === 422) {
        const keys = error.fieldErrors
          .map((f) => f.field.replace(/^findings\./, ''))
          .filter((k): k is FindingsItemKey => (FINDINGS_ITEM_KEYS as readonly string[]).includes(k));
        setRefusal({ message: error.message, keys });
      } else {
        setRefusal({
          message: isApiError(error) ? error.message : 'Something went wrong. Try again.',
          keys: [],
        });
      }
    }
  };

  const { lead } = inspection;
  return (
    <div className="page inspection-page">
      <Link to={paths.lead.href(lead.id)} className="back-link">
        <i className="pi pi-arrow-left" aria-hidden="true" /> {lead.homeownerName}
      </Link>

      <Card className="content-card">
        <header className="inspection-header">
          <div>
            <div className="lead-header__title-row">
              <h1 className="lead-header__name">Inspection · {lead.homeownerName}</h1>
              <Tag value={STATUS_LABELS[inspection.status]} severity={STATUS_SEVERITY[inspection.status]} />
            </div>
            <p className="lead-header__address">
              <i className="pi pi-map-marker" aria-hidden="true" /> {lead.addressLine1}, {lead.city},{' '}
              {lead.state} {lead.postalCode}
            </p>
            <p className="inspection-header__when">
              <i className="pi pi-calendar" aria-hidden="true" />{' '}
              <strong>{formatWallClock(inspection.scheduledLocal)}</strong>{' '}
              <span className="muted">
                {zoneLabel(inspection.timezone, inspection.scheduledUtcOffset)} ·{' '}
                {minutes(inspection.durationMinutes)}
                {inspection.inspector ? ` · ${inspection.inspector.name}` : ' · no inspector assigned'}
              </span>
            </p>
          </div>
          {editable ? (
            <div className="inspection-header__actions">
              <Button
                type="button"
                label="Reschedule"
                icon="pi pi-calendar"
                outlined
                onClick={() => setChanging('reschedule')}
              />
              <Button
                type="button"
                label="Cancel inspection"
                icon="pi pi-calendar-times"
                severity="danger"
                outlined
                onClick={() => setChanging('cancel')}
              />
            </div>
          ) : null}
        </header>
      </Card>
      {editable ? (
        <>
          <RescheduleInspectionDialog
            inspection={inspection}
            visible={changing === 'reschedule'}
            onClose={() => setChanging(null)}
            onDone={(i) => {
              setChanging(null);
              notify.success(
                'Inspection rescheduled',
                `${formatWallClock(i.scheduledLocal)}, ${zoneLabel(i.timezone, i.scheduledUtcOffset)}.`,
              );
            }}
          />
          <CancelInspectionDialog
            inspection={inspection}
            visible={changing === 'cancel'}
            onClose={() => setChanging(null)}
            onDone={() => {
              setChanging(null);
              notify.success('Inspection cancelled', 'It stays on the lead, marked cancelled.');
            }}
          />
        </>
      ) : null}

      {inspection.status === 'completed' ? (
        <Message
          severity="success"
          className="w-full"
          text={`Completed ${formatDateTime(inspection.completedAt)}: this is the record of the visit, and it no longer changes.`}
        />
      ) : inspection.status === 'cancelled' ? (
        <Message
          severity="info"
          className="w-full"
          text="This inspection was cancelled; it is kept for the record."
        />
      ) : !mayUpdate ? (
        <Message
          severity="info"
          className="w-full"
          text="Read only: you can look at this inspection but not change it."
        />
      ) : null}

      <div className="cautions">
        <Message severity="warn" className="w-full" text={CAUTION_CALL_811} />
        <Message severity="info" className="w-full" text={FINDINGS_CAUTION} />
      </div>

      <nav className="section-nav" aria-label="On this page">
        <a href="#findings">
          Findings{' '}
          <span
            className={missing.length ? 'section-nav__count section-nav__count--open' : 'section-nav__count'}
          >
            {FINDINGS_ITEM_KEYS.length - missing.length}/{FINDINGS_ITEM_KEYS.length}
          </span>
        </a>
        <a href="#survey">
          Survey <span className="section-nav__count">{inspection.surveyPointCounts.inspection}</span>
        </a>
        <a href="#photos">
          Photos <span className="section-nav__count">{inspection.photoCount}</span>
        </a>
        <a href="#complete">{booked ? 'Complete' : 'Outcome'}</a>
      </nav>

      <Card className="content-card" id="findings">
        <section aria-labelledby="findings-title" className="inspection-section">
          <h2 id="findings-title" className="lead-section__title">
            Findings checklist
          </h2>
          {findingsMessage ? (
            <Message severity="error" text={findingsMessage} className="form-message" />
          ) : null}
          <FindingsChecklist
            draft={draft}
            onChange={changeDraft}
            errors={errors}
            disabled={!editable}
            flagged={refusal?.keys}
          />
          <div className="form-field inspection-summary">
            <label htmlFor="inspection-summary" className="form-field__label">
              Summary
            </label>
            <InputTextarea
              id="inspection-summary"
              value={summary}
              onChange={(e) => setSummary(e.target.value)}
              rows={3}
              autoResize
              maxLength={4000}
              disabled={!editable}
              placeholder="What you found, in a few lines for the office and the proposal."
              className="w-full"
            />
          </div>
          {editable ? (
            <div className="section-actions section-actions--sticky">
              <span className={dirty ? 'unsaved' : 'muted'}>{dirty ? 'Unsaved changes' : 'All saved'}</span>
              <Button
                type="button"
                label="Save findings"
                icon="pi pi-save"
                loading={update.isPending}
                onClick={async () => {
                  if (await saveFindings()) notify.success('Findings saved');
                }}
              />
            </div>
          ) : null}
        </section>
      </Card>

      <Card className="content-card" id="survey">
        <section aria-labelledby="survey-title" className="inspection-section">
          <h2 id="survey-title" className="lead-section__title">
            Floor-elevation survey
          </h2>
          <p className="muted section-intro">
            Read the floor with a manometer or a laser level; X and Y are feet on your sketch of the house,
            the elevation is inches above (+) or below (−) the reference point.
          </p>
          {survey.isPending ? (
            <Skeleton height="14rem" />
          ) : survey.isError ? (
            <ApiErrorMessage error={survey.error} />
          ) : (
            <SurveySection inspectionId={inspection.id} survey={survey.data} editable={editable} />
          )}
        </section>
      </Card>

      <Card className="content-card" id="photos">
        <section aria-labelledby="photos-title" className="inspection-section">
          <h2 id="photos-title" className="lead-section__title">
            Photos
          </h2>
          <PhotosSection
            inspectionId={inspection.id}
            canUpload={mayUpdate && inspection.status !== 'cancelled'}
            canDelete={editable}
            canEditCaption={mayUpdate}
          />
        </section>
      </Card>

      <Card className="content-card" id="complete">
        <section aria-labelledby="complete-title" className="inspection-section">
          <h2 id="complete-title" className="lead-section__title">
            {booked ? 'Complete the inspection' : 'Outcome'}
          </h2>
          {inspection.status === 'completed' ? (
            <Message
              severity="success"
              className="w-full"
              text={`Completed ${formatDateTime(inspection.completedAt)}. The lead moved to Inspected; the findings and survey are kept as recorded.`}
            />
          ) : inspection.status === 'cancelled' ? (
            <Message severity="info" className="w-full" text="This inspection was cancelled." />
          ) : (
            <>
              <p className="section-intro">
                {missing.length
                  ? `Answer every checklist item first: ${missing.map((k) => ITEM_LABEL[k]).join(', ')}.`
                  : 'Every checklist item is answered. Completing moves the lead to Inspected; the findings and survey can no longer be changed.'}
              </p>
              {refusal ? (
                <Message
                  severity="error"
                  className="w-full form-message"
                  content={
                    <div>
                      <p className="refusal__title">{refusal.message}</p>
                      {refusal.keys.length ? (
                        <ul className="refusal__list">
                          {refusal.keys.map((k) => (
                            <li key={k}>
                              <a href={`#finding-${k}`}>{ITEM_LABEL[k]}</a>
                            </li>
                          ))}
                        </ul>
                      ) : null}
                    </div>
                  }
                />
              ) : null}
              {mayUpdate ? (
                <Button
                  type="button"
                  label="Complete inspection"
                  icon="pi pi-check-circle"
                  severity="success"
                  loading={complete.isPending}
                  onClick={() => setConfirming(true)}
                />
              ) : null}
            </>
          )}
        </section>
      </Card>

      <ConfirmDialog
        visible={confirming}
        onHide={() => setConfirming(false)}
        header="Complete this inspection?"
        icon="pi pi-check-circle"
        message={
          dirty
            ? 'Your unsaved findings are saved first. After completing, the findings and the survey can no longer be changed, and the lead moves to Inspected.'
            : 'After completing, the findings and the survey can no longer be changed, and the lead moves to Inspected.'
        }
        acceptLabel="Yes, complete"
        rejectLabel="Not yet"
        defaultFocus="reject"
        accept={() => {
          setConfirming(false);
          void doComplete();
        }}
        reject={() => setConfirming(false)}
        className="app-dialog"
      />
    </div>
  );
}
