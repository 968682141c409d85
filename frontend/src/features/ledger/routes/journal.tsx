import '../ledger.css';
import { useCallback, useState } from 'react';
import { useSearchParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Paginator } from 'primereact/paginator';
import { asSubject, REASON_LABELS, type JournalEntry, type ReasonCode } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { useAppAbility } from '@/features/auth/ability';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { JOURNAL_PAGE_SIZES, journalParams, useJournal } from '../api/get-journal';
import { JournalTable } from '../components/journal-table';
import { LedgerActions } from '../components/ledger-actions';
import { LedgerFilters } from '../components/ledger-filters';
import { PrintHeading } from '../components/print-heading';
import { ReverseEntryDialog } from '../components/reverse-entry-dialog';
import { formatDay } from '../ledger-format';
import { journalViewFromParams, paramsFromJournalView, type JournalView } from '../ledger-query';

export default function JournalRoute() {
  const ability = useAppAbility();
  const notify = useNotify();
  const { branchId, branch, branches, allowAll, setBranchId } = useCurrentBranch();
  const [params, setParams] = useSearchParams();
  const view = journalViewFromParams(params);
  const query = { branchId, from: view.from, to: view.to, reasonCode: view.reasonCode };
  const journal = useJournal({ ...query, page: view.page, pageSize: view.pageSize });
  const [toReverse, setToReverse] = useState<JournalEntry | null>(null);

  const setView = useCallback(
    (patch: Partial<JournalView>) =>
      setParams(
        (current) => {
          const now = journalViewFromParams(current);
          return paramsFromJournalView({ ...now, ...patch, ...('page' in patch ? {} : { page: 1 }) });
        },
        { replace: true },
      ),
    [setParams],
  );
  const clear = () =>
    setParams(paramsFromJournalView({ from: '', to: '', reasonCode: '', page: 1, pageSize: view.pageSize }), {
      replace: true,
    });

  const canReverse = (e: JournalEntry) =>
    !e.reversedByEntryId && ability.can('create', asSubject('JournalEntry', { branchId: e.branchId }));
  const filtered = !!(view.from || view.to || view.reasonCode);
  const scope = branch ? `${branch.code} · ${branch.name}` : 'All branches';

  return (
    <div className="page page--wide ledger-page">
      <PageHeader
        title="Journal"
        description={
          <>
            Every amount posted, as entries of balanced lines. Posted entries never change: a correction is a
            reversing entry that names the original. <span className="scope-note">Showing {scope}.</span>
          </>
        }
        actions={
          <LedgerActions csvPath="/ledger/journal" csvQuery={journalParams(query)} what="the journal" />
        }
      />
      <PrintHeading
        title="Journal"
        lines={[
          scope,
          view.from || view.to
            ? `${formatDay(view.from, 'the start')} to ${formatDay(view.to, 'today')}`
            : 'All dates',
          view.reasonCode ? REASON_LABELS[view.reasonCode as ReasonCode] : '',
        ]}
      />
      <Card className="content-card">
        <LedgerFilters
          idPrefix="journal"
          branch={{ branchId, branches, allowAll, onChange: setBranchId }}
          range={{ from: view.from, to: view.to }}
          onRange={(r) => setView(r)}
          reasonCode={view.reasonCode}
          onReason={(reasonCode) => setView({ reasonCode })}
          onClear={clear}
        />
        {journal.isPending ? (
          <TableSkeleton label="Loading the journal" rows={8} />
        ) : journal.isError ? (
          <ApiErrorMessage error={journal.error} />
        ) : journal.data.total === 0 ? (
          filtered ? (
            <EmptyState icon="pi-filter-slash" title="No entries match these filters">
              <Button type="button" label="Clear filters" text onClick={clear} />
            </EmptyState>
          ) : (
            <EmptyState icon="pi-book" title="Nothing posted yet">
              Deposits, payouts, completed jobs and commissions post here as they happen.
            </EmptyState>
          )
        ) : (
          <>
            <JournalTable
              entries={journal.data.items}
              showBranch={branchId === null}
              canReverse={canReverse}
              onReverse={setToReverse}
              loading={journal.isPlaceholderData && journal.isFetching}
            />
            <Paginator
              className="ledger-no-print"
              first={(view.page - 1) * view.pageSize}
              rows={view.pageSize}
              totalRecords={journal.data.total}
              rowsPerPageOptions={[...JOURNAL_PAGE_SIZES]}
              onPageChange={(e) => setView({ page: e.page + 1, pageSize: e.rows as JournalView['pageSize'] })}
              template="FirstPageLink PrevPageLink PageLinks NextPageLink LastPageLink RowsPerPageDropdown CurrentPageReport"
              currentPageReportTemplate="{first}–{last} of {totalRecords} entries"
            />
          </>
        )}
      </Card>
      <ReverseEntryDialog
        entry={toReverse}
        onClose={() => setToReverse(null)}
        onDone={(reversal) => {
          setToReverse(null);
          notify.success(
            'Reversal posted',
            `${reversal.memo ?? 'Reversal'} · ${formatDay(reversal.effectiveOn)}`,
          );
        }}
      />
    </div>
  );
}
