import type { ReactNode } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { InputTextarea } from 'primereact/inputtextarea';
import { Message } from 'primereact/message';
import { Tag } from 'primereact/tag';
import {
  CRACK_ORIENTATIONS,
  CRACK_ORIENTATION_LABELS,
  FINDINGS_ITEMS,
  GRADINGS,
  GRADING_LABELS,
  GUTTER_COVERAGES,
  GUTTER_COVERAGE_LABELS,
  SOIL_MOISTURES,
  SOIL_MOISTURE_LABELS,
  SOIL_TYPES,
  SOIL_TYPE_LABELS,
  type FindingsItem,
  type FindingsItemKey,
} from '@loambook/common';
import { Select } from '@/components/select';
import {
  entryKey,
  isAnswered,
  ITEM_LABEL,
  unanswered,
  type CrackDraft,
  type CrackKey,
  type DraftErrors,
  type FindingsDraft,
  type LocationDraft,
  type ObservedKey,
} from '../findings-draft';

const ORIENTATION_OPTIONS = CRACK_ORIENTATIONS.map((o) => ({ label: CRACK_ORIENTATION_LABELS[o], value: o }));
const GUTTER_OPTIONS = GUTTER_COVERAGES.map((g) => ({ label: GUTTER_COVERAGE_LABELS[g], value: g }));
const GRADING_OPTIONS = GRADINGS.map((g) => ({ label: GRADING_LABELS[g], value: g }));
const SOIL_OPTIONS = SOIL_TYPES.map((s) => ({ label: SOIL_TYPE_LABELS[s], value: s }));
const MOISTURE_OPTIONS = SOIL_MOISTURES.map((m) => ({ label: SOIL_MOISTURE_LABELS[m], value: m }));

/** What to call one entry of a list item, and its add button. */
const ENTRY_NAMES: Record<CrackKey | 'doorsWindowsSticking', { one: string; add: string }> = {
  interiorCracks: { one: 'Interior crack', add: 'Add interior crack' },
  exteriorCracks: { one: 'Exterior crack', add: 'Add exterior crack' },
  doorsWindowsSticking: { one: 'Door or window', add: 'Add door or window' },
};

interface FindingsChecklistProps {
  draft: FindingsDraft;
  onChange: (update: (draft: FindingsDraft) => FindingsDraft) => void;
  errors: DraftErrors;
  disabled: boolean;
  /** Items the server said are missing when completing was refused. */
  flagged?: FindingsItemKey[];
}

/**
 * The findings checklist, in the order of FINDINGS_ITEMS. Every item needs an answer before the
 * inspection can be completed; for the lists, "None seen" is an answer.
 */
export function FindingsChecklist({
  draft,
  onChange,
  errors,
  disabled,
  flagged = [],
}: FindingsChecklistProps) {
  const missing = unanswered(draft);
  return (
    <div className="findings">
      <div className="findings__status" aria-live="polite">
        {missing.length === 0 ? (
          <p className="findings__done">
            <i className="pi pi-check-circle" aria-hidden="true" /> Every item is answered.
          </p>
        ) : (
          <div className="findings__missing">
            <p className="findings__missing-title">
              {missing.length === 1 ? '1 item still unanswered' : `${missing.length} items still unanswered`}
            </p>
            <ul className="findings__missing-list" aria-label="Unanswered items">
              {missing.map((k) => (
                <li key={k}>
                  <a href={`#finding-${k}`}>{ITEM_LABEL[k]}</a>
                </li>
              ))}
            </ul>
          </div>
        )}
      </div>
      <ol className="findings__items">
        {FINDINGS_ITEMS.map((item) => (
          <li key={item.key}>
            <ItemCard
              item={item}
              answered={isAnswered(draft, item.key)}
              flagged={flagged.includes(item.key) && !isAnswered(draft, item.key)}
            >
              <ItemBody item={item} draft={draft} onChange={onChange} errors={errors} disabled={disabled} />
            </ItemCard>
          </li>
        ))}
      </ol>
    </div>
  );
}

