import { useMemo, useState } from 'react';
import { Link } from 'react-router';
import { Button } from 'primereact/button';
import { Column } from 'primereact/column';
import { DataTable } from 'primereact/datatable';
import { IconField } from 'primereact/iconfield';
import { InputIcon } from 'primereact/inputicon';
import { InputText } from 'primereact/inputtext';
import { Tag } from 'primereact/tag';
import type { Branch, SalesTaxTreatment } from '@loambook/common';
import { paths } from '@/app/paths';
import { formatPercent, formatTimezone } from '@/lib/format';
import { tableLayout } from '@/components/table-layout';
import { useMediaQuery, WIDE_TABLE } from '@/lib/use-media-query';
import { comparePercent } from '../branch-form-values';

/** Short forms of SALES_TAX_TREATMENT_LABELS for a table cell; the form shows the full wording. */
const TAX_SHORT: Record<SalesTaxTreatment, string> = {
  materials_cost: 'on materials cost',
  invoice: 'on the invoice',
};

interface BranchRow extends Branch {
  place: string;
  zoneLabel: string;
  taxLabel: string;
}

interface BranchesTableProps {
  branches: Branch[];
  canEdit: boolean;
  canDelete: boolean;
  onDelete: (branch: Branch) => void;
}

type SortEvent = { data: BranchRow[]; field: string; order: 1 | -1 | 0 | null | undefined };

/** Sorts a column of percentage strings by value ("8" before "18"). */
const byPercent = (pick: (b: BranchRow) => string) => (event: SortEvent) =>
  [...event.data].sort((a, b) => comparePercent(pick(a), pick(b)) * (event.order ?? 1));

export function BranchesTable({ branches, canEdit, canDelete, onDelete }: BranchesTableProps) {
  const [search, setSearch] = useState('');
  const wide = useMediaQuery(WIDE_TABLE);
  const rows = useMemo<BranchRow[]>(
    () =>
      branches.map((b) => ({
        ...b,
        place: `${b.city}, ${b.state}`,
        zoneLabel: formatTimezone(b.timezone),
        taxLabel: `${formatPercent(b.salesTaxRatePct)} ${TAX_SHORT[b.salesTaxTreatment]}`,
      })),
    [branches],
  );

  const header = (
    <div className="table-toolbar">
      <label htmlFor="branch-search" className="visually-hidden">
        Search branches
      </label>
      <IconField iconPosition="left" className="table-toolbar__search">
        <InputIcon className="pi pi-search" />
        <InputText
          id="branch-search"
          type="search"
          value={search}
          onChange={(e) => setSearch(e.target.value)}
          placeholder="Search code, name, city…"
        />
      </IconField>
      <span className="table-toolbar__count">
        {branches.length === 1 ? '1 branch' : `${branches.length} branches`}
      </span>
    </div>
  );

  return (
    <DataTable
      value={rows}
      dataKey="id"
      header={header}
      globalFilter={search}
      globalFilterFields={['code', 'name', 'place', 'zoneLabel', 'timezone', 'taxLabel']}
      sortField="code"
      sortOrder={1}
      removableSort
      stripedRows
      size="small"
      {...tableLayout(wide)}
      className="data-table"
      emptyMessage="No branch matches your search."
      aria-label="Branches"
    >
      <Column
        field="code"
        header="Code"
        sortable
        body={(b: BranchRow) => <Tag value={b.code} className="branch-code" />}
      />
      <Column field="name" header="Name" sortable bodyClassName="strong" />
      <Column field="place" header="City / State" sortable />
      <Column
        field="zoneLabel"
        header="Time zone"
        sortable
        body={(b: BranchRow) => (
          <span className="zone-cell">
            <span>{b.zoneLabel}</span>
            <span className="muted">{b.timezone}</span>
          </span>
        )}
      />
      <Column
        field="marginFloorPct"
        header="Margin floor"
        sortable
        sortFunction={byPercent((b) => b.marginFloorPct)}
        body={(b: BranchRow) => formatPercent(b.marginFloorPct)}
        className="numeric"
      />
      <Column
        header="Discount limits"
        body={(b: BranchRow) => (
          <span className="discount-limits">
            <span>
              <span className="muted">Sales</span> {formatPercent(b.discountAuthority.salesperson)}
            </span>
            <span>
              <span className="muted">Manager</span> {formatPercent(b.discountAuthority.branch_manager)}
            </span>
          </span>
        )}
      />
      <Column
        field="taxLabel"
        header="Sales tax"
        sortable
        body={(b: BranchRow) => (
          <span className="tax-cell">
            <span>{formatPercent(b.salesTaxRatePct)}</span>
            <span className="muted">{TAX_SHORT[b.salesTaxTreatment]}</span>
          </span>
        )}
      />
      <Column field="userCount" header="People" sortable className="numeric" />
      {canEdit || canDelete ? (
        <Column
          header="Actions"
          headerClassName="visually-hidden-header"
          frozen={wide}
          alignFrozen="right"
          className="actions-column"
          body={(b: BranchRow) => (
            <div className="row-actions">
              {canEdit ? (
                <Link
                  to={paths.editBranch.href(b.id)}
                  className="p-button p-button-text p-button-sm row-link"
                >
                  <i className="pi pi-pencil" aria-hidden="true" />
                  <span>
                    Edit<span className="visually-hidden"> {b.code}</span>
                  </span>
                </Link>
              ) : null}
              {canDelete && !b.inUse ? (
                <Button
                  type="button"
                  label="Delete"
                  aria-label={`Delete ${b.code}`}
                  icon="pi pi-trash"
                  text
                  size="small"
                  severity="danger"
                  onClick={() => onDelete(b)}
                />
              ) : null}
            </div>
          )}
        />
      ) : null}
    </DataTable>
  );
}
