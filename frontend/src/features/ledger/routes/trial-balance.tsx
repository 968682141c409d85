import '../ledger.css';
import { useSearchParams } from 'react-router';
import { Card } from 'primereact/card';
import { InputText } from 'primereact/inputtext';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { TableSkeleton } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { useTrialBalance } from '../api/get-trial-balance';
import { LedgerActions } from '../components/ledger-actions';
import { LedgerFilters } from '../components/ledger-filters';
import { PrintHeading } from '../components/print-heading';
import { TrialBalanceTable } from '../components/trial-balance-table';
import { formatDay } from '../ledger-format';
import { isCalendarDay } from '../ledger-query';

export default function TrialBalanceRoute() {
  const { branchId, branch, branches, allowAll, setBranchId } = useCurrentBranch();
  const [params, setParams] = useSearchParams();
  const asOfParam = params.get('asOf') ?? '';
  const asOf = isCalendarDay(asOfParam) ? asOfParam : '';
  const tb = useTrialBalance({ branchId, asOf });
  const scope = branch ? `${branch.code} · ${branch.name}` : 'All branches, like accounts added together';
  const shownAsOf = tb.data?.asOf ?? asOf;

  const setAsOf = (value: string) =>
    setParams(
      () => {
        const p = new URLSearchParams();
        if (value) p.set('asOf', value);
        return p;
      },
      { replace: true },
    );

  return (
    <div className="page ledger-page">
      <PageHeader
        title="Trial balance"
        description={
          <>
            Each account’s balance in the debit or credit column, up to and including the day chosen. The two
            columns always add to the same total. <span className="scope-note">Showing {scope}.</span>
          </>
        }
        actions={
          <LedgerActions
            csvPath="/ledger/trial-balance"
            csvQuery={{ branchId, asOf: shownAsOf }}
            what="the trial balance"
          />
        }
      />
      <PrintHeading title="Trial balance" lines={[scope, shownAsOf ? `as of ${formatDay(shownAsOf)}` : '']} />
      <Card className="content-card">
        <LedgerFilters
          idPrefix="trial"
          branch={{ branchId, branches, allowAll, onChange: setBranchId }}
          range={null}
        >
          <div className="ledger-filter">
            <label htmlFor="trial-as-of" className="ledger-filter__label">
              As of
            </label>
            <InputText
              id="trial-as-of"
              type="date"
              value={asOf || shownAsOf}
              onChange={(e) => setAsOf(isCalendarDay(e.target.value) ? e.target.value : '')}
              aria-describedby="trial-as-of-hint"
            />
            <small id="trial-as-of-hint" className="form-field__hint">
              Entries dated after this day are left out. Empty: today.
            </small>
          </div>
        </LedgerFilters>
        {tb.isPending ? (
          <TableSkeleton label="Loading the trial balance" rows={10} />
        ) : tb.isError ? (
          <ApiErrorMessage error={tb.error} />
        ) : (
          <TrialBalanceTable
            trialBalance={tb.data}
            accountHref={(accountId) => paths.ledgerAccount.href({ accountId, to: tb.data.asOf })}
          />
        )}
      </Card>
    </div>
  );
}
