import { useState } from 'react';
import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import type { BankStatementPreview } from '@loambook/common';
import {
  draftFrom,
  draftFromSuggestion,
  EMPTY_DRAFT,
  mappingFrom,
  type MappingDraft,
  type MappingField,
} from '../mapping-draft';
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

  // Column names no guess knows, and dates that read both ways (12/06 is 6 December or 12 June).
  const unnamed: BankStatementPreview = {
    ...PREVIEW,
    rows: [
      ['Posted', 'Payee', 'Out', 'In'],
      ['12/06/2026', 'MARROWFIELD WATER DEPT', '86.40', ''],
      ['12/07/2026', 'CARD PROCESSOR TRANSFER', '', '631.82'],
    ],
    suggestion: {
      hasHeaderRow: false,
      dateColumn: null,
      descriptionColumn: null,
      amount: null,
      dateFormat: null,
      dateFormatCandidates: ['YYYY-MM-DD', 'MM/DD/YYYY', 'DD/MM/YYYY'],
    },
    mapping: null,
    mappingSource: null,
  };

  it('asks for a choice when the dates of the column chosen by hand fit two formats', async () => {
    const seen: MappingDraft[] = [];
    render(<Harness preview={unnamed} start={draftFromSuggestion(unnamed.suggestion)} seen={seen} />);
    expect(screen.getByText(/column names were not recognised/)).toBeInTheDocument();
    await userEvent.click(screen.getByLabelText(/The first row holds the column names/));
    await userEvent.click(screen.getByLabelText('Date column'));
    await userEvent.click(await screen.findByRole('option', { name: 'A · Posted', ...visibleList }));
    expect(seen.at(-1)).toMatchObject({ dateColumn: 0, dateFormat: null });
    expect(screen.getByLabelText('Dates are written')).toHaveAccessibleDescription(
      'Every date shown reads as month/day/year or as day/month/year: choose the one your bank uses.',
    );
  });

  it('chooses the date format with a date column whose dates fit one format only', async () => {
    const seen: MappingDraft[] = [];
    const dayFirst = {
      ...unnamed,
      rows: [unnamed.rows[0]!, ['31/12/2026', 'X', '1.00', ''], ['13/12/2026', 'Y', '', '2.00']],
    };
    render(
      <Harness
        preview={dayFirst}
        start={{ ...draftFromSuggestion(unnamed.suggestion), hasHeaderRow: true }}
        seen={seen}
      />,
    );
    expect(screen.getByLabelText('Dates are written')).not.toHaveAccessibleDescription(/reads as/);
    await userEvent.click(screen.getByLabelText('Date column'));
    await userEvent.click(await screen.findByRole('option', { name: 'A · Posted', ...visibleList }));
    expect(seen.at(-1)).toMatchObject({ dateColumn: 0, dateFormat: 'DD/MM/YYYY' });
  });

  it('keeps the columns a partial guess found and says so', () => {
    const partial: BankStatementPreview = {
      ...unnamed,
      suggestion: {
        ...unnamed.suggestion,
        hasHeaderRow: true,
        descriptionColumn: 1,
        amount: { kind: 'debit_credit', debitColumn: 2, creditColumn: 3 },
      },
    };
    const start = draftFromSuggestion(partial.suggestion);
    expect(start).toEqual({
      hasHeaderRow: true,
      dateColumn: null,
      descriptionColumn: 1,
      amountKind: 'debit_credit',
      amountColumn: null,
      debitColumn: 2,
      creditColumn: 3,
      dateFormat: null,
    });
    render(<Harness preview={partial} start={start} />);
    expect(screen.getByText(/Some column names were recognised/)).toBeInTheDocument();
    const headers = within(screen.getByRole('table'))
      .getAllByRole('columnheader')
      .map((h) => h.textContent);
    expect(headers).toEqual(['Row', 'A Posted', 'B PayeeDescription', 'C OutMoney out', 'D InMoney in']);
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
