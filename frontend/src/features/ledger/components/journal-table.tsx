import { Button } from 'primereact/button';
import { Column } from 'primereact/column';
import { DataTable } from 'primereact/datatable';
import { Tag } from 'primereact/tag';
import type { JournalEntry, JournalLine } from '@loambook/common';
import { tableLayout } from '@/components/table-layout';
import { formatDateTime } from '@/lib/format';
import { useMediaQuery, WIDE_TABLE } from '@/lib/use-media-query';
import { columnAmount, formatDay } from '../ledger-format';

interface LineRow extends JournalLine {
  entry: JournalEntry;
  entryId: string;
}

interface JournalTableProps {
  entries: JournalEntry[];
  showBranch: boolean;
  /** Whether the person may post a reversal of this entry. */
  canReverse: (entry: JournalEntry) => boolean;
  onReverse: (entry: JournalEntry) => void;
  loading?: boolean;
}

const SOURCE_LABELS: Record<JournalEntry['sourceKind'], string> = {
  event: 'Processor event',
  user: 'Posted by',
  system: 'Scheduled job',
};

function source(e: JournalEntry): string {
  if (e.sourceKind === 'user') return `${SOURCE_LABELS.user} ${e.postedByName ?? 'a person'}`;
  return `${SOURCE_LABELS[e.sourceKind]} ${e.sourceRef}`;
}

/** Entries as the bookkeeper reads them: a heading per entry (date, reason, memo), its lines below. */
export function JournalTable({ entries, showBranch, canReverse, onReverse, loading }: JournalTableProps) {
  const wide = useMediaQuery(WIDE_TABLE);
  const rows: LineRow[] = entries.flatMap((entry) =>
    entry.lines.map((l) => ({ ...l, entry, entryId: entry.id })),
  );
  const header = (row: LineRow) => {
    const e = row.entry;
    return (
      <div className="journal-entry-head">
        <span className="journal-entry-head__date">{formatDay(e.effectiveOn)}</span>
        {showBranch ? (
          <Tag value={e.branchCode} severity="secondary" className="journal-entry-head__branch" />
        ) : null}
        <span className="journal-entry-head__reason">{e.reasonLabel}</span>
        {e.memo && e.memo !== e.reasonLabel ? (
          <span className="journal-entry-head__memo">{e.memo}</span>
        ) : null}
        {e.reversesEntryId ? <Tag value="Correction" severity="warning" /> : null}
        {e.reversedByEntryId ? <Tag value="Reversed" severity="danger" /> : null}
        <span className="journal-entry-head__source muted" title={`Posted ${formatDateTime(e.postedAt)}`}>
          {source(e)}
        </span>
        {canReverse(e) ? (
          <Button
            type="button"
            label="Reverse…"
            icon="pi pi-undo"
            text
            size="small"
            className="journal-entry-head__action ledger-no-print"
            aria-label={`Reverse the entry of ${formatDay(e.effectiveOn)}: ${e.reasonLabel}, ${e.total}`}
            onClick={() => onReverse(e)}
          />
        ) : null}
      </div>
    );
  };
  return (
    <DataTable
      value={rows}
      dataKey="id"
      rowGroupMode="subheader"
      groupRowsBy="entryId"
      rowGroupHeaderTemplate={header}
      size="small"
      loading={loading}
      className="ledger-table journal-table"
      pt={{ table: { 'aria-label': 'Journal entries' } }}
      {...tableLayout(wide)}
    >
      <Column
        header="Account"
        body={(r: LineRow) => (
          <span className={r.side === 'credit' ? 'journal-line journal-line--credit' : 'journal-line'}>
            <span className="journal-line__code">{r.accountCode}</span> {r.accountName}
          </span>
        )}
      />
      <Column header="Salesperson" body={(r: LineRow) => r.salespersonName ?? ''} />
      <Column
        header="Debit"
        body={(r: LineRow) => (r.side === 'debit' ? columnAmount(r.amount) : '')}
        headerClassName="ledger-amount"
        bodyClassName="ledger-amount"
      />
      <Column
        header="Credit"
        body={(r: LineRow) => (r.side === 'credit' ? columnAmount(r.amount) : '')}
        headerClassName="ledger-amount"
        bodyClassName="ledger-amount"
      />
    </DataTable>
  );
}
