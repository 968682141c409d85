import '../ledger.css';
import { useCallback } from 'react';
import { useSearchParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Paginator } from 'primereact/paginator';
import { ACCOUNT_TYPE_LABELS } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Select } from '@/components/select';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { ACCOUNT_PAGE_SIZES, accountLinesPath, useAccountLedger } from '../api/get-account-ledger';
import { useLedgerAccounts } from '../api/get-ledger-accounts';
import { AccountLedgerTable } from '../components/account-ledger-table';
import { LedgerActions } from '../components/ledger-actions';
import { LedgerFilters } from '../components/ledger-filters';
import { PrintHeading } from '../components/print-heading';
import { formatDay } from '../ledger-format';
import { accountViewFromParams, paramsFromAccountView, type AccountView } from '../ledger-query';

export default function AccountLedgerRoute() {
  const { branchId, branch, branches, allowAll, setBranchId } = useCurrentBranch();
  const [params, setParams] = useSearchParams();
  const view = accountViewFromParams(params);
  const accounts = useLedgerAccounts(branchId);
  // An account of another branch (the branch was switched) is not shown: pick again.
  const account = accounts.data?.find((a) => a.id === view.accountId) ?? null;
  const ledger = useAccountLedger(
    account
      ? { accountId: account.id, from: view.from, to: view.to, page: view.page, pageSize: view.pageSize }
      : null,
  );

  const setView = useCallback(
    (patch: Partial<AccountView>) =>
      setParams(
        (current) => {
          const now = accountViewFromParams(current);
          return paramsFromAccountView({ ...now, ...patch, ...('page' in patch ? {} : { page: 1 }) });
        },
        { replace: true },
      ),
    [setParams],
  );

  const accountLabel = account ? `${account.code} · ${account.name}` : '';
  const lastPage = ledger.data ? view.page * view.pageSize >= ledger.data.total : false;

  return (
    <div className="page page--wide ledger-page">
      <PageHeader
        title="Account ledger"
        description="One account’s lines in date order, with the balance after each. Balances are on the account’s normal side."
        actions={
          <LedgerActions
            csvPath={account ? accountLinesPath(account.id) : null}
            csvQuery={{ from: view.from, to: view.to }}
            what={account ? `the lines of ${accountLabel}` : 'the account'}
          />
        }
      />
      <PrintHeading
        title={`Account ledger — ${accountLabel}`}
        lines={[
          branch ? `${branch.code} · ${branch.name}` : '',
          view.from || view.to
            ? `${formatDay(view.from, 'the start')} to ${formatDay(view.to, 'today')}`
            : 'All dates',
        ]}
      />
      <Card className="content-card">
        <LedgerFilters
          idPrefix="account"
          branch={{ branchId, branches, allowAll: false, onChange: setBranchId }}
          range={{ from: view.from, to: view.to }}
          onRange={(r) => setView(r)}
          onClear={() => setView({ from: '', to: '' })}
        >
          {branchId ? (
            <div className="ledger-filter ledger-filter--account">
              <label htmlFor="account-account" className="ledger-filter__label">
                Account
              </label>
              <Select
                inputId="account-account"
                value={account?.id ?? null}
                options={(accounts.data ?? []).map((a) => ({
                  label: `${a.code} · ${a.name}`,
                  value: a.id,
                }))}
                onChange={(e) => setView({ accountId: e.value as string })}
                placeholder={accounts.isPending ? 'Loading accounts…' : 'Choose an account'}
                loading={accounts.isFetching}
                className="w-full"
              />
            </div>
          ) : null}
        </LedgerFilters>
        {!branchId ? (
          <EmptyState icon="pi-building" title="Choose a branch">
            <p>Each branch keeps its own accounts. Pick one here or with the branch switcher at the top.</p>
            <div className="choose-branch">
              {branches.map((b) => (
                <Button
                  key={b.id}
                  type="button"
                  label={`${b.code} · ${b.name}`}
                  outlined
                  onClick={() => setBranchId(b.id)}
                />
              ))}
            </div>
            {allowAll ? <p className="muted">The trial balance adds every branch together.</p> : null}
          </EmptyState>
        ) : accounts.isError ? (
          <ApiErrorMessage error={accounts.error} />
        ) : !account ? (
          accounts.isPending ? (
            <TableSkeleton label="Loading the accounts" />
          ) : (
            <EmptyState icon="pi-list" title="Choose an account">
              Pick the account to read, for example 1050 · Card processor clearing to follow card money until
              it is paid out.
            </EmptyState>
          )
        ) : ledger.isPending ? (
          <TableSkeleton label="Loading the account’s lines" rows={8} />
        ) : ledger.isError ? (
          <ApiErrorMessage error={ledger.error} />
        ) : (
          <>
            <p className="ledger-account-meta">
              {ACCOUNT_TYPE_LABELS[account.type]} · normally a {account.normalSide} balance
              {account.salespersonSubledger ? ' · kept per salesperson' : ''}
            </p>
            <AccountLedgerTable
              ledger={ledger.data}
              lastPage={lastPage}
              loading={ledger.isPlaceholderData && ledger.isFetching}
            />
            {ledger.data.total > view.pageSize ? (
              <Paginator
                className="ledger-no-print"
                first={(view.page - 1) * view.pageSize}
                rows={view.pageSize}
                totalRecords={ledger.data.total}
                rowsPerPageOptions={[...ACCOUNT_PAGE_SIZES]}
                onPageChange={(e) =>
                  setView({ page: e.page + 1, pageSize: e.rows as AccountView['pageSize'] })
                }
                template="FirstPageLink PrevPageLink PageLinks NextPageLink LastPageLink RowsPerPageDropdown CurrentPageReport"
                currentPageReportTemplate="{first}–{last} of {totalRecords} lines"
              />
            ) : null}
          </>
        )}
      </Card>
    </div>
  );
}
