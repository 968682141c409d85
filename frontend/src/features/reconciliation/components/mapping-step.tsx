import { Checkbox } from 'primereact/checkbox';
import { Message } from 'primereact/message';
import { RadioButton } from 'primereact/radiobutton';
import { Tag } from 'primereact/tag';
import {
  BANK_DATE_FORMATS,
  dateFormatsFitting,
  type BankDateFormat,
  type BankStatementPreview,
} from '@loambook/common';
import { FormField } from '@/components/form-field';
import { Select } from '@/components/select';
import {
  columnLabel,
  columnLetter,
  DATE_FORMAT_LABELS,
  DATE_FORMAT_NAMES,
  type MappingDraft,
  type MappingField,
} from '../mapping-draft';

interface MappingStepProps {
  preview: BankStatementPreview;
  draft: MappingDraft;
  onChange: (draft: MappingDraft) => void;
  /** Shown on the fields: the form's own checks and the server's. */
  errors: Partial<Record<MappingField, string>>;
}

const SOURCE_NOTE: Record<NonNullable<BankStatementPreview['mappingSource']>, string> = {
  saved: 'These are the columns chosen for this account last time. Check them against the rows below.',
  suggested: 'A first guess from the column names. Check it against the rows below.',
  given: 'The columns as chosen.',
};

/** Which role a column plays, for its heading in the preview. */
function roleOf(draft: MappingDraft, column: number): string | null {
  if (draft.dateColumn === column) return 'Date';
  if (draft.descriptionColumn === column) return 'Description';
  if (draft.amountKind === 'signed' && draft.amountColumn === column) return 'Amount';
  if (draft.amountKind === 'debit_credit' && draft.debitColumn === column) return 'Money out';
  if (draft.amountKind === 'debit_credit' && draft.creditColumn === column) return 'Money in';
  return null;
}

/**
 * The column-mapping step of an upload: the file's first rows as a table, and which column holds the date,
 * the description and the amount (one signed column, or a debit and a credit column), how dates are written,
 * and whether the first row names the columns.
 */
