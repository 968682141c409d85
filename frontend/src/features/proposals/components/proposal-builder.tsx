import { useEffect, useMemo, useState } from 'react';
import type { FormEvent, ReactNode } from 'react';
import { Button } from 'primereact/button';
import { ConfirmDialog } from 'primereact/confirmdialog';
import { InputTextarea } from 'primereact/inputtextarea';
import { Message } from 'primereact/message';
import { TabPanel, TabView } from 'primereact/tabview';
import {
  combineDecisions,
  formatUsd,
  type ApprovalDecision,
  type Branch,
  type CreateProposalRequest,
  type Inspection,
  type OptionTax,
  type PriceBookItem,
  type ProposalDetail,
  type Role,
} from '@loambook/common';
import { FormField } from '@/components/form-field';
import { Select } from '@/components/select';
import { isApiError } from '@/lib/api-client';
import { formatDate } from '@/lib/format';
import { viewerLimits } from '../approval-wording';
import {
  draftToRequest,
  emptyOption,
  heldPrices,
  MAX_OPTIONS,
  previewApproval,
  previewCommission,
  previewOption,
  sameDraft,
  validateDraft,
  type OptionDraft,
  type PricingContext,
  type ProposalDraft,
} from '../proposal-draft';
import { OptionEditor } from './option-editor';
import { OptionFigures } from './option-figures';
import { OptionLinesTable } from './option-read-view';
import { PlanDialog, type PlanTarget } from './plan-dialog';

export interface BuilderViewer {
  role: Role;
  /** The proposal is this person's own (their commission). */
  isSalesperson: boolean;
}

interface ProposalBuilderProps {
  initial: ProposalDraft;
  saved: ProposalDetail | null;
  /** The branch's price book, deactivated items included (a line may still name one). */
  items: PriceBookItem[];
  branch: Branch;
  viewer: BuilderViewer;
  inspections: Inspection[];
  /** 'read': the saved version as it is, nothing to change. */
  mode: 'edit' | 'read';
  /** Show "Submit for approval" / "Mark ready to send". */
  canSubmit: boolean;
  /** Above the buttons: what saving will do (a new version, back to draft…). */
  saveHint?: ReactNode;
  pending: 'save' | 'submit' | null;
  onSave: (request: CreateProposalRequest) => Promise<unknown>;
  /** Submit; `dirty` says whether the changes must be saved first. */
  onSubmit: (request: CreateProposalRequest, dirty: boolean) => Promise<unknown>;
  onDirtyChange?: (dirty: boolean) => void;
}

/** The server's field names that the form shows at a field (the rest go above the form). */
const FIELD_PATTERN =
  /^(inspectionId|notes|options\.\d+\.(title|description|lines|discount\.(kind|value)|lines\.\d+\.(priceBookItemId|quantity)))$/;

const optionHasError = (errors: Record<string, string>, i: number) =>
  Object.keys(errors).some((k) => k.startsWith(`options.${i}.`) || k === `options.${i}`);

export function ProposalBuilder(props: ProposalBuilderProps) {
  if (props.mode === 'read' && props.saved) return <ReadOnlyOptions {...props} saved={props.saved} />;
  return <EditableBuilder {...props} />;
}

function useLimits(viewer: BuilderViewer, branch: Branch) {
  return useMemo(() => viewerLimits(viewer.role, branch), [viewer.role, branch]);
}

function ReadOnlyOptions({ saved, branch, viewer }: ProposalBuilderProps & { saved: ProposalDetail }) {
  const [active, setActive] = useState(0);
  const limits = useLimits(viewer, branch);
  const options = [...saved.options].sort((a, b) => a.position - b.position);
  return (
    <TabView activeIndex={active} onTabChange={(e) => setActive(e.index)} className="option-tabs" scrollable>
      {options.map((o) => (
        <TabPanel key={o.id} header={`${o.position}. ${o.title}`}>
          <div className="option-layout">
            <div className="option-layout__main">
              {o.description ? <p className="option-description">{o.description}</p> : null}
              <OptionLinesTable option={o} />
            </div>
            <aside className="option-layout__side">
              <OptionFigures
                totals={o.totals}
                tax={saved.tax}
                // What submitting would need matters only until the version is decided.
                approval={saved.status === 'pending_approval' ? o.approval : null}
                limits={limits}
                commission={o.commission}
                commissionIsViewers={viewer.isSalesperson}
                preview={false}
              />
            </aside>
          </div>
        </TabPanel>
      ))}
    </TabView>
  );
}