function ItemCard({
  item,
  answered,
  flagged,
  children,
}: {
  item: FindingsItem;
  answered: boolean;
  flagged: boolean;
  children: ReactNode;
}) {
  return (
    <section
      id={`finding-${item.key}`}
      className={[
        'finding',
        answered ? 'finding--answered' : 'finding--open',
        flagged ? 'finding--flagged' : '',
      ]
        .filter(Boolean)
        .join(' ')}
      aria-labelledby={`finding-${item.key}-title`}
    >
      <header className="finding__head">
        <h3 id={`finding-${item.key}-title`} className="finding__title">
          {item.label}
        </h3>
        {answered ? (
          <Tag value="Answered" severity="success" icon="pi pi-check" className="finding__tag" />
        ) : (
          <Tag value="Unanswered" severity={flagged ? 'danger' : 'warning'} className="finding__tag" />
        )}
      </header>
      <p className="finding__hint">{item.hint}</p>
      {item.caution ? <Message severity="warn" className="finding__caution" text={item.caution} /> : null}
      {children}
    </section>
  );
}

interface BodyProps {
  item: FindingsItem;
  draft: FindingsDraft;
  onChange: FindingsChecklistProps['onChange'];
  errors: DraftErrors;
  disabled: boolean;
}

function ItemBody({ item, draft, onChange, errors, disabled }: BodyProps) {
  switch (item.kind) {
    case 'cracks':
      return (
        <CrackList
          itemKey={item.key as CrackKey}
          draft={draft}
          onChange={onChange}
          errors={errors}
          disabled={disabled}
        />
      );
    case 'locations':
      return <LocationList draft={draft} onChange={onChange} errors={errors} disabled={disabled} />;
    case 'observed':
      return (
        <Observed
          itemKey={item.key as ObservedKey}
          draft={draft}
          onChange={onChange}
          errors={errors}
          disabled={disabled}
        />
      );
    case 'drainage':
      return <Drainage draft={draft} onChange={onChange} errors={errors} disabled={disabled} />;
    case 'soil':
      return <Soil draft={draft} onChange={onChange} errors={errors} disabled={disabled} />;
  }
}

/** An input named by its item (or entry) and its own label: "Interior crack 2 Width (in)". */
function Labelled({
  id,
  label,
  owner,
  error,
  hint,
  className,
  children,
}: {
  id: string;
  label: string;
  /** The id of the heading that names the item or entry. */
  owner: string;
  error?: string;
  hint?: string;
  className?: string;
  children: (control: {
    id: string;
    'aria-labelledby': string;
    'aria-invalid'?: boolean;
    'aria-describedby'?: string;
    invalid: boolean;
  }) => ReactNode;
}) {
  const errorId = error ? `${id}-error` : undefined;
  const hintId = hint ? `${id}-hint` : undefined;
  return (
    <div className={['form-field', className].filter(Boolean).join(' ')}>
      <label htmlFor={id} id={`${id}-label`} className="form-field__label">
        {label}
      </label>
      {children({
        id,
        'aria-labelledby': `${owner} ${id}-label`,
        'aria-invalid': error ? true : undefined,
        'aria-describedby': [errorId, hintId].filter(Boolean).join(' ') || undefined,
        invalid: !!error,
      })}
      {error ? (
        <small id={errorId} className="form-field__error">
          <i className="pi pi-exclamation-circle" aria-hidden="true" /> {error}
        </small>
      ) : null}
      {hint ? (
        <small id={hintId} className="form-field__hint">
          {hint}
        </small>
      ) : null}
    </div>
  );
}

function NoteField({
  path,
  owner,
  value,
  onChange,
  error,
  disabled,
}: {
  path: string;
  owner: string;
  value: string;
  onChange: (v: string) => void;
  error?: string;
  disabled: boolean;
}) {
  // A record that can no longer change shows no empty note boxes.
  if (disabled && !value.trim()) return null;
  return (
    <Labelled
      id={`f-${path.replace(/\./g, '-')}`}
      label="Note"
      owner={owner}
      error={error}
      className="finding__note"
    >
      {({ invalid, ...control }) => (
        <InputTextarea
          {...control}
          value={value}
          onChange={(e) => onChange(e.target.value)}
          rows={1}
          autoResize
          invalid={invalid}
          disabled={disabled}
          className="w-full"
        />
      )}
    </Labelled>
  );
}

