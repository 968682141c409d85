import '../reconciliation.css';
import { useState } from 'react';
import { Link } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Column } from 'primereact/column';
import { DataTable } from 'primereact/datatable';
import type { BankAccount, BankStatement } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { useAppAbility } from '@/features/auth/ability';
import { useBranches } from '@/features/branches/api/get-branches';
import { formatDateTime, localToday } from '@/lib/format';
import { useBankAccounts } from '../api/get-bank-accounts';
import { useBankStatements } from '../api/get-bank-statements';
import { NewBankAccountDialog } from '../components/new-bank-account-dialog';
import { accountLabel, formatAmount, formatDay, formatRange, monthOf } from '../reconciliation-format';

/** The company's bank accounts and the statements uploaded to them. */
export default function BankAccountsRoute() {
  const ability = useAppAbility();
  const accounts = useBankAccounts();
  const statements = useBankStatements(null);
  const branches = useBranches();
  const [adding, setAdding] = useState(false);
  const mayCreate = ability.can('create', 'Reconciliation');

  const actions = (a: BankAccount) => {
    const month = monthOf(a.statementsThrough ?? localToday());
    return (
      <div className="row-actions">
        {mayCreate ? (
          <Link to={paths.uploadStatement.href(a.id)} aria-label={`Upload a statement to ${accountLabel(a)}`}>
            Upload
          </Link>
        ) : null}
        <Link
          to={paths.reconciliation.href({ bankAccountId: a.id, ...month })}
          aria-label={`Reconcile ${accountLabel(a)}`}
        >
          Reconcile
        </Link>
      </div>
    );
  };

  return (
    <div className="page reconciliation-page">
      <PageHeader
        title="Bank accounts"
        description="The accounts whose statements are reconciled. Only the last four digits of a number are kept."
        actions={
          mayCreate ? (
            <Button
              type="button"
              label="New bank account"
              icon="pi pi-plus"
              onClick={() => setAdding(true)}
            />
          ) : null
        }
      />
      <Card className="content-card">
        {accounts.isPending ? (
          <TableSkeleton label="Loading the bank accounts" />
        ) : accounts.isError ? (
          <ApiErrorMessage error={accounts.error} />
        ) : accounts.data.length === 0 ? (
          <EmptyState icon="pi-wallet" title="No bank accounts yet">
            <p>Add the account the card processor pays into, then upload its statements.</p>
          </EmptyState>
        ) : (
          <DataTable
            value={accounts.data}
            dataKey="id"
            size="small"
            className="recon-table"
            pt={{ table: { 'aria-label': 'Bank accounts' } }}
          >
            <Column header="Account" body={(a: BankAccount) => accountLabel(a)} />
            <Column header="Whose" body={(a: BankAccount) => a.branchName ?? 'The whole company'} />
            <Column header="Payouts" body={(a: BankAccount) => (a.receivesPayouts ? 'Paid in here' : '—')} />
            <Column header="Statements" field="statementCount" />
            <Column header="Statements to" body={(a: BankAccount) => formatDay(a.statementsThrough)} />
            <Column header="Locked to" body={(a: BankAccount) => formatDay(a.lockedThrough)} />
            <Column header={<span className="visually-hidden">Actions</span>} body={actions} />
          </DataTable>
        )}
      </Card>
      <Card className="content-card">
        <h2 className="section-title">Statements uploaded</h2>
        {statements.isPending ? (
          <TableSkeleton label="Loading the statements" />
        ) : statements.isError ? (
          <ApiErrorMessage error={statements.error} />
        ) : statements.data.length === 0 ? (
          <EmptyState icon="pi-file" title="No statements yet" />
        ) : (
          <DataTable
            value={statements.data}
            dataKey="id"
            size="small"
            className="recon-table"
            pt={{ table: { 'aria-label': 'Statements' } }}
          >
            <Column header="Account" field="bankAccountName" />
            <Column header="File" field="fileName" />
            <Column header="Period" body={(s: BankStatement) => formatRange(s.periodFrom, s.periodTo)} />
            <Column
              header="Lines"
              body={(s: BankStatement) =>
                `${s.lineCount}${s.skippedRows.length ? ` (${s.skippedRows.length} rows skipped)` : ''}`
              }
            />
            <Column
              header="In"
              bodyClassName="recon-amount"
              headerClassName="recon-amount"
              body={(s: BankStatement) => formatAmount(s.moneyIn)}
            />
            <Column
              header="Out"
              bodyClassName="recon-amount"
              headerClassName="recon-amount"
              body={(s: BankStatement) => formatAmount(s.moneyOut)}
            />
            <Column header="Matched" body={(s: BankStatement) => `${s.matchedCount} of ${s.lineCount}`} />
            <Column
              header="Uploaded"
              body={(s: BankStatement) => `${formatDateTime(s.uploadedAt)} · ${s.uploadedBy.name}`}
            />
          </DataTable>
        )}
      </Card>
      <NewBankAccountDialog
        visible={adding}
        branches={branches.data ?? []}
        onClose={() => setAdding(false)}
      />
    </div>
  );
}
