import { DataTable } from 'primereact/datatable';
import { Column } from 'primereact/column';
import type { BankCsvRowError } from '@loambook/common';

const FIELD_LABEL: Record<string, string> = {
  date: 'Date',
  amount: 'Amount',
  debit: 'Debit',
  credit: 'Credit',
};

/** The rows of a file that cannot be read, by row number as a spreadsheet shows them. */
export function RowErrors({
  errors,
  total,
  caption,
}: {
  errors: BankCsvRowError[];
  /** How many there are in all (only the first ones may be listed). */
  total: number;
  caption: string;
}) {
  return (
    <div className="row-errors">
      <p className="row-errors__caption" id="row-errors-caption">
        {caption}
        {total > errors.length ? ` The first ${errors.length} of ${total} are listed.` : ''}
      </p>
      <DataTable
        value={errors}
        size="small"
        scrollable
        scrollHeight="16rem"
        pt={{ table: { 'aria-labelledby': 'row-errors-caption' } }}
        className="row-errors__table"
      >
        <Column field="rowNumber" header="Row" style={{ width: '5rem' }} />
        <Column
          header="Column"
          body={(e: BankCsvRowError) => FIELD_LABEL[e.field] ?? e.field}
          style={{ width: '7rem' }}
        />
        <Column field="message" header="Problem" />
      </DataTable>
    </div>
  );
}
