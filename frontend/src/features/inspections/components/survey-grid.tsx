import { useEffect, useRef, useState } from 'react';
import type { KeyboardEvent } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import {
  COLUMN_LABELS,
  flipSign,
  nextLabel,
  rowKey,
  SURVEY_COLUMNS,
  type SurveyColumn,
  type SurveyErrors,
  type SurveyRow,
} from '../survey-draft';

interface SurveyGridProps {
  rows: SurveyRow[];
  referenceKey: string | null;
  onRowsChange: (update: (rows: SurveyRow[]) => SurveyRow[]) => void;
  onReferenceChange: (key: string) => void;
  errors: SurveyErrors;
  disabled: boolean;
}

const pointName = (row: SurveyRow, index: number) =>
  row.label.trim() ? `point ${row.label.trim()}` : `point ${index + 1}`;

/**
 * The floor-elevation readings, one row per point: where it is on the plan (feet) and how high the floor
 * is there (inches, relative to the reference point). Enter moves down a column, as on a level-book page;
 * Enter on the last row adds the next point.
 */
export function SurveyGrid({
  rows,
  referenceKey,
  onRowsChange,
  onReferenceChange,
  errors,
  disabled,
}: SurveyGridProps) {
  const tableRef = useRef<HTMLTableElement>(null);
  const [focusNext, setFocusNext] = useState<{ row: number; column: SurveyColumn } | null>(null);

  useEffect(() => {
    if (!focusNext) return;
    const input = tableRef.current?.querySelector<HTMLInputElement>(
      `input[data-row="${focusNext.row}"][data-column="${focusNext.column}"]`,
    );
    if (input) {
      input.focus();
      input.select();
      setFocusNext(null);
    }
  }, [focusNext, rows]);

  const addPoint = (focusColumn: SurveyColumn = 'xFt') => {
    onRowsChange((all) => [
      ...all,
      { key: rowKey(), label: nextLabel(all), xFt: '', yFt: '', elevationIn: '' },
    ]);
    setFocusNext({ row: rows.length, column: focusColumn });
  };

  const onKeyDown = (event: KeyboardEvent<HTMLInputElement>, index: number, column: SurveyColumn) => {
    if (event.key !== 'Enter') return;
    event.preventDefault();
    if (index + 1 < rows.length) setFocusNext({ row: index + 1, column });
    else addPoint(column);
  };

  const set = (key: string, column: SurveyColumn, value: string) =>
    onRowsChange((all) => all.map((r) => (r.key === key ? { ...r, [column]: value } : r)));

  return (
    <div className="survey-grid">
      <div className="survey-grid__scroll">
        <table ref={tableRef} className="survey-table">
          <caption className="visually-hidden">Survey points</caption>
          <thead>
            <tr>
              <th scope="col" className="survey-table__ref-head">
                <span className="th-long">Reference</span>
                <span className="th-short" aria-hidden="true">
                  Ref.
                </span>
              </th>
              {SURVEY_COLUMNS.map((c) => (
                <th key={c} scope="col" className={`survey-table__head--${c}`}>
                  {COLUMN_LABELS[c]}
                </th>
              ))}
              <th scope="col" className="survey-table__remove-head">
                <span className="visually-hidden">Remove</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r, i) => {
              const name = pointName(r, i);
              const isRef = r.key === referenceKey;
              return (
                <tr key={r.key} className={isRef ? 'survey-table__row--ref' : undefined}>
                  <td className="survey-table__ref">
                    <label className="ref-radio">
                      <input
                        type="radio"
                        name="survey-reference"
                        checked={isRef}
                        onChange={() => onReferenceChange(r.key)}
                        disabled={disabled}
                        aria-label={`Reference: ${name}`}
                      />
                      <span aria-hidden="true">{isRef ? 'Ref.' : ''}</span>
                    </label>
                  </td>
                  {SURVEY_COLUMNS.map((c) => {
                    const error = errors[`${r.key}.${c}`];
                    const errorId = error ? `survey-${r.key}-${c}-error` : undefined;
                    return (
                      <td key={c} className={`survey-table__cell survey-table__cell--${c}`}>
                        <div
                          className={
                            c === 'elevationIn' ? 'survey-input survey-input--signed' : 'survey-input'
                          }
                        >
                          <InputText
                            value={r[c]}
                            onChange={(e) => set(r.key, c, e.target.value)}
                            onKeyDown={(e) => onKeyDown(e, i, c)}
                            onFocus={(e) => e.currentTarget.select()}
                            data-row={i}
                            data-column={c}
                            aria-label={`${COLUMN_LABELS[c]} for ${name}`}
                            aria-invalid={error ? true : undefined}
                            aria-describedby={errorId}
                            invalid={!!error}
                            inputMode={c === 'label' ? 'text' : 'decimal'}
                            enterKeyHint="next"
                            autoComplete="off"
                            maxLength={c === 'label' ? 16 : 10}
                            disabled={disabled}
                          />
                          {c === 'elevationIn' && !disabled ? (
                            <Button
                              type="button"
                              label="±"
                              aria-label={`Change the sign of the elevation for ${name}`}
                              className="sign-button"
                              text
                              onClick={() => set(r.key, c, flipSign(r[c]))}
                              tabIndex={-1}
                            />
                          ) : null}
                        </div>
                        {error ? (
                          <small id={errorId} className="form-field__error survey-table__error">
                            {error}
                          </small>
                        ) : null}
                      </td>
                    );
                  })}
                  <td className="survey-table__remove">
                    {disabled ? null : (
                      <Button
                        type="button"
                        icon="pi pi-times"
                        aria-label={`Remove ${name}`}
                        text
                        rounded
                        severity="secondary"
                        disabled={rows.length <= 1}
                        onClick={() => onRowsChange((all) => all.filter((x) => x.key !== r.key))}
                      />
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {errors.reference ? <p className="form-field__error">{errors.reference}</p> : null}
      {disabled ? null : (
        <div className="survey-grid__actions">
          <Button type="button" label="Add point" icon="pi pi-plus" outlined onClick={() => addPoint()} />
          <span className="muted survey-grid__tip">
            Enter moves down a column; on the last row it adds a point.
          </span>
        </div>
      )}
    </div>
  );
}
