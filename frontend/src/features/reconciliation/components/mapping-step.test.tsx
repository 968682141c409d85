import { useState } from 'react';
import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import type { BankStatementPreview } from '@loambook/common';
import { draftFrom, EMPTY_DRAFT, mappingFrom, type MappingDraft, type MappingField } from '../mapping-draft';
import { PREVIEW } from '../testing/fixtures';
import { MappingStep } from './mapping-step';

const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });
const visibleList = { hidden: true } as const;

function Harness({
  preview = PREVIEW,
  start = draftFrom(PREVIEW.mapping),
  errors = {},
  seen,
}: {
  preview?: BankStatementPreview;
  start?: MappingDraft;
  errors?: Partial<Record<MappingField, string>>;
  seen?: MappingDraft[];
}) {
  const [draft, setDraft] = useState(start);
  return (
    <MappingStep
      preview={preview}
      draft={draft}
      onChange={(d) => {
        seen?.push(d);
        setDraft(d);
      }}
      errors={errors}
    />
  );
}

describe('mapping step', () => {
  it('shows the first rows under their columns, with the role each chosen column plays', () => {
    render(<Harness />);
    expect(screen.getByText(/A first guess from the column names/)).toBeInTheDocument();
    const table = screen.getByRole('table');
    const headers = within(table)
      .getAllByRole('columnheader')
      .map((h) => h.textContent);
    expect(headers).toEqual([
      'Row',
      'A Posting DateDate',
      'B DescriptionDescription',
      'C DebitMoney out',
      'D CreditMoney in',
    ]);
    // The header row is not a transaction: the body starts at row 2, as a spreadsheet numbers it.
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows).toHaveLength(3);
    expect(within(rows[0]!).getByRole('rowheader')).toHaveTextContent('2');
    expect(within(rows[1]!).getByText('1,800.00')).toBeInTheDocument();
    expect(screen.getByLabelText('Debit (money out) column')).toBeInTheDocument();
    expect(screen.getByLabelText('Credit (money in) column')).toBeInTheDocument();
    expect(screen.queryByLabelText('Amount column')).not.toBeInTheDocument();
  });

  it('switches to one signed amount column and lets the bookkeeper pick it', async () => {
    const seen: MappingDraft[] = [];
    render(<Harness seen={seen} />);
    await userEvent.click(screen.getByLabelText(/One column: money in positive/));
    expect(seen.at(-1)?.amountKind).toBe('signed');
    await userEvent.click(screen.getByLabelText('Amount column'));
    await userEvent.click(await screen.findByRole('option', { name: 'D · Credit', ...visibleList }));
    expect(seen.at(-1)).toMatchObject({ amountKind: 'signed', amountColumn: 3 });
    expect(screen.getAllByText('Amount').length).toBeGreaterThan(0);
  });

  it('numbers rows from 1 and labels columns by a sample value when the first row is a transaction', async () => {
    render(<Harness />);
    await userEvent.click(screen.getByLabelText(/The first row holds the column names/));
    const rows = within(screen.getByRole('table')).getAllByRole('row').slice(1);
    expect(rows).toHaveLength(4);
    expect(within(rows[0]!).getByRole('rowheader')).toHaveTextContent('1');
    await userEvent.click(screen.getByLabelText('Date column'));
    expect(
      (await screen.findAllByRole('option', { name: 'A · e.g. Posting Date', ...visibleList })).length,
    ).toBeGreaterThan(0);
  });

  it('asks for a choice when the dates fit two formats', () => {
    const ambiguous: BankStatementPreview = {
      ...PREVIEW,
      suggestion: {
        ...PREVIEW.suggestion,
        dateFormat: null,
        dateFormatCandidates: ['MM/DD/YYYY', 'DD/MM/YYYY'],
      },
      mapping: null,
      mappingSource: null,
    };
    render(<Harness preview={ambiguous} start={{ ...EMPTY_DRAFT, dateColumn: 0 }} />);
    expect(screen.getByText(/column names were not recognised/)).toBeInTheDocument();
    expect(screen.getByLabelText('Dates are written')).toHaveAccessibleDescription(
      /reads as MM\/DD\/YYYY or as DD\/MM\/YYYY: choose the one your bank uses/,
    );
  });

  it('shows errors on the fields they belong to', () => {
    render(<Harness errors={{ debitColumn: 'Choose the column with money out.' }} />);
    expect(screen.getByLabelText('Debit (money out) column')).toHaveAccessibleDescription(
      'Choose the column with money out.',
    );
  });
});

describe('mappingFrom', () => {
  it.each([
    {
      name: 'nothing chosen: the date, its format and the amount are asked for',
      draft: EMPTY_DRAFT,
      errors: ['amountColumn', 'dateColumn', 'dateFormat'],
    },
    {
      name: 'the same column twice',
      draft: { ...EMPTY_DRAFT, dateColumn: 0, dateFormat: 'YYYY-MM-DD' as const, amountColumn: 0 },
      errors: ['amountColumn'],
    },
    {
      name: 'debit and credit both needed',
      draft: {
        ...EMPTY_DRAFT,
        amountKind: 'debit_credit' as const,
        dateColumn: 0,
        dateFormat: 'YYYY-MM-DD' as const,
        debitColumn: 2,
      },
      errors: ['creditColumn'],
    },
  ])('$name', ({ draft, errors }) => {
    const r = mappingFrom(draft);
    expect(r.mapping).toBeNull();
    expect(Object.keys(r.errors ?? {}).sort()).toEqual(errors);
  });

  it('builds the mapping the server takes, and reads it back unchanged', () => {
    const r = mappingFrom(draftFrom(PREVIEW.mapping));
    expect(r.mapping).toEqual(PREVIEW.mapping);
  });
});