function YesNo({
  name,
  owner,
  value,
  onChange,
  disabled,
  yes = 'Yes',
  no = 'No',
}: {
  name: string;
  /** The id of the element that names the question. */
  owner: string;
  value: boolean | null;
  onChange: (v: boolean) => void;
  disabled: boolean;
  yes?: string;
  no?: string;
}) {
  return (
    <div className="choice-group" role="radiogroup" aria-labelledby={owner}>
      {[
        { v: true, label: yes },
        { v: false, label: no },
      ].map((o) => (
        <label key={String(o.v)} className={value === o.v ? 'choice choice--on' : 'choice'}>
          <input
            type="radio"
            name={name}
            checked={value === o.v}
            onChange={() => onChange(o.v)}
            disabled={disabled}
          />
          <span>{o.label}</span>
        </label>
      ))}
    </div>
  );
}

function CrackList({
  itemKey,
  draft,
  onChange,
  errors,
  disabled,
}: {
  itemKey: CrackKey;
  draft: FindingsDraft;
  onChange: FindingsChecklistProps['onChange'];
  errors: DraftErrors;
  disabled: boolean;
}) {
  const list = draft[itemKey];
  const names = ENTRY_NAMES[itemKey];
  const setList = (fn: (l: CrackDraft[]) => CrackDraft[]) =>
    onChange((d) => ({ ...d, [itemKey]: fn(d[itemKey] ?? []) }));
  const setEntry = (index: number, patch: Partial<CrackDraft>) =>
    setList((l) => l.map((c, i) => (i === index ? { ...c, ...patch } : c)));

  return (
    <div className="entry-list">
      {list?.map((c, i) => {
        const owner = `f-${itemKey}-${c.key}-title`;
        const path = `${itemKey}.${i}`;
        return (
          <div key={c.key} className="entry">
            <div className="entry__head">
              <h4 id={owner} className="entry__title">
                {names.one} {i + 1}
              </h4>
              {disabled ? null : (
                <Button
                  type="button"
                  label="Remove"
                  aria-label={`Remove ${names.one.toLowerCase()} ${i + 1}`}
                  icon="pi pi-trash"
                  text
                  size="small"
                  severity="danger"
                  onClick={() => setList((l) => l.filter((_, j) => j !== i))}
                />
              )}
            </div>
            <div className="entry__grid entry__grid--crack">
              <Labelled
                id={`f-${itemKey}-${c.key}-location`}
                label="Location"
                owner={owner}
                error={errors[`${path}.location`]}
                className="entry__wide"
              >
                {({ invalid, ...control }) => (
                  <InputText
                    {...control}
                    value={c.location}
                    onChange={(e) => setEntry(i, { location: e.target.value })}
                    placeholder="Living room, NE corner above the window"
                    maxLength={120}
                    invalid={invalid}
                    disabled={disabled}
                    className="w-full"
                  />
                )}
              </Labelled>
              <Labelled
                id={`f-${itemKey}-${c.key}-width`}
                label="Width (in)"
                owner={owner}
                error={errors[`${path}.widthIn`]}
                hint="1/16 = 0.0625 · 1/8 = 0.125 · 1/4 = 0.25"
              >
                {({ invalid, ...control }) => (
                  <InputText
                    {...control}
                    value={c.widthIn}
                    onChange={(e) => setEntry(i, { widthIn: e.target.value })}
                    inputMode="decimal"
                    placeholder="0.125"
                    maxLength={8}
                    invalid={invalid}
                    disabled={disabled}
                    className="w-full"
                  />
                )}
              </Labelled>
              <Labelled
                id={`f-${itemKey}-${c.key}-orientation`}
                label="Orientation"
                owner={owner}
                error={errors[`${path}.orientation`]}
              >
                {({ invalid, id, ...aria }) => (
                  <Select
                    inputId={id}
                    {...aria}
                    value={c.orientation || null}
                    options={ORIENTATION_OPTIONS}
                    onChange={(e) => setEntry(i, { orientation: e.value as CrackDraft['orientation'] })}
                    placeholder="Which way it runs"
                    invalid={invalid}
                    disabled={disabled}
                    className="w-full"
                  />
                )}
              </Labelled>
            </div>
            <NoteField
              path={`${path}.note`}
              owner={owner}
              value={c.note}
              onChange={(note) => setEntry(i, { note })}
              error={errors[`${path}.note`]}
              disabled={disabled}
            />
          </div>
        );
      })}
      <ListAnswerBar
        count={list?.length ?? null}
        addLabel={names.add}
        disabled={disabled}
        onNone={() => onChange((d) => ({ ...d, [itemKey]: [] }))}
        onAdd={() =>
          setList((l) => [...l, { key: entryKey(), location: '', widthIn: '', orientation: '', note: '' }])
        }
      />
    </div>
  );
}

