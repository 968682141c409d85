import { useMemo, useState } from 'react';
import { Button } from 'primereact/button';
import { Column } from 'primereact/column';
import { DataTable } from 'primereact/datatable';
import { IconField } from 'primereact/iconfield';
import { InputIcon } from 'primereact/inputicon';
import { InputText } from 'primereact/inputtext';
import { Tag } from 'primereact/tag';
import {
  formatUsd,
  money,
  PRICE_BOOK_CATEGORY_LABELS,
  PRICE_BOOK_UNIT_LABELS,
  type PriceBookItem,
} from '@loambook/common';
import { tableLayout } from '@/components/table-layout';
import { useMediaQuery, WIDE_TABLE } from '@/lib/use-media-query';
import { belowFloor, marginAtList } from '../price-book-values';

interface ItemRow extends PriceBookItem {
  categoryLabel: string;
  unitLabel: string;
  margin: string | null;
}

interface PriceBookTableProps {
  items: PriceBookItem[];
  /** The branch's margin floor, to flag items that sell below it at list. */
  marginFloorPct: string | null;
  canEdit: boolean;
  canDelete: boolean;
  busyId: string | null;
  onEdit: (item: PriceBookItem) => void;
  onToggleActive: (item: PriceBookItem) => void;
  onDelete: (item: PriceBookItem) => void;
}

type SortEvent = { data: ItemRow[]; order: 1 | -1 | 0 | null | undefined };

/** Sorts a column of decimal strings by value ("8.00" before "18.00"); blanks last. */
const byDecimal = (pick: (r: ItemRow) => string | null) => (event: SortEvent) =>
  [...event.data].sort((a, b) => {
    const x = pick(a);
    const y = pick(b);
    if (x === null || y === null) return x === y ? 0 : x === null ? 1 : -1;
    return money(x).comparedTo(money(y)) * (event.order ?? 1);
  });

export function PriceBookTable({
  items,
  marginFloorPct,
  canEdit,
  canDelete,
  busyId,
  onEdit,
  onToggleActive,
  onDelete,
}: PriceBookTableProps) {
  const [search, setSearch] = useState('');
  const wide = useMediaQuery(WIDE_TABLE);
  const rows = useMemo<ItemRow[]>(
    () =>
      items.map((item) => ({
        ...item,
        // The short form in a cell: "Soil stabilisation (polyurethane injection)" → "Soil stabilisation".
        categoryLabel: (PRICE_BOOK_CATEGORY_LABELS[item.category] ?? item.category).replace(/\s*\(.*\)$/, ''),
        unitLabel: PRICE_BOOK_UNIT_LABELS[item.unit] ?? item.unit,
        margin: marginAtList(item.unitCost, item.unitPrice),
      })),
    [items],
  );
  const activeCount = items.filter((i) => i.active).length;

  const header = (
    <div className="table-toolbar">
      <label htmlFor="price-book-search" className="visually-hidden">
        Search the price book
      </label>
      <IconField iconPosition="left" className="table-toolbar__search">
        <InputIcon className="pi pi-search" />
        <InputText
          id="price-book-search"
          type="search"
          value={search}
          onChange={(e) => setSearch(e.target.value)}
          placeholder="Search code, description, category…"
        />
      </IconField>
      <span className="table-toolbar__count">
        {activeCount === 1 ? '1 active item' : `${activeCount} active items`}
        {items.length > activeCount ? `, ${items.length - activeCount} deactivated` : ''}
      </span>
    </div>
  );

  return (
    <DataTable
      value={rows}
      dataKey="id"
      header={header}
      globalFilter={search}
      globalFilterFields={['code', 'description', 'categoryLabel', 'unitLabel']}
      sortField="code"
      sortOrder={1}
      removableSort
      stripedRows
      size="small"
      {...tableLayout(wide)}
      className="data-table price-book-table"
      rowClassName={(r: ItemRow) => (r.active ? '' : 'row--inactive')}
      emptyMessage="No item matches your search."
      aria-label="Price book"
    >
      <Column
        field="code"
        header="Code"
        sortable
        body={(r: ItemRow) => <span className="item-code">{r.code}</span>}
      />
      <Column
        field="description"
        header="Description"
        sortable
        bodyClassName="price-book-table__description"
      />
      <Column field="categoryLabel" header="Category" sortable />
      <Column field="unitLabel" header="Unit" sortable />
      <Column
        field="unitCost"
        header="Unit cost"
        sortable
        sortFunction={byDecimal((r) => r.unitCost)}
        body={(r: ItemRow) => formatUsd(r.unitCost)}
        className="numeric"
      />
      <Column
        field="unitPrice"
        header="Unit price"
        sortable
        sortFunction={byDecimal((r) => r.unitPrice)}
        body={(r: ItemRow) => formatUsd(r.unitPrice)}
        className="numeric"
      />
      <Column
        field="margin"
        header="Margin at list"
        sortable
        sortFunction={byDecimal((r) => r.margin)}
        className="numeric"
        body={(r: ItemRow) =>
          r.margin === null ? (
            <span className="muted">—</span>
          ) : belowFloor(r.margin, marginFloorPct) ? (
            <span className="figure--warn" title={`Below the branch's ${marginFloorPct}% margin floor`}>
              <i className="pi pi-exclamation-triangle" aria-hidden="true" /> {r.margin}%
              <span className="visually-hidden"> (below the branch floor)</span>
            </span>
          ) : (
            `${r.margin}%`
          )
        }
      />
      <Column
        field="active"
        header="Active"
        sortable
        body={(r: ItemRow) =>
          r.active ? (
            <Tag value="Active" severity="success" />
          ) : (
            <Tag value="Off" severity="secondary" title="Deactivated" />
          )
        }
      />
      {canEdit || canDelete ? (
        <Column
          header="Actions"
          headerClassName="visually-hidden-header"
          frozen={wide}
          alignFrozen="right"
          className="actions-column"
          body={(r: ItemRow) => (
            <div className="row-actions">
              {canEdit ? (
                <Button
                  type="button"
                  label="Edit"
                  aria-label={`Edit ${r.code}`}
                  icon="pi pi-pencil"
                  text
                  size="small"
                  onClick={() => onEdit(r)}
                />
              ) : null}
              {canEdit ? (
                <Button
                  type="button"
                  icon={r.active ? 'pi pi-eye-slash' : 'pi pi-eye'}
                  aria-label={`${r.active ? 'Deactivate' : 'Reactivate'} ${r.code}`}
                  tooltip={r.active ? 'Deactivate' : 'Reactivate'}
                  tooltipOptions={{ position: 'top' }}
                  text
                  rounded
                  severity="secondary"
                  loading={busyId === r.id}
                  onClick={() => onToggleActive(r)}
                />
              ) : null}
              {canDelete && !r.inUse ? (
                <Button
                  type="button"
                  icon="pi pi-trash"
                  aria-label={`Delete ${r.code}`}
                  tooltip="Delete"
                  tooltipOptions={{ position: 'top' }}
                  text
                  rounded
                  severity="danger"
                  onClick={() => onDelete(r)}
                />
              ) : canDelete ? (
                <span className="row-actions__spacer" aria-hidden="true" />
              ) : null}
            </div>
          )}
        />
      ) : null}
    </DataTable>
  );
}
