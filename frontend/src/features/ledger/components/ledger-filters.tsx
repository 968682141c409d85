import { useState, type ReactNode } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { REASON_CODES, REASON_LABELS, type Branch } from '@loambook/common';
import { Select } from '@/components/select';
import { rangeProblems, type DateRange } from '../ledger-query';

const ALL = '__all__';
const ANY_REASON = '__any__';
const REASON_OPTIONS = [
  { label: 'Any reason', value: ANY_REASON },
  ...REASON_CODES.map((c) => ({ label: REASON_LABELS[c], value: c })),
];

export interface BranchChoice {
  branchId: string | null;
  branches: Branch[];
  /** Whether "All branches" may be chosen (the owner and the bookkeeper). */
  allowAll: boolean;
  onChange: (branchId: string | null) => void;
}

interface LedgerFiltersProps {
  /** Makes the ids unique on the page: "journal", "account", "trial". */
  idPrefix: string;
  branch: BranchChoice;
  /** null: this screen has no date range (the trial balance has an "as of" date instead). */
  range: DateRange | null;
  onRange?: (range: DateRange) => void;
  /** The labels of the two dates. */
  rangeLabels?: { from: string; to: string };
  /** undefined: this screen has no reason filter. */
  reasonCode?: string;
  onReason?: (reasonCode: string) => void;
  onClear?: () => void;
  /** More fields after the standard ones (the account, the "as of" date). */
  children?: ReactNode;
}

/**
 * The ledger's filters: branch, a date range, and on the journal the reason. A date applies as soon as it
 * makes sense with the other one; an end before the start is shown on the field and not sent.
 */
export function LedgerFilters({
  idPrefix,
  branch,
  range,
  onRange,
  rangeLabels = { from: 'From', to: 'To' },
  reasonCode,
  onReason,
  onClear,
  children,
}: LedgerFiltersProps) {
  // What is typed, against the range it started from: when the range changes from outside (Clear, the
  // browser's Back button) and what is typed is sound, what is typed follows.
  const base = range ? `${range.from}|${range.to}` : '';
  const [draft, setDraft] = useState<{ value: DateRange; base: string }>({
    value: range ?? { from: '', to: '' },
    base,
  });
  const problems = rangeProblems(draft.value);
  if (range && draft.base !== base && Object.keys(problems).length === 0) {
    setDraft({ value: range, base });
  }

  const setDate = (field: keyof DateRange, value: string) => {
    const next = { ...draft.value, [field]: value };
    setDraft({ value: next, base });
    if (Object.keys(rangeProblems(next)).length === 0) onRange?.(next);
  };

  const clear = () => {
    setDraft({ value: { from: '', to: '' }, base: '|' });
    onClear?.();
  };

  const dateField = (field: keyof DateRange) => {
    const id = `${idPrefix}-${field}`;
    const error = problems[field];
    return (
      <div className="ledger-filter">
        <label htmlFor={id} className="ledger-filter__label">
          {rangeLabels[field]}
        </label>
        <InputText
          id={id}
          type="date"
          value={draft.value[field]}
          onChange={(e) => setDate(field, e.target.value)}
          invalid={!!error}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-error` : undefined}
        />
        {error ? (
          <small id={`${id}-error`} className="form-field__error">
            <i className="pi pi-exclamation-circle" aria-hidden="true" /> {error}
          </small>
        ) : null}
      </div>
    );
  };

  const filtered = !!(draft.value.from || draft.value.to || reasonCode);

  return (
    <div className="ledger-filters" role="search" aria-label="Ledger filters">
      <div className="ledger-filter ledger-filter--branch">
        <label htmlFor={`${idPrefix}-branch`} className="ledger-filter__label">
          Branch
        </label>
        <Select
          inputId={`${idPrefix}-branch`}
          value={branch.branchId ?? ALL}
          options={[
            ...(branch.allowAll ? [{ label: 'All branches', value: ALL }] : []),
            ...branch.branches.map((b) => ({ label: `${b.code} · ${b.name}`, value: b.id })),
          ]}
          onChange={(e) => branch.onChange(e.value === ALL ? null : (e.value as string))}
          placeholder="Choose a branch"
          className="w-full"
        />
      </div>
      {children}
      {range ? (
        <>
          {dateField('from')}
          {dateField('to')}
        </>
      ) : null}
      {reasonCode !== undefined ? (
        <div className="ledger-filter ledger-filter--reason">
          <label htmlFor={`${idPrefix}-reason`} className="ledger-filter__label">
            Reason
          </label>
          <Select
            inputId={`${idPrefix}-reason`}
            value={reasonCode || ANY_REASON}
            options={REASON_OPTIONS}
            onChange={(e) => onReason?.(e.value === ANY_REASON ? '' : (e.value as string))}
            className="w-full"
          />
        </div>
      ) : null}
      {onClear ? (
        <div className="ledger-filter ledger-filter--clear">
          <Button
            type="button"
            label="Clear filters"
            icon="pi pi-filter-slash"
            text
            size="small"
            onClick={clear}
            disabled={!filtered}
          />
        </div>
      ) : null}
    </div>
  );
}
