import '../jobs.css';
import { useState } from 'react';
import { Link } from 'react-router';
import { Card } from 'primereact/card';
import { Column } from 'primereact/column';
import { DataTable } from 'primereact/datatable';
import { InputText } from 'primereact/inputtext';
import { SelectButton } from 'primereact/selectbutton';
import { addCalendarDays, formatUsd, money, type ActualsSummaryRow } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { tableLayout } from '@/components/table-layout';
import { useMediaQuery, WIDE_TABLE } from '@/lib/use-media-query';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { useActualsSummary } from '../api/get-actuals';
import { formatPoints, todayFor } from '../job-format';

const BY = [
  { label: 'By salesperson', value: 'salesperson' },
  { label: 'By branch', value: 'branch' },
];

/** Points of drift beyond which a row is called out (common practice: a couple of points is noise). */
const DRIFT_FLAG_PTS = '-2';

function driftOf(r: ActualsSummaryRow) {
  try {
    return money(r.marginDriftPts ?? '0');
  } catch {
    return money('0');
  }
}

/** Completed jobs' estimated against actual margin, summed per salesperson or per branch: who under-estimates. */
export default function ActualsSummaryRoute() {
  const wide = useMediaQuery(WIDE_TABLE);
  const { branchId, branch } = useCurrentBranch();
  const today = todayFor(branch?.timezone);
  const [by, setBy] = useState<'salesperson' | 'branch'>('salesperson');
  const [from, setFrom] = useState(addCalendarDays(today, -180));
  const [to, setTo] = useState(today);
  const summary = useActualsSummary({ branchId, from, to, by });
  const rows = [...(summary.data ?? [])].sort((a, b) => driftOf(a).comparedTo(driftOf(b)));

  return (
    <div className="page page--wide jobs-page">
      <Link to={paths.jobs.href()} className="back-link">
        <i className="pi pi-arrow-left" aria-hidden="true" /> Jobs
      </Link>
      <PageHeader
        title="Actual margins"
        description={`Completed jobs, estimate against the install log. Worst drift first: a negative drift means the cost ran over the estimate. ${
          branch ? `${branch.code} · ${branch.name}.` : 'All branches.'
        }`}
      />
      <Card className="content-card">
        <div className="table-toolbar" role="search" aria-label="Period">
          <SelectButton
            value={by}
            options={BY}
            onChange={(e) => e.value && setBy(e.value as 'salesperson' | 'branch')}
            allowEmpty={false}
            aria-label="Group"
          />
          <span className="table-toolbar__filter">
            <label htmlFor="summary-from" className="table-toolbar__filter-label">
              Completed from
            </label>
            <InputText id="summary-from" type="date" value={from} onChange={(e) => setFrom(e.target.value)} />
          </span>
          <span className="table-toolbar__filter">
            <label htmlFor="summary-to" className="table-toolbar__filter-label">
              to
            </label>
            <InputText id="summary-to" type="date" value={to} onChange={(e) => setTo(e.target.value)} />
          </span>
        </div>
        {summary.isPending ? (
          <TableSkeleton rows={4} label="Loading margins" />
        ) : summary.isError ? (
          <ApiErrorMessage error={summary.error} />
        ) : rows.length === 0 ? (
          <EmptyState icon="pi-chart-bar" title="No completed jobs in this period">
            Margins show here once jobs are completed with their install log.
          </EmptyState>
        ) : (
          <DataTable value={rows} dataKey="key" className="data-table" {...tableLayout(wide)}>
            <Column header={by === 'salesperson' ? 'Salesperson' : 'Branch'} field="name" />
            <Column header="Jobs" field="jobs" className="numeric" headerClassName="numeric" />
            <Column
              header="Price"
              className="numeric"
              headerClassName="numeric"
              body={(r: ActualsSummaryRow) => formatUsd(r.price)}
            />
            <Column
              header="Estimated cost"
              className="numeric"
              headerClassName="numeric"
              body={(r: ActualsSummaryRow) => formatUsd(r.estimatedCost)}
            />
            <Column
              header="Actual cost"
              className="numeric"
              headerClassName="numeric"
              body={(r: ActualsSummaryRow) => formatUsd(r.actualCost)}
            />
            <Column
              header="Estimated margin"
              className="numeric"
              headerClassName="numeric"
              body={(r: ActualsSummaryRow) => (r.estimatedMarginPct ? `${r.estimatedMarginPct}%` : '—')}
            />
            <Column
              header="Actual margin"
              className="numeric"
              headerClassName="numeric"
              body={(r: ActualsSummaryRow) => (r.actualMarginPct ? `${r.actualMarginPct}%` : '—')}
            />
            <Column
              header="Margin drift"
              className="numeric"
              headerClassName="numeric"
              body={(r: ActualsSummaryRow) => {
                const under =
                  r.marginDriftPts !== null &&
                  money(r.marginDriftPts).lessThanOrEqualTo(money(DRIFT_FLAG_PTS));
                return (
                  <span className={under ? 'drift drift--under' : 'drift'}>
                    {formatPoints(r.marginDriftPts)}
                    {under ? (
                      <span className="drift__label">
                        <i className="pi pi-arrow-down" aria-hidden="true" /> Under-estimates
                      </span>
                    ) : null}
                  </span>
                );
              }}
            />
          </DataTable>
        )}
        <p className="table-footnote muted">
          Drift is the actual margin minus the estimated one, in percentage points. Rows at {DRIFT_FLAG_PTS}{' '}
          points or worse are marked (common practice).
        </p>
      </Card>
    </div>
  );
}
