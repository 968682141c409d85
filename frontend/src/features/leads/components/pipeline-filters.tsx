import { useEffect, useState } from 'react';
import { Button } from 'primereact/button';
import { IconField } from 'primereact/iconfield';
import { InputIcon } from 'primereact/inputicon';
import { InputSwitch } from 'primereact/inputswitch';
import { InputText } from 'primereact/inputtext';
import { LEAD_STAGES, type LeadStage, type UserSummary } from '@loambook/common';
import { MultiSelectField, Select } from '@/components/select';
import { useMediaQuery, WIDE_TABLE } from '@/lib/use-media-query';
import { stageLabel } from '../lead-format';
import { MONEY_FILTER, type PipelineView } from '../pipeline-query';
import { useDebouncedValue } from '../use-debounced-value';

const STAGE_OPTIONS = LEAD_STAGES.map((s) => ({ label: stageLabel(s), value: s }));
const ANYONE = '__anyone__';
const WHOLE_DAYS = /^\d{1,5}$/;

/** How long typing must pause before the list is asked for again (ms). */
export const FILTER_TYPING_DELAY_MS = 350;

type TypedField = 'q' | 'minAgeDays' | 'maxAgeDays' | 'minValue' | 'maxValue';
type Typed = Record<TypedField, string>;

const typedOf = (v: PipelineView): Typed => ({
  q: v.q,
  minAgeDays: v.minAgeDays,
  maxAgeDays: v.maxAgeDays,
  minValue: v.minValue,
  maxValue: v.maxValue,
});

function typedProblems(t: Typed): Partial<Record<TypedField, string>> {
  const p: Partial<Record<TypedField, string>> = {};
  for (const f of ['minAgeDays', 'maxAgeDays'] as const) {
    if (t[f].trim() && !WHOLE_DAYS.test(t[f].trim())) p[f] = 'Whole days, e.g. 14.';
  }
  for (const f of ['minValue', 'maxValue'] as const) {
    if (t[f].trim() && !MONEY_FILTER.test(t[f].trim().replace(/[$,]/g, ''))) p[f] = 'An amount, e.g. 2500.';
  }
  return p;
}

interface PipelineFiltersProps {
  view: PipelineView;
  onChange: (patch: Partial<PipelineView>) => void;
  onClear: () => void;
  /** null: the person sees their own leads only, so there is nobody to choose. */
  salespeople: UserSummary[] | null;
  salespeopleLoading: boolean;
}

