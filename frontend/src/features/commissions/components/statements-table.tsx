import { Link } from 'react-router';
import { Column } from 'primereact/column';
import { DataTable } from 'primereact/datatable';
import { Tag } from 'primereact/tag';
import { formatUsd, type CommissionStatementSummary } from '@loambook/common';
import { paths } from '@/app/paths';
import { tableLayout } from '@/components/table-layout';
import { useMediaQuery, WIDE_TABLE } from '@/lib/use-media-query';
import { formatPeriod, STATUS_LABELS, STATUS_SEVERITY } from '../commission-format';

const amount = (value: string) => formatUsd(value);

/** Statements, newest period first: each links to its lines. */
export function StatementsTable({
  statements,
  showBranch = true,
  showSalesperson = true,
}: {
  statements: CommissionStatementSummary[];
  showBranch?: boolean;
  showSalesperson?: boolean;
}) {
  const wide = useMediaQuery(WIDE_TABLE);
  return (
    <DataTable
      value={statements}
      dataKey="id"
      size="small"
      className="commission-table"
      pt={{ table: { 'aria-label': 'Commission statements' } }}
      {...tableLayout(wide)}
    >
      <Column
        header="Pay period"
        body={(s: CommissionStatementSummary) => (
          <Link to={paths.commissionStatement.href(s.id)}>{formatPeriod(s.periodStart, s.periodEnd)}</Link>
        )}
      />
      {showBranch ? <Column header="Branch" field="branchCode" /> : null}
      {showSalesperson ? <Column header="Salesperson" field="salespersonName" /> : null}
      <Column
        header="Status"
        body={(s: CommissionStatementSummary) => (
          <Tag value={STATUS_LABELS[s.status]} severity={STATUS_SEVERITY[s.status]} />
        )}
      />
      <Column
        header="Earned"
        body={(s: CommissionStatementSummary) => amount(s.earned)}
        headerClassName="commission-amount"
        bodyClassName="commission-amount"
      />
      <Column
        header="Clawed back"
        body={(s: CommissionStatementSummary) => amount(s.clawedBack)}
        headerClassName="commission-amount"
        bodyClassName="commission-amount"
      />
      <Column
        header="Carried in"
        body={(s: CommissionStatementSummary) => amount(s.carriedIn)}
        headerClassName="commission-amount"
        bodyClassName="commission-amount"
      />
      <Column
        header="Payable"
        body={(s: CommissionStatementSummary) => <strong>{amount(s.payable)}</strong>}
        headerClassName="commission-amount"
        bodyClassName="commission-amount"
      />
    </DataTable>
  );
}