function LocationList({
  draft,
  onChange,
  errors,
  disabled,
}: {
  draft: FindingsDraft;
  onChange: FindingsChecklistProps['onChange'];
  errors: DraftErrors;
  disabled: boolean;
}) {
  const list = draft.doorsWindowsSticking;
  const names = ENTRY_NAMES.doorsWindowsSticking;
  const setList = (fn: (l: LocationDraft[]) => LocationDraft[]) =>
    onChange((d) => ({ ...d, doorsWindowsSticking: fn(d.doorsWindowsSticking ?? []) }));
  const setEntry = (index: number, patch: Partial<LocationDraft>) =>
    setList((l) => l.map((c, i) => (i === index ? { ...c, ...patch } : c)));
  return (
    <div className="entry-list">
      {list?.map((l, i) => {
        const owner = `f-dws-${l.key}-title`;
        const path = `doorsWindowsSticking.${i}`;
        return (
          <div key={l.key} className="entry">
            <div className="entry__head">
              <h4 id={owner} className="entry__title">
                {names.one} {i + 1}
              </h4>
              {disabled ? null : (
                <Button
                  type="button"
                  label="Remove"
                  aria-label={`Remove door or window ${i + 1}`}
                  icon="pi pi-trash"
                  text
                  size="small"
                  severity="danger"
                  onClick={() => setList((all) => all.filter((_, j) => j !== i))}
                />
              )}
            </div>
            <div className="entry__grid">
              <Labelled
                id={`f-dws-${l.key}-location`}
                label="Location"
                owner={owner}
                error={errors[`${path}.location`]}
                className="entry__wide"
              >
                {({ invalid, ...control }) => (
                  <InputText
                    {...control}
                    value={l.location}
                    onChange={(e) => setEntry(i, { location: e.target.value })}
                    placeholder="Back bedroom door"
                    maxLength={120}
                    invalid={invalid}
                    disabled={disabled}
                    className="w-full"
                  />
                )}
              </Labelled>
            </div>
            <NoteField
              path={`${path}.note`}
              owner={owner}
              value={l.note}
              onChange={(note) => setEntry(i, { note })}
              error={errors[`${path}.note`]}
              disabled={disabled}
            />
          </div>
        );
      })}
      <ListAnswerBar
        count={list?.length ?? null}
        addLabel={names.add}
        disabled={disabled}
        onNone={() => onChange((d) => ({ ...d, doorsWindowsSticking: [] }))}
        onAdd={() => setList((all) => [...all, { key: entryKey(), location: '', note: '' }])}
      />
    </div>
  );
}

/** "None seen" answers a list item with an empty list; adding an entry answers it too. */
function ListAnswerBar({
  count,
  addLabel,
  disabled,
  onNone,
  onAdd,
}: {
  count: number | null;
  addLabel: string;
  disabled: boolean;
  onNone: () => void;
  onAdd: () => void;
}) {
  if (disabled) return count === 0 ? <p className="entry-list__none">None seen.</p> : null;
  return (
    <div className="entry-list__bar">
      {count === 0 ? (
        <span className="entry-list__none">
          <i className="pi pi-check" aria-hidden="true" /> None seen
        </span>
      ) : count === null ? (
        <Button
          type="button"
          label="None seen"
          icon="pi pi-ban"
          outlined
          severity="secondary"
          onClick={onNone}
        />
      ) : null}
      <Button type="button" label={addLabel} icon="pi pi-plus" outlined onClick={onAdd} />
    </div>
  );
}