export function PipelineFilters({
  view,
  onChange,
  onClear,
  salespeople,
  salespeopleLoading,
}: PipelineFiltersProps) {
  const wide = useMediaQuery(WIDE_TABLE);
  const [open, setOpen] = useState(false);
  // What is typed applies once typing pauses, and only when it makes sense.
  const [typed, setTyped] = useState<Typed>(() => typedOf(view));
  const problems = typedProblems(typed);
  const settled = useDebouncedValue(JSON.stringify(typed), FILTER_TYPING_DELAY_MS);

  useEffect(() => {
    const t = JSON.parse(settled) as Typed;
    const bad = typedProblems(t);
    const patch: Partial<PipelineView> = {};
    for (const f of Object.keys(t) as TypedField[]) {
      if (bad[f]) continue;
      const clean = f === 'minValue' || f === 'maxValue' ? t[f].trim().replace(/[$,]/g, '') : t[f].trim();
      if (clean !== (f === 'q' ? view.q.trim() : view[f])) patch[f] = clean;
    }
    if (Object.keys(patch).length) onChange(patch);
    // Only a pause in typing applies the filter; the view changing by other means must not.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [settled]);

  const clear = () => {
    setTyped({ q: '', minAgeDays: '', maxAgeDays: '', minValue: '', maxValue: '' });
    onClear();
  };

  const setText = (field: TypedField) => (e: { target: { value: string } }) =>
    setTyped((t) => ({ ...t, [field]: e.target.value }));

  const activeCount =
    (view.stages.length ? 1 : 0) +
    (view.salespersonId ? 1 : 0) +
    (view.minAgeDays || view.maxAgeDays ? 1 : 0) +
    (view.minValue || view.maxValue ? 1 : 0) +
    (view.approvalPending ? 1 : 0);
  const showMore = wide || open;

  const small = (field: TypedField, label: string, placeholder: string, inputMode: 'numeric' | 'decimal') => (
    <div className="filter-field filter-field--small">
      <label htmlFor={`pipeline-${field}`} className="filter-field__label">
        {label}
      </label>
      <InputText
        id={`pipeline-${field}`}
        value={typed[field]}
        onChange={setText(field)}
        inputMode={inputMode}
        placeholder={placeholder}
        invalid={!!problems[field]}
        aria-invalid={problems[field] ? true : undefined}
        aria-describedby={problems[field] ? `pipeline-${field}-error` : undefined}
        autoComplete="off"
        maxLength={15}
      />
      {problems[field] ? (
        <small id={`pipeline-${field}-error`} className="form-field__error">
          {problems[field]}
        </small>
      ) : null}
    </div>
  );

  return (
    <div className="pipeline-filters">
      <div className="pipeline-filters__row">
        <div className="filter-field filter-field--search">
          <label htmlFor="pipeline-search" className="filter-field__label">
            Search
          </label>
          <IconField iconPosition="left">
            <InputIcon className="pi pi-search" />
            <InputText
              id="pipeline-search"
              type="search"
              value={typed.q}
              onChange={setText('q')}
              placeholder="Name, street, city, phone, e-mail"
              autoComplete="off"
              maxLength={100}
              className="w-full"
            />
          </IconField>
        </div>
        {wide ? null : (
          <Button
            type="button"
            label={activeCount ? `Filters (${activeCount})` : 'Filters'}
            icon="pi pi-filter"
            outlined
            severity="secondary"
            aria-expanded={open}
            aria-controls="pipeline-more-filters"
            onClick={() => setOpen((o) => !o)}
            className="pipeline-filters__toggle"
          />
        )}
      </div>
      {showMore ? (
        <div className="pipeline-filters__row pipeline-filters__more" id="pipeline-more-filters">
          <div className="filter-field filter-field--stage">
            <label htmlFor="pipeline-stage" className="filter-field__label">
              Stage
            </label>
            <MultiSelectField
              inputId="pipeline-stage"
              value={view.stages}
              options={STAGE_OPTIONS}
              onChange={(e) => onChange({ stages: e.value as LeadStage[] })}
              placeholder="Every stage"
              maxSelectedLabels={2}
              selectedItemsLabel="{0} stages"
              display="comma"
              className="w-full"
              panelClassName="app-overlay"
            />
          </div>
          {salespeople ? (
            <div className="filter-field">
              <label htmlFor="pipeline-salesperson" className="filter-field__label">
                Salesperson
              </label>
              <Select
                inputId="pipeline-salesperson"
                value={view.salespersonId ?? ANYONE}
                options={[
                  { label: 'Anyone', value: ANYONE },
                  ...salespeople.map((u) => ({ label: u.name, value: u.id })),
                ]}
                onChange={(e) => onChange({ salespersonId: e.value === ANYONE ? null : (e.value as string) })}
                loading={salespeopleLoading}
                filter={salespeople.length > 8}
                className="w-full"
              />
            </div>
          ) : null}
          {small('minAgeDays', 'Min age (days)', 'e.g. 7', 'numeric')}
          {small('maxAgeDays', 'Max age (days)', 'any', 'numeric')}
          {small('minValue', 'Min value ($)', 'e.g. 5000', 'decimal')}
          {small('maxValue', 'Max value ($)', 'any', 'decimal')}
          <div className="filter-field filter-field--switch">
            <label htmlFor="pipeline-approvals" className="filter-field__label">
              Approvals waiting
            </label>
            <InputSwitch
              inputId="pipeline-approvals"
              checked={view.approvalPending}
              onChange={(e) => onChange({ approvalPending: !!e.value })}
            />
          </div>
          <div className="filter-field filter-field--clear">
            <Button
              type="button"
              label="Clear filters"
              icon="pi pi-filter-slash"
              text
              size="small"
              onClick={clear}
              disabled={activeCount === 0 && !typed.q}
            />
          </div>
        </div>
      ) : null}
    </div>
  );
}
