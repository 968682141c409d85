import { Link } from 'react-router';
import { Column } from 'primereact/column';
import { ColumnGroup } from 'primereact/columngroup';
import { DataTable } from 'primereact/datatable';
import { Row } from 'primereact/row';
import {
  ACCOUNT_TYPE_LABELS,
  formatUsd,
  trialBalance,
  type TrialBalance,
  type TrialBalanceTotals,
} from '@loambook/common';
import { tableLayout } from '@/components/table-layout';
import { useMediaQuery, WIDE_TABLE } from '@/lib/use-media-query';
import { columnAmount } from '../ledger-format';

type TrialRow = TrialBalance['rows'][number];

interface TrialBalanceTableProps {
  trialBalance: TrialBalance;
  /** A link to the account's ledger, when one branch is shown. */
  accountHref?: (accountId: string) => string;
}

/**
 * Whether the columns agree, judged twice: by the server's totals and by adding up the rows shown here. If
 * either says no, or they differ, the table is out of balance.
 */
export function checkTrialBalance(tb: TrialBalance): TrialBalanceTotals {
  const mine = trialBalance(tb.rows).totals;
  const agrees =
    mine.debitBalance === tb.totals.debitBalance &&
    mine.creditBalance === tb.totals.creditBalance &&
    mine.debitTotal === tb.totals.debitTotal &&
    mine.creditTotal === tb.totals.creditTotal;
  return { ...mine, balanced: mine.balanced && tb.totals.balanced && agrees };
}

/** The state of the books, in words: a quiet line when they balance, an alert nobody can miss when not. */
export function BalanceCheck({ totals }: { totals: TrialBalanceTotals }) {
  if (totals.balanced) {
    return (
      <p className="ledger-check ledger-check--ok" role="status">
        <i className="pi pi-check-circle" aria-hidden="true" />
        <span>
          <strong>Balanced.</strong> Debits equal credits: {formatUsd(totals.debitBalance)} on each side.
        </span>
      </p>
    );
  }
  const gap = totals.difference.replace('-', '');
  return (
    <div className="ledger-check ledger-check--bad" role="alert">
      <i className="pi pi-exclamation-triangle" aria-hidden="true" />
      <div>
        <p className="ledger-check__title">
          OUT OF BALANCE{gap !== '0.00' ? ` by ${formatUsd(gap.replace('-', ''))}` : ''}
        </p>
        <p>
          Debit balances {formatUsd(totals.debitBalance)}, credit balances {formatUsd(totals.creditBalance)}
          {' · '}
          all debits {formatUsd(totals.debitTotal)}, all credits {formatUsd(totals.creditTotal)}.
        </p>
        <p>
          Every entry is checked when it is posted, so this should never happen. Do not close the period:
          print this page and contact support.
        </p>
      </div>
    </div>
  );
}

/** Each account's balance in the debit or the credit column, with the column totals underneath. */
export function TrialBalanceTable({ trialBalance: tb, accountHref }: TrialBalanceTableProps) {
  const wide = useMediaQuery(WIDE_TABLE);
  const totals = checkTrialBalance(tb);
  const footer = (
    <ColumnGroup>
      <Row>
        <Column footer="Total" colSpan={3} footerClassName="ledger-total-label" />
        <Column footer={formatUsd(totals.debitBalance)} footerClassName="ledger-amount" />
        <Column footer={formatUsd(totals.creditBalance)} footerClassName="ledger-amount" />
      </Row>
      {!totals.balanced ? (
        <Row>
          <Column footer="Difference" colSpan={3} footerClassName="ledger-total-label ledger-total--bad" />
          <Column
            footer={formatUsd(totals.difference.replace('-', ''))}
            colSpan={2}
            footerClassName="ledger-amount ledger-total--bad"
          />
        </Row>
      ) : null}
    </ColumnGroup>
  );
  return (
    <div className={totals.balanced ? 'trial-balance' : 'trial-balance trial-balance--bad'}>
      <BalanceCheck totals={totals} />
      <DataTable
        value={tb.rows}
        dataKey="code"
        size="small"
        stripedRows
        footerColumnGroup={footer}
        className="ledger-table"
        pt={{ table: { 'aria-label': 'Trial balance' } }}
        {...tableLayout(wide)}
      >
        <Column field="code" header="Code" style={{ width: '6rem' }} />
        <Column
          header="Account"
          body={(r: TrialRow) =>
            r.accountId && accountHref ? <Link to={accountHref(r.accountId)}>{r.name}</Link> : r.name
          }
        />
        <Column header="Type" body={(r: TrialRow) => ACCOUNT_TYPE_LABELS[r.type]} />
        <Column
          header="Debit"
          body={(r: TrialRow) => columnAmount(r.debitBalance)}
          headerClassName="ledger-amount"
          bodyClassName="ledger-amount"
        />
        <Column
          header="Credit"
          body={(r: TrialRow) => columnAmount(r.creditBalance)}
          headerClassName="ledger-amount"
          bodyClassName="ledger-amount"
        />
      </DataTable>
    </div>
  );
}