function EditableBuilder({
  initial,
  saved,
  items,
  branch,
  viewer,
  inspections,
  canSubmit,
  saveHint,
  pending,
  onSave,
  onSubmit,
  onDirtyChange,
}: ProposalBuilderProps) {
  const [baseline] = useState(initial);
  const [draft, setDraft] = useState(initial);
  const [active, setActive] = useState(0);
  const [submitted, setSubmitted] = useState(false);
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [formMessage, setFormMessage] = useState<string | null>(null);
  const [plan, setPlan] = useState<{ optionKey: string; lineKey: string; target: PlanTarget } | null>(null);
  const [removing, setRemoving] = useState<number | null>(null);
  const limits = useLimits(viewer, branch);

  const ctx = useMemo<PricingContext>(() => {
    const map = new Map(items.map((i) => [i.id, i]));
    const held = heldPrices(saved);
    // The server prices a save with the branch's tax set-up as it is now.
    const tax: OptionTax = { treatment: branch.salesTaxTreatment, ratePct: branch.salesTaxRatePct };
    return { items: map, held, tax };
  }, [items, saved, branch]);

  const dirty = !sameDraft(draft, baseline);
  useEffect(() => onDirtyChange?.(dirty), [dirty, onDirtyChange]);

  const savedOptions = useMemo(
    () => [...(saved?.options ?? [])].sort((a, b) => a.position - b.position),
    [saved],
  );
  const commissionRate = savedOptions[0]?.commission.ratePct ?? null;

  // Per option: the server's figures while the option is as saved, else the live preview.
  const figures = draft.options.map((o, i) => {
    const savedOption = savedOptions[i];
    const base = baseline.options[i];
    const unchanged =
      !!savedOption &&
      !!base &&
      baseline.options.length === savedOptions.length &&
      sameDraft({ ...draft, options: [o] }, { ...draft, options: [base] });
    if (unchanged && savedOption) {
      return {
        preview: false,
        totals: savedOption.totals,
        // An approved version's saved decision is history: show it only while it still has to be asked for.
        approval: (saved?.status === 'approved' ? null : savedOption.approval) as ApprovalDecision | null,
        commission: savedOption.commission as { ratePct: string; amount: string } | null,
        incompleteLines: 0,
        problem: null as string | null,
      };
    }
    const p = previewOption(o, ctx);
    const amount = previewCommission(p.totals, commissionRate);
    return {
      preview: true,
      totals: p.totals,
      approval: previewApproval(p.totals, viewer.role, branch),
      commission: amount && commissionRate ? { ratePct: commissionRate, amount } : null,
      incompleteLines: p.incompleteLines,
      problem: p.problem,
    };
  });

  const clientErrors = validateDraft(
    draft,
    figures.map((f) => (f.totals ? { totals: f.totals, incompleteLines: 0, problem: null } : null)),
  );
  const errors: Record<string, string> = { ...(submitted ? clientErrors : {}), ...serverErrors };
  const errorFor = (field: string) => errors[field];

  const decisions = figures.map((f) => f.approval).filter((d): d is ApprovalDecision => d !== null);
  const overall = !dirty && saved ? saved.approval : decisions.length ? combineDecisions(decisions) : null;
  const needsApproval = overall?.needsApproval ?? false;

  const updateOption = (i: number, next: OptionDraft) => {
    setDraft((d) => ({ ...d, options: d.options.map((o, j) => (j === i ? next : o)) }));
    setServerErrors((s) => {
      const kept = Object.fromEntries(Object.entries(s).filter(([k]) => !k.startsWith(`options.${i}.`)));
      return Object.keys(kept).length === Object.keys(s).length ? s : kept;
    });
  };

  const addOption = () => {
    setDraft((d) => ({ ...d, options: [...d.options, emptyOption(d.options.length + 1)] }));
    setActive(draft.options.length);
  };

  const removeOption = (i: number) => {
    setDraft((d) => ({ ...d, options: d.options.filter((_, j) => j !== i) }));
    setServerErrors({});
    setActive((a) => Math.max(0, Math.min(a, draft.options.length - 2)));
  };

  const attempt = async (run: (request: CreateProposalRequest) => Promise<unknown>) => {
    setSubmitted(true);
    setFormMessage(null);
    setServerErrors({});
    if (Object.keys(clientErrors).length > 0) {
      setFormMessage('Some fields need attention.');
      const first = draft.options.findIndex((_, i) => optionHasError(clientErrors, i));
      if (first >= 0) setActive(first);
      return;
    }
    try {
      await run(draftToRequest(draft));
    } catch (error) {
      if (!isApiError(error)) {
        setFormMessage('Something went wrong. Try again.');
        return;
      }
      const fields: Record<string, string> = {};
      const unplaced: string[] = [];
      for (const f of error.fieldErrors) {
        if (FIELD_PATTERN.test(f.field))
          fields[f.field] = fields[f.field] ? `${fields[f.field]} ${f.message}` : f.message;
        else unplaced.push(f.message);
      }
      setServerErrors(fields);
      setFormMessage(
        unplaced.length
          ? [error.message, ...unplaced].join(' ')
          : Object.keys(fields).length
            ? 'Some fields need attention.'
            : error.message,
      );
      const first = draft.options.findIndex((_, i) => optionHasError(fields, i));
      if (first >= 0) setActive(first);
    }
  };

  const save = (event: FormEvent) => {
    event.preventDefault();
    void attempt(onSave);
  };

  const completed = inspections.filter((i) => i.status === 'completed');
  const inspectionOptions = completed.map((i) => ({
    label: `Inspected ${formatDate(i.completedAt ?? i.scheduledAt)}${i.summary ? ` · ${i.summary.slice(0, 60)}` : ''}`,
    value: i.id,
  }));

  const activeIndex = Math.min(active, draft.options.length - 1);

  return (
    <>
      <form onSubmit={save} noValidate className="proposal-builder" aria-label="Proposal">
        {formMessage ? <Message severity="error" text={formMessage} className="form-message" /> : null}
        <div className="proposal-builder__top">
          <FormField
            id="proposal-inspection"
            label="Inspection"
            hint={
              completed.length
                ? 'Its findings are printed on the proposal and shown to the homeowner.'
                : 'No completed inspection on this lead: the proposal goes without findings.'
            }
            error={errorFor('inspectionId')}
          >
            {({ invalid, id, ...aria }) => (
              <Select
                inputId={id}
                {...aria}
                value={draft.inspectionId}
                options={inspectionOptions}
                onChange={(e) =>
                  setDraft((d) => ({ ...d, inspectionId: (e.value as string | null) ?? null }))
                }
                placeholder="No inspection findings"
                showClear
                invalid={invalid}
                disabled={!completed.length && !draft.inspectionId}
                panelClassName="app-overlay"
              />
            )}
          </FormField>
          <div className="proposal-builder__add">
            <Button
              type="button"
              label="Add option"
              icon="pi pi-plus"
              outlined
              onClick={addOption}
              disabled={draft.options.length >= MAX_OPTIONS}
            />
            <span className="muted proposal-builder__count">
              {draft.options.length} of {MAX_OPTIONS} options
            </span>
          </div>
        </div>

        <TabView
          activeIndex={activeIndex}
          onTabChange={(e) => setActive(e.index)}
          className="option-tabs"
          scrollable
        >
          {draft.options.map((o, i) => {
            const f = figures[i]!;
            return (
              <TabPanel
                key={o.key}
                header={
                  <span className="option-tab">
                    <span className="option-tab__title">
                      {i + 1}. {o.title.trim() || 'Untitled'}
                    </span>
                    <span className="option-tab__total">
                      {f.totals ? formatUsd(f.totals.customerTotal) : '—'}
                    </span>
                    {optionHasError(errors, i) ? (
                      <i
                        className="pi pi-exclamation-circle option-tab__error"
                        aria-label="needs attention"
                      />
                    ) : null}
                  </span>
                }
              >
                <div className="option-layout">
                  <div className="option-layout__main">
                    <OptionEditor
                      option={o}
                      index={i}
                      items={items}
                      ctx={ctx}
                      errorFor={errorFor}
                      onChange={(next) => updateOption(i, next)}
                      onOpenPlan={(lineKey, target) => setPlan({ optionKey: o.key, lineKey, target })}
                      onRemove={draft.options.length > 1 ? () => setRemoving(i) : null}
                      disabled={pending !== null}
                    />
                  </div>
                  <aside className="option-layout__side">
                    {f.totals ? (
                      <OptionFigures
                        totals={f.totals}
                        tax={f.preview ? ctx.tax : (saved?.tax ?? ctx.tax)}
                        approval={f.approval}
                        limits={limits}
                        commission={f.commission}
                        commissionIsViewers={viewer.isSalesperson}
                        preview={f.preview}
                      />
                    ) : (
                      <Message severity="warn" text={f.problem ?? 'These figures cannot be priced yet.'} />
                    )}
                    {f.preview && f.incompleteLines > 0 ? (
                      <p className="option-figures__incomplete muted">
                        {f.incompleteLines === 1 ? '1 line is' : `${f.incompleteLines} lines are`} left out
                        until an item and a quantity are chosen.
                      </p>
                    ) : null}
                  </aside>
                </div>
              </TabPanel>
            );
          })}
        </TabView>

        <FormField
          id="proposal-notes"
          label="Internal notes"
          hint="For the team only: not printed on the proposal."
          error={errorFor('notes')}
        >
          {({ invalid, ...control }) => (
            <InputTextarea
              {...control}
              value={draft.notes}
              onChange={(e) => setDraft((d) => ({ ...d, notes: e.target.value }))}
              invalid={invalid}
              rows={2}
              autoResize
              maxLength={4000}
            />
          )}
        </FormField>

        <div className="builder-actions">
          <div className="builder-actions__status" aria-live="polite">
            {dirty ? (
              <span className="builder-actions__dirty">
                <i className="pi pi-circle-fill" aria-hidden="true" /> Unsaved changes
              </span>
            ) : saved ? (
              <span className="muted">
                <i className="pi pi-check" aria-hidden="true" /> All changes saved
              </span>
            ) : null}
            {saveHint ? <span className="builder-actions__hint">{saveHint}</span> : null}
          </div>
          <div className="builder-actions__buttons">
            <Button
              type="submit"
              label="Save draft"
              icon="pi pi-save"
              outlined={canSubmit}
              loading={pending === 'save'}
              disabled={pending !== null || (!dirty && !!saved)}
            />
            {canSubmit ? (
              <Button
                type="button"
                label={needsApproval ? 'Submit for approval' : 'Mark ready to send'}
                icon={needsApproval ? 'pi pi-send' : 'pi pi-check-circle'}
                loading={pending === 'submit'}
                disabled={pending !== null}
                onClick={() => void attempt((request) => onSubmit(request, dirty || !saved))}
              />
            ) : null}
          </div>
        </div>
      </form>
      <ConfirmDialog
        visible={removing !== null}
        onHide={() => setRemoving(null)}
        header="Remove this option?"
        icon="pi pi-exclamation-triangle"
        message={
          removing !== null
            ? `Option ${removing + 1}, “${draft.options[removing]?.title.trim() || 'Untitled'}”, and its lines go when the draft is saved.`
            : ''
        }
        acceptLabel="Remove it"
        rejectLabel="Keep it"
        acceptClassName="p-button-danger"
        defaultFocus="reject"
        accept={() => {
          if (removing !== null) removeOption(removing);
          setRemoving(null);
        }}
        reject={() => setRemoving(null)}
        className="app-dialog"
      />
      <PlanDialog
        target={plan?.target ?? null}
        onClose={() => setPlan(null)}
        onUse={(quantity) => {
          if (!plan) return;
          const i = draft.options.findIndex((o) => o.key === plan.optionKey);
          const o = draft.options[i];
          if (o) {
            updateOption(i, {
              ...o,
              lines: o.lines.map((l) =>
                l.key === plan.lineKey
                  ? {
                      ...l,
                      quantity,
                      quantitySource: plan.target.kind === 'pier' ? 'pier-plan' : 'injection-plan',
                    }
                  : l,
              ),
            });
          }
          setPlan(null);
        }}
      />
    </>
  );
}
