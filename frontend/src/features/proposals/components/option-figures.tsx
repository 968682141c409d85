import { formatUsd, money, type ApprovalDecision, type OptionTax, type OptionTotals } from '@loambook/common';
import type { ApprovalLimits } from '../approval-wording';
import { ApprovalNeeds } from './approval-needs';

interface OptionFiguresProps {
  totals: OptionTotals;
  tax: OptionTax;
  approval: ApprovalDecision | null;
  limits: ApprovalLimits;
  commission: { ratePct: string; amount: string } | null;
  /** "Your commission" for the proposal's salesperson; "Salesperson’s commission" for anyone else. */
  commissionIsViewers: boolean;
  /** Figures computed in the browser from unsaved changes (the server's come on save). */
  preview: boolean;
  heading?: string;
}

const pct = (v: string | null) => (v === null ? '—' : `${v}%`);

/** One option's figures, as the salesperson and the approver read them. */
export function OptionFigures({
  totals,
  tax,
  approval,
  limits,
  commission,
  commissionIsViewers,
  preview,
  heading = 'Figures',
}: OptionFiguresProps) {
  const hasDiscount = !money(totals.discountTotal).isZero();
  const lowMargin =
    totals.grossMarginPct === null || money(totals.grossMarginPct).lessThan(money(limits.marginFloorPct));
  return (
    <section className={`option-figures${preview ? ' option-figures--preview' : ''}`} aria-label={heading}>
      <header className="option-figures__head">
        <h3 className="option-figures__title">{heading}</h3>
        {preview ? (
          <span className="option-figures__badge">
            <i className="pi pi-pencil" aria-hidden="true" /> Not saved yet — preview
          </span>
        ) : (
          <span className="option-figures__badge option-figures__badge--saved">
            <i className="pi pi-check" aria-hidden="true" /> As saved
          </span>
        )}
      </header>
      <dl className="figures">
        <div>
          <dt>Cost</dt>
          <dd>{formatUsd(totals.costTotal)}</dd>
        </div>
        <div>
          <dt>List</dt>
          <dd>{formatUsd(totals.listTotal)}</dd>
        </div>
        <div>
          <dt>Discount</dt>
          <dd>{hasDiscount ? `−${formatUsd(totals.discountTotal)} (${totals.discountPct}%)` : 'None'}</dd>
        </div>
        <div className="figures__strong">
          <dt>Net</dt>
          <dd>{formatUsd(totals.netTotal)}</dd>
        </div>
        <div>
          <dt>Sales tax</dt>
          <dd>
            {formatUsd(totals.taxTotal)}
            <span className="figures__note">
              {totals.taxBorneBy === 'contractor'
                ? `${tax.ratePct}% on materials, paid by the branch`
                : `${tax.ratePct}%, charged to the homeowner`}
            </span>
          </dd>
        </div>
        <div className="figures__total">
          <dt>Customer total</dt>
          <dd>{formatUsd(totals.customerTotal)}</dd>
        </div>
        <div>
          <dt>Gross profit</dt>
          <dd>{formatUsd(totals.grossProfit)}</dd>
        </div>
        <div className={lowMargin ? 'figures__warn' : undefined}>
          <dt>Gross margin</dt>
          <dd>
            {pct(totals.grossMarginPct)}
            {lowMargin ? <span className="figures__note">floor {limits.marginFloorPct}%</span> : null}
          </dd>
        </div>
        <div>
          <dt>Markup</dt>
          <dd>{pct(totals.markupPct)}</dd>
        </div>
      </dl>
      {approval ? <ApprovalNeeds decision={approval} limits={limits} /> : null}
      {commission ? (
        <p className="option-figures__commission">
          <i className="pi pi-wallet" aria-hidden="true" />{' '}
          {commissionIsViewers ? 'Your commission' : 'Salesperson’s commission'} at {commission.ratePct}%:{' '}
          <strong>{formatUsd(commission.amount)}</strong>
          <span className="muted"> (preview; earned after the right to cancel has passed)</span>
        </p>
      ) : null}
    </section>
  );
}
