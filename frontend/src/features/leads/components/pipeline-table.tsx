import { Link, useNavigate } from 'react-router';
import { Column } from 'primereact/column';
import { DataTable, type DataTablePageEvent, type DataTableSortEvent } from 'primereact/datatable';
import { Paginator } from 'primereact/paginator';
import { Tag } from 'primereact/tag';
import { formatUsd, money, type LeadSummary } from '@loambook/common';
import { paths } from '@/app/paths';
import { Select } from '@/components/select';
import { useMediaQuery, WIDE_TABLE } from '@/lib/use-media-query';
import { PAGE_SIZES, type PageSize, type PipelineSort } from '../api/get-leads';
import { days, isStale, STALE_AFTER_DAYS, stageLabel, stageSeverity, withWeekday } from '../lead-format';

interface PipelineTableProps {
  leads: LeadSummary[];
  total: number;
  page: number;
  pageSize: PageSize;
  sort: PipelineSort;
  order: 'asc' | 'desc';
  loading: boolean;
  showBranch: boolean;
  showSalesperson: boolean;
  onPage: (page: number, pageSize: PageSize) => void;
  onSort: (sort: PipelineSort, order: 'asc' | 'desc') => void;
}

/** Table columns and the server's sort keys. */
const SORT_FIELDS: Record<string, PipelineSort> = {
  homeownerName: 'homeowner',
  stage: 'stage',
  daysInStage: 'daysInStage',
  ageDays: 'age',
  value: 'value',
};
const FIELD_OF: Record<PipelineSort, string> = {
  homeowner: 'homeownerName',
  stage: 'stage',
  daysInStage: 'daysInStage',
  age: 'ageDays',
  value: 'value',
};

export function LeadFlags({ lead }: { lead: Pick<LeadSummary, 'approvalPending' | 'lastDayToCancel'> }) {
  if (!lead.approvalPending && !lead.lastDayToCancel) return null;
  return (
    <span className="lead-flags">
      {lead.approvalPending ? (
        <Tag value="Approval waiting" severity="warning" icon="pi pi-hourglass" className="lead-flag" />
      ) : null}
      {lead.lastDayToCancel ? (
        <Tag
          value={`Can cancel until ${withWeekday(lead.lastDayToCancel)}`}
          severity="info"
          icon="pi pi-clock"
          className="lead-flag"
          title="The homeowner may still cancel the signed contract (3-day right to cancel, 16 CFR 429); hold off on work and materials until this day has passed."
        />
      ) : null}
    </span>
  );
}

export function PipelineTable(props: PipelineTableProps) {
  const { leads, total, page, pageSize, sort, order, loading, showBranch, showSalesperson } = props;
  const wide = useMediaQuery(WIDE_TABLE);
  const navigate = useNavigate();

  if (!wide) return <PipelineCards {...props} />;

  return (
    <DataTable
      value={leads}
      dataKey="id"
      lazy
      paginator
      first={(page - 1) * pageSize}
      rows={pageSize}
      totalRecords={total}
      rowsPerPageOptions={[...PAGE_SIZES]}
      onPage={(e: DataTablePageEvent) => props.onPage(Math.floor(e.first / e.rows) + 1, e.rows as PageSize)}
      paginatorTemplate="FirstPageLink PrevPageLink CurrentPageReport NextPageLink LastPageLink RowsPerPageDropdown"
      currentPageReportTemplate="{first}–{last} of {totalRecords}"
      sortField={FIELD_OF[sort]}
      sortOrder={order === 'asc' ? 1 : -1}
      onSort={(e: DataTableSortEvent) => {
        const field = SORT_FIELDS[e.sortField];
        if (!field) return;
        props.onSort(field, e.sortOrder === 1 ? 'asc' : 'desc');
      }}
      loading={loading}
      stripedRows
      size="small"
      scrollable
      className="data-table pipeline-table"
      rowClassName={(l: LeadSummary) => (isStale(l.stage, l.daysInStage) ? 'row--stale' : '')}
      onRowClick={(e) => {
        // A click on the row opens the lead, unless it was on the link itself (already handled).
        if ((e.originalEvent.target as HTMLElement).closest('a')) return;
        void navigate(paths.lead.href((e.data as LeadSummary).id));
      }}
      aria-label="Leads"
    >
      <Column
        field="homeownerName"
        header="Homeowner"
        sortable
        body={(l: LeadSummary) => (
          <span className="lead-cell">
            <Link to={paths.lead.href(l.id)} className="lead-cell__name">
              {l.homeownerName}
            </Link>
            <span className="lead-cell__address">
              {l.addressLine1}, {l.city}
            </span>
          </span>
        )}
      />
      <Column
        field="stage"
        header="Stage"
        sortable
        body={(l: LeadSummary) => (
          <Tag value={stageLabel(l.stage)} severity={stageSeverity(l.stage)} className="stage-tag" />
        )}
      />
      <Column
        field="daysInStage"
        header="In stage"
        sortable
        className="numeric"
        body={(l: LeadSummary) =>
          isStale(l.stage, l.daysInStage) ? (
            <span className="stale" title={`No move in over ${STALE_AFTER_DAYS} days`}>
              <i className="pi pi-exclamation-circle" aria-hidden="true" /> {days(l.daysInStage)}
              <span className="visually-hidden"> (stale)</span>
            </span>
          ) : (
            days(l.daysInStage)
          )
        }
      />
      <Column
        field="ageDays"
        header="Age"
        sortable
        className="numeric"
        body={(l: LeadSummary) => days(l.ageDays)}
      />
      <Column
        field="value"
        header="Value"
        sortable
        className="numeric"
        body={(l: LeadSummary) =>
          money(l.value).isZero() ? (
            <span className="muted" title="No proposal yet">
              —
            </span>
          ) : (
            <span className="strong">{formatUsd(l.value)}</span>
          )
        }
      />
      {showSalesperson ? (
        <Column
          field="salespersonName"
          header="Salesperson"
          body={(l: LeadSummary) =>
            l.salespersonName ? (
              <span className="nowrap">{l.salespersonName}</span>
            ) : (
              <span className="muted">Unassigned</span>
            )
          }
        />
      ) : null}
      {showBranch ? (
        <Column
          field="branchCode"
          header="Branch"
          body={(l: LeadSummary) => <Tag value={l.branchCode} className="branch-code" />}
        />
      ) : null}
      <Column header="Flags" body={(l: LeadSummary) => <LeadFlags lead={l} />} />
    </DataTable>
  );
}

