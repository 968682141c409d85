import { Link } from 'react-router';
import { Button } from 'primereact/button';
import { Column } from 'primereact/column';
import { DataTable } from 'primereact/datatable';
import { Tag } from 'primereact/tag';
import type { MatchView } from '@loambook/common';
import { paths } from '@/app/paths';
import { EmptyState } from '@/components/empty-state';
import { formatAmount, formatDay, formatRange } from '../reconciliation-format';

interface MatchedTableProps {
  matches: MatchView[];
  /** Absent when the person may not change matches. */
  onConfirm?: (m: MatchView) => void;
  onUndo?: (m: MatchView) => void;
  busyId?: string | null;
}

function target(m: MatchView) {
  if (m.payout) {
    return (
      <>
        <Link to={paths.payoutBreakdown.href(m.payout.id)}>Payout {m.payout.processorPayoutId}</Link>
        <small className="unmatched__sub">Arrival {formatDay(m.payout.arrivalDate)}</small>
      </>
    );
  }
  if (m.commissionPayment) {
    const c = m.commissionPayment;
    return (
      <>
        Commission to {c.salespersonName}
        <small className="unmatched__sub">
          {c.branchName} · {formatRange(c.periodStart, c.periodEnd)} · paid {formatDay(c.paidOn)}
        </small>
      </>
    );
  }
  return (
    <>
      Other: {m.note}
      <small className="unmatched__sub">Reviewed, nothing in the books to match</small>
    </>
  );
}

const days = (n: number | null) =>
  n === null ? '—' : n === 0 ? 'same day' : `${n > 0 ? '+' : '−'}${Math.abs(n)} d`;

/** Bank lines and what each is matched to, with the match's status and the actions it allows. */
export function MatchedTable({ matches, onConfirm, onUndo, busyId }: MatchedTableProps) {
  if (matches.length === 0) {
    return (
      <EmptyState icon="pi-link" title="Nothing matched yet">
        <p>Suggest matches to pair payouts and commission payments with the bank lines of this period.</p>
      </EmptyState>
    );
  }
  return (
    <DataTable
      value={matches}
      dataKey="id"
      size="small"
      className="recon-table"
      pt={{ table: { 'aria-label': 'Matched pairs' } }}
    >
      <Column
        header="Bank date"
        bodyClassName="recon-date"
        body={(m: MatchView) => formatDay(m.bankLine.postedOn)}
      />
      <Column
        header="Bank line"
        body={(m: MatchView) => (
          <>
            {m.bankLine.description || <em>No description</em>}
            <small className="unmatched__sub">Row {m.bankLine.rowNumber}</small>
          </>
        )}
      />
      <Column
        header="Amount"
        bodyClassName="recon-amount"
        headerClassName="recon-amount"
        body={(m: MatchView) => formatAmount(m.bankLine.amount)}
      />
      <Column header="Matched to" body={target} />
      <Column header="Days apart" body={(m: MatchView) => days(m.daysApart)} />
      <Column
        header="Status"
        body={(m: MatchView) =>
          m.locked ? (
            <Tag value="Locked" severity="secondary" icon="pi pi-lock" />
          ) : m.status === 'confirmed' ? (
            <Tag value="Confirmed" severity="success" />
          ) : (
            <Tag value="Suggested" severity="warning" />
          )
        }
      />
      {onConfirm || onUndo ? (
        <Column
          header={<span className="visually-hidden">Actions</span>}
          body={(m: MatchView) =>
            m.locked ? null : (
              <div className="row-actions">
                {onConfirm && m.status === 'suggested' ? (
                  <Button
                    type="button"
                    label="Confirm"
                    size="small"
                    aria-label={`Confirm the match of ${formatDay(m.bankLine.postedOn)}, ${formatAmount(m.bankLine.amount)}`}
                    loading={busyId === m.id}
                    onClick={() => onConfirm(m)}
                  />
                ) : null}
                {onUndo ? (
                  <Button
                    type="button"
                    label="Undo"
                    size="small"
                    text
                    severity="danger"
                    aria-label={`Undo the match of ${formatDay(m.bankLine.postedOn)}, ${formatAmount(m.bankLine.amount)}`}
                    disabled={busyId === m.id}
                    onClick={() => onUndo(m)}
                  />
                ) : null}
              </div>
            )
          }
        />
      ) : null}
    </DataTable>
  );
}