function Observed({
  itemKey,
  draft,
  onChange,
  errors,
  disabled,
}: {
  itemKey: ObservedKey;
  draft: FindingsDraft;
  onChange: FindingsChecklistProps['onChange'];
  errors: DraftErrors;
  disabled: boolean;
}) {
  const value = draft[itemKey];
  const owner = `finding-${itemKey}-title`;
  return (
    <div className="observed">
      <YesNo
        name={`f-${itemKey}`}
        owner={owner}
        value={value.observed}
        onChange={(observed) => onChange((d) => ({ ...d, [itemKey]: { ...d[itemKey], observed } }))}
        disabled={disabled}
        yes="Yes, seen"
        no="Not seen"
      />
      <NoteField
        path={`${itemKey}.note`}
        owner={owner}
        value={value.note}
        onChange={(note) => onChange((d) => ({ ...d, [itemKey]: { ...d[itemKey], note } }))}
        error={errors[`${itemKey}.note`]}
        disabled={disabled}
      />
    </div>
  );
}

/** A labelled choice from a short list ('' is "not answered yet"). */
function ChoiceField<T extends string>({
  id,
  label,
  value,
  options,
  onChange,
  disabled,
}: {
  id: string;
  label: string;
  value: T | '';
  options: { label: string; value: T }[];
  onChange: (value: T) => void;
  disabled: boolean;
}) {
  return (
    <div className="form-field">
      <label htmlFor={id} className="form-field__label">
        {label}
      </label>
      <Select
        inputId={id}
        value={value || null}
        options={options}
        onChange={(e) => onChange(e.value as T)}
        placeholder="Choose"
        disabled={disabled}
        className="w-full"
      />
    </div>
  );
}

function Drainage({
  draft,
  onChange,
  errors,
  disabled,
}: {
  draft: FindingsDraft;
  onChange: FindingsChecklistProps['onChange'];
  errors: DraftErrors;
  disabled: boolean;
}) {
  const d = draft.drainage;
  const set = (patch: Partial<FindingsDraft['drainage']>) =>
    onChange((all) => ({ ...all, drainage: { ...all.drainage, ...patch } }));
  return (
    <div className="entry__grid">
      <ChoiceField
        id="f-drainage-gutters"
        label="Gutters"
        value={d.gutters}
        options={GUTTER_OPTIONS}
        onChange={(gutters) => set({ gutters })}
        disabled={disabled}
      />
      <ChoiceField
        id="f-drainage-grading"
        label="Grading"
        value={d.grading}
        options={GRADING_OPTIONS}
        onChange={(grading) => set({ grading })}
        disabled={disabled}
      />
      <div className="form-field entry__wide">
        <span id="f-drainage-downspouts" className="form-field__label">
          Downspouts discharge near the foundation
        </span>
        <YesNo
          name="f-drainage-downspouts"
          owner="f-drainage-downspouts"
          value={d.downspoutsDischargeNearFoundation}
          onChange={(v) => set({ downspoutsDischargeNearFoundation: v })}
          disabled={disabled}
        />
      </div>
      <div className="entry__wide">
        <NoteField
          path="drainage.note"
          owner="finding-drainage-title"
          value={d.note}
          onChange={(note) => set({ note })}
          error={errors['drainage.note']}
          disabled={disabled}
        />
      </div>
    </div>
  );
}

function Soil({
  draft,
  onChange,
  errors,
  disabled,
}: {
  draft: FindingsDraft;
  onChange: FindingsChecklistProps['onChange'];
  errors: DraftErrors;
  disabled: boolean;
}) {
  const s = draft.soil;
  const set = (patch: Partial<FindingsDraft['soil']>) =>
    onChange((all) => ({ ...all, soil: { ...all.soil, ...patch } }));
  return (
    <div className="entry__grid">
      <ChoiceField
        id="f-soil-type"
        label="Soil type"
        value={s.type}
        options={SOIL_OPTIONS}
        onChange={(type) => set({ type })}
        disabled={disabled}
      />
      <ChoiceField
        id="f-soil-moisture"
        label="Moisture"
        value={s.moisture}
        options={MOISTURE_OPTIONS}
        onChange={(moisture) => set({ moisture })}
        disabled={disabled}
      />
      <div className="entry__wide">
        <NoteField
          path="soil.note"
          owner="finding-soil-title"
          value={s.note}
          onChange={(note) => set({ note })}
          error={errors['soil.note']}
          disabled={disabled}
        />
      </div>
    </div>
  );
}