export function MappingStep({ preview, draft, onChange, errors }: MappingStepProps) {
  const body = draft.hasHeaderRow ? preview.rows.slice(1) : preview.rows;
  const firstRowNumber = draft.hasHeaderRow ? 2 : 1;
  const set = <K extends keyof MappingDraft>(key: K, value: MappingDraft[K]) => {
    const next = { ...draft, [key]: value };
    // A date column chosen by hand whose dates fit one format only: that format is chosen with it.
    if (key === 'dateColumn' && next.dateColumn !== null && next.dateFormat === null) {
      const only = dateFormatsFitting(body, next.dateColumn);
      if (only.length === 1) next.dateFormat = only[0]!;
    }
    onChange(next);
  };
  const columns = Array.from({ length: preview.columnCount }, (_, i) => i);
  const options = columns.map((i) => ({ label: columnLabel(preview.rows, i, draft.hasHeaderRow), value: i }));
  const withNone = [{ label: 'None', value: -1 }, ...options];
  // The formats the chosen date column's cells fit, in the rows shown (the server reads the whole file).
  const fits: readonly BankDateFormat[] =
    draft.dateColumn === null ? BANK_DATE_FORMATS : dateFormatsFitting(body, draft.dateColumn);
  const formatOptions = BANK_DATE_FORMATS.map((f) => ({
    label: `${DATE_FORMAT_LABELS[f]}${fits.includes(f) ? '' : ' — does not fit these dates'}`,
    value: f,
  }));
  const formatHint =
    draft.dateColumn === null
      ? undefined
      : fits.length > 1
        ? `Every date shown reads as ${fits.map((f) => DATE_FORMAT_NAMES[f]).join(' or as ')}: choose the one your bank uses.`
        : fits.length === 0
          ? 'No format fits every date in the column chosen: check the date column.'
          : undefined;
  const select = (
    field: MappingField,
    label: string,
    key: keyof MappingDraft,
    opts = options,
    required = true,
  ) => (
    <FormField id={`map-${field}`} label={label} error={errors[field]} required={required}>
      {({ invalid, id, ...aria }) => (
        <Select
          inputId={id}
          {...aria}
          value={(draft[key] as number | null) ?? (opts === withNone ? -1 : null)}
          options={opts}
          onChange={(e) => set(key, (e.value === -1 ? null : e.value) as never)}
          invalid={invalid}
          placeholder="Choose a column"
          panelClassName="app-overlay"
        />
      )}
    </FormField>
  );

  return (
    <section className="mapping-step" aria-labelledby="mapping-title">
      <h2 id="mapping-title" className="section-title">
        Choose the columns
      </h2>
      {preview.mappingSource ? (
        <p className="mapping-step__note">{SOURCE_NOTE[preview.mappingSource]}</p>
      ) : preview.suggestion.hasHeaderRow ? (
        // A header cell was recognised, so some column was guessed, though not a whole mapping.
        <Message
          severity="info"
          text="Some column names were recognised and are chosen below: check them and choose the rest."
        />
      ) : (
        <Message severity="info" text="The column names were not recognised: choose each column below." />
      )}
      <div className="checkbox-row">
        <Checkbox
          inputId="map-header"
          checked={draft.hasHeaderRow}
          onChange={(e) => set('hasHeaderRow', !!e.checked)}
        />
        <label htmlFor="map-header">The first row holds the column names (it is not a transaction)</label>
      </div>
      <div className="form-grid mapping-step__fields">
        {select('dateColumn', 'Date column', 'dateColumn')}
        <FormField
          id="map-dateFormat"
          label="Dates are written"
          error={errors.dateFormat}
          hint={formatHint}
          required
        >
          {({ invalid, id, ...aria }) => (
            <Select
              inputId={id}
              {...aria}
              value={draft.dateFormat}
              options={formatOptions}
              onChange={(e) => set('dateFormat', e.value as BankDateFormat)}
              invalid={invalid}
              placeholder="Choose a date format"
              panelClassName="app-overlay"
            />
          )}
        </FormField>
        {select('descriptionColumn', 'Description column', 'descriptionColumn', withNone, false)}
      </div>
      <fieldset className="mapping-step__amounts">
        <legend>Amounts are in</legend>
        <div className="radio-row">
          <RadioButton
            inputId="map-kind-signed"
            name="amountKind"
            value="signed"
            checked={draft.amountKind === 'signed'}
            onChange={() => set('amountKind', 'signed')}
          />
          <label htmlFor="map-kind-signed">One column: money in positive, money out negative</label>
        </div>
        <div className="radio-row">
          <RadioButton
            inputId="map-kind-dc"
            name="amountKind"
            value="debit_credit"
            checked={draft.amountKind === 'debit_credit'}
            onChange={() => set('amountKind', 'debit_credit')}
          />
          <label htmlFor="map-kind-dc">Two columns: a debit (money out) and a credit (money in)</label>
        </div>
        <div className="form-grid">
          {draft.amountKind === 'signed' ? (
            select('amountColumn', 'Amount column', 'amountColumn')
          ) : (
            <>
              {select('debitColumn', 'Debit (money out) column', 'debitColumn')}
              {select('creditColumn', 'Credit (money in) column', 'creditColumn')}
            </>
          )}
        </div>
      </fieldset>

      <div className="mapping-preview" role="region" aria-label="The first rows of the file" tabIndex={0}>
        <table className="mapping-preview__table">
          <caption className="visually-hidden">
            The first {preview.rows.length} of {preview.rowCount} rows of {preview.fileName}
          </caption>
          <thead>
            <tr>
              <th scope="col">Row</th>
              {columns.map((i) => {
                const role = roleOf(draft, i);
                return (
                  <th key={i} scope="col" className={role ? 'mapping-preview__chosen' : undefined}>
                    <span className="mapping-preview__letter">{columnLetter(i)}</span>
                    {draft.hasHeaderRow && preview.rows[0]?.[i] ? ` ${preview.rows[0][i]}` : ''}
                    {role ? <Tag value={role} className="mapping-preview__role" /> : null}
                  </th>
                );
              })}
            </tr>
          </thead>
          <tbody>
            {body.map((row, r) => (
              <tr key={r}>
                <th scope="row">{firstRowNumber + r}</th>
                {columns.map((i) => (
                  <td key={i} className={roleOf(draft, i) ? 'mapping-preview__chosen' : undefined}>
                    {row[i] ?? ''}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
