import { Link } from 'react-router';
import { Button } from 'primereact/button';
import type { BankLineView, CommissionPaymentTarget, PayoutTarget } from '@loambook/common';
import { paths } from '@/app/paths';
import { EmptyState } from '@/components/empty-state';
import { formatAmount, formatDay, formatRange } from '../reconciliation-format';

interface UnmatchedListsProps {
  bankLines: BankLineView[];
  payouts: PayoutTarget[];
  commissionPayments: CommissionPaymentTarget[];
  /** The account does not receive processor payouts: none are looked for. */
  receivesPayouts: boolean;
  /** Offered on each bank line when the person may change matches. */
  onMatch?: (line: BankLineView) => void;
}

/**
 * What is on one side and not the other: bank lines no payout or commission payment explains, and payouts
 * and commission payments the bank does not show (yet).
 */
export function UnmatchedLists({
  bankLines,
  payouts,
  commissionPayments,
  receivesPayouts,
  onMatch,
}: UnmatchedListsProps) {
  return (
    <div className="unmatched">
      <section className="unmatched__side" aria-labelledby="unmatched-bank">
        <h3 id="unmatched-bank" className="unmatched__title">
          On the bank, not matched <span className="count-badge">{bankLines.length}</span>
        </h3>
        {bankLines.length === 0 ? (
          <EmptyState icon="pi-check-circle" title="Every bank line is matched" />
        ) : (
          <ul className="unmatched__list">
            {bankLines.map((l) => (
              <li key={l.id} className="unmatched__item">
                <span className="unmatched__date">{formatDay(l.postedOn)}</span>
                <span className="unmatched__what">
                  {l.description || <em>No description</em>}
                  <small className="unmatched__sub">Row {l.rowNumber}</small>
                </span>
                <span className="recon-amount">{formatAmount(l.amount)}</span>
                {onMatch && !l.locked ? (
                  <Button
                    type="button"
                    label="Match…"
                    size="small"
                    outlined
                    aria-label={`Match the line of ${formatDay(l.postedOn)}, ${formatAmount(l.amount)}`}
                    onClick={() => onMatch(l)}
                  />
                ) : null}
              </li>
            ))}
          </ul>
        )}
      </section>
      <section className="unmatched__side" aria-labelledby="unmatched-books">
        <h3 id="unmatched-books" className="unmatched__title">
          In the books, not on the bank{' '}
          <span className="count-badge">{payouts.length + commissionPayments.length}</span>
        </h3>
        <h4 className="unmatched__subtitle">Processor payouts</h4>
        {!receivesPayouts ? (
          <p className="reconciliation-note">Processor payouts are not paid into this account.</p>
        ) : payouts.length === 0 ? (
          <p className="reconciliation-note">Every payout arriving in this period is matched.</p>
        ) : (
          <ul className="unmatched__list" aria-label="Unmatched payouts">
            {payouts.map((p) => (
              <li key={p.id} className="unmatched__item">
                <span className="unmatched__date">{formatDay(p.arrivalDate)}</span>
                <span className="unmatched__what">
                  <Link to={paths.payoutBreakdown.href(p.id)}>Payout {p.processorPayoutId}</Link>
                  <small className="unmatched__sub">Arrival date · {p.status}</small>
                </span>
                <span className="recon-amount">{formatAmount(p.amount)}</span>
              </li>
            ))}
          </ul>
        )}
        <h4 className="unmatched__subtitle">Commission payments</h4>
        {commissionPayments.length === 0 ? (
          <p className="reconciliation-note">Every commission paid in this period is matched.</p>
        ) : (
          <ul className="unmatched__list" aria-label="Unmatched commission payments">
            {commissionPayments.map((c) => (
              <li key={c.id} className="unmatched__item">
                <span className="unmatched__date">{formatDay(c.paidOn)}</span>
                <span className="unmatched__what">
                  Commission to {c.salespersonName}
                  <small className="unmatched__sub">
                    {c.branchName} · {formatRange(c.periodStart, c.periodEnd)}
                  </small>
                </span>
                <span className="recon-amount">{formatAmount(`-${c.payable}`)}</span>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
