import { Column } from 'primereact/column';
import { ColumnGroup } from 'primereact/columngroup';
import { DataTable } from 'primereact/datatable';
import { Row } from 'primereact/row';
import { formatUsd, type AccountLedger, type AccountLedgerLine } from '@loambook/common';
import { tableLayout } from '@/components/table-layout';
import { useMediaQuery, WIDE_TABLE } from '@/lib/use-media-query';
import { columnAmount, formatDay } from '../ledger-format';

interface AccountLedgerTableProps {
  ledger: AccountLedger;
  /** Only the last page ends with the closing balance. */
  lastPage: boolean;
  loading?: boolean;
}

/** A balance on the account's normal side; a negative one is shown as "(other side)". */
function balance(value: string, otherSide: string): string {
  return value.startsWith('-') ? `${formatUsd(value.slice(1))} ${otherSide}` : formatUsd(value);
}

/** One account's lines in date order, each with the balance after it. */
export function AccountLedgerTable({ ledger, lastPage, loading }: AccountLedgerTableProps) {
  const wide = useMediaQuery(WIDE_TABLE);
  const otherSide = ledger.account.normalSide === 'debit' ? 'Cr' : 'Dr';
  const opening = (
    <ColumnGroup>
      <Row>
        <Column header="Date" />
        <Column header="Reason" />
        <Column header="Memo" />
        <Column header="Salesperson" />
        <Column header="Debit" headerClassName="ledger-amount" />
        <Column header="Credit" headerClassName="ledger-amount" />
        <Column header="Balance" headerClassName="ledger-amount" />
      </Row>
      <Row>
        <Column
          header={ledger.from ? `Opening balance, before ${formatDay(ledger.from)}` : 'Opening balance'}
          colSpan={6}
          headerClassName="ledger-total-label"
        />
        <Column header={balance(ledger.openingBalance, otherSide)} headerClassName="ledger-amount" />
      </Row>
    </ColumnGroup>
  );
  const closing = lastPage ? (
    <ColumnGroup>
      <Row>
        <Column
          footer={ledger.to ? `Closing balance, ${formatDay(ledger.to)}` : 'Closing balance'}
          colSpan={4}
          footerClassName="ledger-total-label"
        />
        <Column footer={formatUsd(ledger.debitTotal)} footerClassName="ledger-amount" />
        <Column footer={formatUsd(ledger.creditTotal)} footerClassName="ledger-amount" />
        <Column footer={balance(ledger.closingBalance, otherSide)} footerClassName="ledger-amount" />
      </Row>
    </ColumnGroup>
  ) : undefined;
  return (
    <DataTable
      value={ledger.lines}
      dataKey="lineId"
      size="small"
      stripedRows
      loading={loading}
      headerColumnGroup={opening}
      footerColumnGroup={closing}
      className="ledger-table"
      pt={{ table: { 'aria-label': `Lines of ${ledger.account.code} ${ledger.account.name}` } }}
      emptyMessage="No lines in these dates."
      {...tableLayout(wide)}
    >
      <Column header="Date" body={(l: AccountLedgerLine) => formatDay(l.effectiveOn)} />
      <Column header="Reason" body={(l: AccountLedgerLine) => l.reasonLabel} />
      <Column
        header="Memo"
        body={(l: AccountLedgerLine) => (l.memo && l.memo !== l.reasonLabel ? l.memo : '')}
      />
      <Column header="Salesperson" body={(l: AccountLedgerLine) => l.salespersonName ?? ''} />
      <Column
        header="Debit"
        body={(l: AccountLedgerLine) => (l.side === 'debit' ? columnAmount(l.amount) : '')}
        bodyClassName="ledger-amount"
      />
      <Column
        header="Credit"
        body={(l: AccountLedgerLine) => (l.side === 'credit' ? columnAmount(l.amount) : '')}
        bodyClassName="ledger-amount"
      />
      <Column
        header="Balance"
        body={(l: AccountLedgerLine) => balance(l.balance, otherSide)}
        bodyClassName="ledger-amount"
      />
    </DataTable>
  );
}
