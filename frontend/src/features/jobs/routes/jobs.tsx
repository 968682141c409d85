import '../jobs.css';
import { useEffect, useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Column } from 'primereact/column';
import { DataTable } from 'primereact/datatable';
import { InputText } from 'primereact/inputtext';
import { formatUsd, type JobStatus, type JobSummary } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Select } from '@/components/select';
import { tableLayout } from '@/components/table-layout';
import { useMediaQuery, WIDE_TABLE } from '@/lib/use-media-query';
import { useAppAbility } from '@/features/auth/ability';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { useSalespeople } from '@/features/leads/api/get-salespeople';
import { useDebouncedValue } from '@/features/leads/use-debounced-value';
import { useCrews } from '../api/get-crews';
import { useJobs } from '../api/get-jobs';
import { AtRiskList } from '../components/at-risk-list';
import { JobFlags, JobStatusTag } from '../components/job-badges';
import { formatRun, JOB_STATUSES, STATUS_LABELS } from '../job-format';

const PAGE_SIZE = 25;
const ANY = '__any__';

export default function JobsRoute() {
  const user = useCurrentUser();
  const ability = useAppAbility();
  const navigate = useNavigate();
  const wide = useMediaQuery(WIDE_TABLE);
  const { branchId, branch, showSwitcher } = useCurrentBranch();
  const [params, setParams] = useSearchParams();
  const status = (JOB_STATUSES as string[]).includes(params.get('status') ?? '')
    ? (params.get('status') as JobStatus)
    : null;
  const crewId = params.get('crew');
  const salespersonId = params.get('salesperson');
  const page = Math.max(1, Number(params.get('page')) || 1);
  const [search, setSearch] = useState(params.get('q') ?? '');
  const q = useDebouncedValue(search, 300);

  const manages = user.role === 'owner' || user.role === 'branch_manager';
  const jobs = useJobs({ branchId, status, crewId, salespersonId, q, page, pageSize: PAGE_SIZE });
  const crews = useCrews(branchId, { enabled: user.role !== 'salesperson' && user.role !== 'crew_lead' });
  const salespeople = useSalespeople(branchId, { enabled: manages });

  const set = (key: string, value: string | null) =>
    setParams(
      (p) => {
        const next = new URLSearchParams(p);
        if (value) next.set(key, value);
        else next.delete(key);
        if (key !== 'page') next.delete('page');
        return next;
      },
      { replace: true },
    );

  useEffect(() => {
    if ((params.get('q') ?? '') !== q) set('q', q.trim() || null);
    // Only the debounced search writes to the address.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [q]);

  const filtered = !!(status || crewId || salespersonId || q.trim());
  const scope =
    user.role === 'salesperson'
      ? 'Your jobs, from your signed contracts.'
      : user.role === 'crew_lead'
        ? 'The jobs on your crew.'
        : branch
          ? `${branch.code} · ${branch.name}.`
          : 'All branches.';

  return (
    <div className="page page--wide jobs-page">
      <PageHeader
        title="Jobs"
        description={
          <>
            Every signed contract becomes a job: its crew and days, its permit and 811 ticket, its log.{' '}
            <span className="scope-note">{scope}</span>
          </>
        }
        actions={
          ability.can('manage', 'Job') ? (
            <>
              <Button
                type="button"
                label="Crew calendar"
                icon="pi pi-calendar"
                outlined
                onClick={() => void navigate(paths.jobCalendar.href())}
              />
              <Button
                type="button"
                label="Actual margins"
                icon="pi pi-chart-bar"
                outlined
                onClick={() => void navigate(paths.jobActualsSummary.href())}
              />
            </>
          ) : null
        }
      />

      {user.role !== 'crew_lead' ? (
        <Card className="content-card">
          <AtRiskList branchId={branchId} />
        </Card>
      ) : null}

      <Card className="content-card">
        <div className="table-toolbar jobs-filters" role="search" aria-label="Filter jobs">
          <span className="table-toolbar__search">
            <label htmlFor="jobs-q" className="table-toolbar__filter-label">
              Search
            </label>
            <InputText
              id="jobs-q"
              value={search}
              placeholder="Job number, homeowner, street"
              onChange={(e) => setSearch(e.target.value)}
            />
          </span>
          <span className="table-toolbar__filter">
            <label htmlFor="jobs-status" className="table-toolbar__filter-label">
              Status
            </label>
            <Select
              inputId="jobs-status"
              value={status ?? ANY}
              options={[
                { value: ANY, label: 'Any status' },
                ...JOB_STATUSES.map((s) => ({ value: s, label: STATUS_LABELS[s] })),
              ]}
              onChange={(e) => set('status', e.value === ANY ? null : (e.value as string))}
              className="table-toolbar__dropdown"
            />
          </span>
          {crews.data ? (
            <span className="table-toolbar__filter">
              <label htmlFor="jobs-crew" className="table-toolbar__filter-label">
                Crew
              </label>
              <Select
                inputId="jobs-crew"
                value={crewId ?? ANY}
                options={[
                  { value: ANY, label: 'Any crew' },
                  ...crews.data.map((c) => ({ value: c.id, label: c.name })),
                ]}
                onChange={(e) => set('crew', e.value === ANY ? null : (e.value as string))}
                className="table-toolbar__dropdown"
              />
            </span>
          ) : null}
          {manages ? (
            <span className="table-toolbar__filter">
              <label htmlFor="jobs-salesperson" className="table-toolbar__filter-label">
                Salesperson
              </label>
              <Select
                inputId="jobs-salesperson"
                value={salespersonId ?? ANY}
                options={[
                  { value: ANY, label: 'Anyone' },
                  ...(salespeople.data ?? []).map((s) => ({ value: s.id, label: s.name })),
                ]}
                onChange={(e) => set('salesperson', e.value === ANY ? null : (e.value as string))}
                className="table-toolbar__dropdown"
              />
            </span>
          ) : null}
          {jobs.data ? (
            <span className="table-toolbar__count muted" aria-live="polite">
              {jobs.data.total === 1 ? '1 job' : `${jobs.data.total} jobs`}
            </span>
          ) : null}
        </div>

        {jobs.isPending ? (
          <TableSkeleton label="Loading jobs" rows={6} />
        ) : jobs.isError ? (
          <ApiErrorMessage error={jobs.error} />
        ) : jobs.data.total === 0 ? (
          filtered ? (
            <EmptyState icon="pi-filter-slash" title="No jobs match these filters">
              <Button
                type="button"
                label="Clear filters"
                text
                onClick={() => {
                  setSearch('');
                  setParams(new URLSearchParams(), { replace: true });
                }}
              />
            </EmptyState>
          ) : (
            <EmptyState icon="pi-briefcase" title="No jobs yet">
              A job appears here the moment a homeowner signs a contract.
            </EmptyState>
          )
        ) : (
          <DataTable
            value={jobs.data.items}
            dataKey="id"
            className="data-table jobs-table"
            lazy
            paginator={jobs.data.total > PAGE_SIZE}
            rows={PAGE_SIZE}
            first={(page - 1) * PAGE_SIZE}
            totalRecords={jobs.data.total}
            onPage={(e) => set('page', String((e.page ?? 0) + 1))}
            loading={jobs.isPlaceholderData && jobs.isFetching}
            {...tableLayout(wide)}
          >
            <Column
              header="Job"
              body={(j: JobSummary) => (
                <div className="job-cell">
                  <Link to={paths.job.href(j.id)} className="strong">
                    {j.number}
                  </Link>
                  <JobFlags job={j} />
                </div>
              )}
            />
            <Column
              header="Homeowner"
              body={(j: JobSummary) => (
                <div className="person-cell">
                  <span>{j.homeownerName}</span>
                  <span className="muted">
                    {j.addressLine1}, {j.city}
                  </span>
                </div>
              )}
            />
            <Column header="Status" body={(j: JobSummary) => <JobStatusTag status={j.status} />} />
            <Column
              header="Crew"
              body={(j: JobSummary) => j.crewName ?? <span className="muted">No crew yet</span>}
            />
            <Column header="Days" body={(j: JobSummary) => formatRun(j.startOn, j.durationDays)} />
            {user.role !== 'salesperson' ? (
              <Column header="Salesperson" body={(j: JobSummary) => j.salespersonName ?? '—'} />
            ) : null}
            {branchId === null && showSwitcher ? (
              <Column header="Branch" body={(j: JobSummary) => j.branchCode} />
            ) : null}
            <Column
              header="Price"
              className="numeric"
              headerClassName="numeric"
              body={(j: JobSummary) => formatUsd(j.price)}
            />
          </DataTable>
        )}
      </Card>
    </div>
  );
}