/** The sorts offered on a phone, where there are no column headers to click. */
const PHONE_SORTS: { label: string; value: string }[] = [
  { label: 'Longest in stage', value: 'daysInStage:desc' },
  { label: 'Just moved', value: 'daysInStage:asc' },
  { label: 'Oldest leads', value: 'age:desc' },
  { label: 'Newest leads', value: 'age:asc' },
  { label: 'Highest value', value: 'value:desc' },
  { label: 'Lowest value', value: 'value:asc' },
  { label: 'Homeowner A–Z', value: 'homeowner:asc' },
  { label: 'Stage, first to last', value: 'stage:asc' },
];

/** On a phone: one compact card per lead, with what matters at a glance, and the same paging. */
function PipelineCards(props: PipelineTableProps) {
  const { leads, total, page, pageSize, sort, order, loading, showBranch, showSalesperson } = props;
  const sortValue = `${sort}:${order}`;
  return (
    <div className="pipeline-cards" aria-busy={loading}>
      <div className="pipeline-cards__sort">
        <label htmlFor="pipeline-sort" className="filter-field__label">
          Sort by
        </label>
        <Select
          inputId="pipeline-sort"
          value={PHONE_SORTS.some((o) => o.value === sortValue) ? sortValue : null}
          options={PHONE_SORTS}
          onChange={(e) => {
            const [s, o] = String(e.value).split(':') as [PipelineSort, 'asc' | 'desc'];
            props.onSort(s, o);
          }}
          placeholder="Choose"
          className="w-full"
        />
      </div>
      <ul
        className={loading ? 'pipeline-cards__list pipeline-cards__list--loading' : 'pipeline-cards__list'}
        aria-label="Leads"
      >
        {leads.map((l) => {
          const stale = isStale(l.stage, l.daysInStage);
          return (
            <li key={l.id} className={stale ? 'lead-card lead-card--stale' : 'lead-card'}>
              <div className="lead-card__top">
                <Link to={paths.lead.href(l.id)} className="lead-card__name">
                  {l.homeownerName}
                </Link>
                <span className="lead-card__value">
                  {money(l.value).isZero() ? <span className="muted">—</span> : formatUsd(l.value)}
                </span>
              </div>
              <p className="lead-card__address">
                {l.addressLine1}, {l.city}
              </p>
              <p className="lead-card__line">
                <Tag value={stageLabel(l.stage)} severity={stageSeverity(l.stage)} className="stage-tag" />
                <span className={stale ? 'stale' : undefined}>
                  {stale ? <i className="pi pi-exclamation-circle" aria-hidden="true" /> : null}{' '}
                  {days(l.daysInStage)} in stage
                  {stale ? <span className="visually-hidden"> (stale)</span> : null}
                </span>
                <span className="muted">· {days(l.ageDays)} old</span>
                {showBranch ? <Tag value={l.branchCode} className="branch-code" /> : null}
              </p>
              {showSalesperson || l.approvalPending || l.lastDayToCancel ? (
                <p className="lead-card__line">
                  {showSalesperson ? (
                    <span className="muted">{l.salespersonName ?? 'Unassigned'}</span>
                  ) : null}
                  <LeadFlags lead={l} />
                </p>
              ) : null}
            </li>
          );
        })}
      </ul>
      <Paginator
        first={(page - 1) * pageSize}
        rows={pageSize}
        totalRecords={total}
        rowsPerPageOptions={[...PAGE_SIZES]}
        onPageChange={(e) => props.onPage(Math.floor(e.first / e.rows) + 1, e.rows as PageSize)}
        template="PrevPageLink CurrentPageReport NextPageLink RowsPerPageDropdown"
        currentPageReportTemplate="{first}–{last} of {totalRecords}"
        className="pipeline-cards__pager"
      />
    </div>
  );
}
