import { useState } from 'react';
import { Link } from 'react-router';
import { Button } from 'primereact/button';
import { ConfirmDialog } from 'primereact/confirmdialog';
import { InputTextarea } from 'primereact/inputtextarea';
import { Message } from 'primereact/message';
import { Tag } from 'primereact/tag';
import { formatUsd, money, type ApprovalRequestView } from '@loambook/common';
import { paths } from '@/app/paths';
import { FormField } from '@/components/form-field';
import { formatDateTime } from '@/lib/format';
import {
  APPROVER_NEEDS,
  authorityFor,
  reasonText,
  submitterLimits,
} from '@/features/proposals/approval-wording';

interface ApprovalDetailProps {
  request: ApprovalRequestView;
  /** The signed-in person made this request (nobody decides their own exception). */
  isOwnRequest: boolean;
  pending: 'approve' | 'refuse' | null;
  onApprove: (note: string) => Promise<unknown>;
  onRefuse: (note: string) => Promise<unknown>;
}

const STATUS_LABEL = {
  pending: 'Waiting',
  approved: 'Approved',
  refused: 'Refused',
  withdrawn: 'Withdrawn',
} as const;

/** One request: who asks for what, the figures per option against the limits, and the decision. */
export function ApprovalDetail({ request, isOwnRequest, pending, onApprove, onRefuse }: ApprovalDetailProps) {
  const [note, setNote] = useState('');
  const [noteError, setNoteError] = useState<string | null>(null);
  const [confirmRefuse, setConfirmRefuse] = useState(false);
  const f = request.figures;
  const limits = submitterLimits(f.submitterRole, f);
  const authority = authorityFor(f.submitterRole, f.discountAuthority);
  const decidable = request.status === 'pending' && request.canDecide;

  const refuse = () => {
    if (!note.trim()) {
      setNoteError('Say why you refuse it: the salesperson reads your note.');
      return;
    }
    setNoteError(null);
    setConfirmRefuse(true);
  };

  return (
    <article className="approval-detail" aria-labelledby="approval-detail-title">
      <header className="approval-detail__head">
        <div>
          <h2 id="approval-detail-title" className="approval-detail__title">
            {request.homeownerName}
          </h2>
          <p className="approval-detail__meta">
            {request.branchName} · asked by {request.requestedBy.name} · {formatDateTime(request.requestedAt)}
          </p>
        </div>
        <Link
          to={paths.proposal.href(request.proposalId)}
          className="p-button p-button-outlined p-button-sm row-link"
        >
          <i className="pi pi-external-link" aria-hidden="true" />
          <span>Open proposal v{request.proposalVersion}</span>
        </Link>
      </header>

      <div className="approval-detail__why">
        <p className="approval-detail__needs">{APPROVER_NEEDS[request.approver]}</p>
        <ul className="approval-reasons">
          {request.reasons.map((r) => (
            <li key={r}>{reasonText(r, limits)}</li>
          ))}
        </ul>
        <p className="approval-detail__limits muted">
          Branch margin floor {f.marginFloorPct}% · salesperson’s discount authority{' '}
          {f.discountAuthority.salesperson}% · branch manager’s {f.discountAuthority.branch_manager}% · tax{' '}
          {f.tax.ratePct}%{' '}
          {f.tax.treatment === 'materials_cost' ? 'on materials, paid by the branch' : 'on the invoice'}
        </p>
      </div>

      <div className="approval-figures-wrap">
        <table className="approval-figures">
          <caption className="visually-hidden">Figures per option, as submitted</caption>
          <thead>
            <tr>
              <th scope="col">Option</th>
              <th scope="col" className="numeric">
                Cost
              </th>
              <th scope="col" className="numeric">
                List
              </th>
              <th scope="col" className="numeric">
                Discount
              </th>
              <th scope="col" className="numeric">
                Net
              </th>
              <th scope="col" className="numeric">
                Customer total
              </th>
              <th scope="col" className="numeric">
                Margin
              </th>
              <th scope="col">Needs</th>
            </tr>
          </thead>
          <tbody>
            {[...f.options]
              .sort((a, b) => a.position - b.position)
              .map((o) => {
                const lowMargin =
                  o.grossMarginPct === null || money(o.grossMarginPct).lessThan(money(f.marginFloorPct));
                const bigDiscount = money(o.discountPct).greaterThan(money(authority));
                return (
                  <tr key={o.optionId}>
                    <th scope="row">
                      {o.position}. {o.title}
                    </th>
                    <td className="numeric">{formatUsd(o.costTotal)}</td>
                    <td className="numeric">{formatUsd(o.listTotal)}</td>
                    <td className={`numeric${bigDiscount ? ' cell--warn' : ''}`}>
                      {o.discountPct}%<span className="cell__sub">{formatUsd(o.discountTotal)}</span>
                    </td>
                    <td className="numeric">{formatUsd(o.netTotal)}</td>
                    <td className="numeric">{formatUsd(o.customerTotal)}</td>
                    <td className={`numeric${lowMargin ? ' cell--warn' : ''}`}>
                      {o.grossMarginPct === null ? '—' : `${o.grossMarginPct}%`}
                      <span className="cell__sub">{formatUsd(o.grossProfit)}</span>
                    </td>
                    <td>
                      {o.approver === 'none' ? (
                        <span className="muted">Nothing</span>
                      ) : (
                        <Tag value={o.approver === 'owner' ? 'Owner' : 'Manager'} severity="warning" />
                      )}
                    </td>
                  </tr>
                );
              })}
          </tbody>
        </table>
      </div>

      {request.status !== 'pending' ? (
        <div className={`approval-decision approval-decision--${request.status}`}>
          <Tag
            value={STATUS_LABEL[request.status]}
            severity={
              request.status === 'approved'
                ? 'success'
                : request.status === 'refused'
                  ? 'danger'
                  : 'secondary'
            }
          />
          <span>
            {request.decidedBy ? `by ${request.decidedBy.name}` : ''}
            {request.decidedAt ? ` · ${formatDateTime(request.decidedAt)}` : ''}
          </span>
          {request.decisionNote ? (
            <blockquote className="approval-decision__note">{request.decisionNote}</blockquote>
          ) : null}
        </div>
      ) : decidable ? (
        <div className="approval-actions">
          <FormField
            id="approval-note"
            label="Note"
            error={noteError}
            hint="Optional to approve; required to refuse. The salesperson sees it on the proposal."
          >
            {({ invalid, ...control }) => (
              <InputTextarea
                {...control}
                value={note}
                onChange={(e) => {
                  setNote(e.target.value);
                  if (e.target.value.trim()) setNoteError(null);
                }}
                invalid={invalid}
                rows={3}
                autoResize
                maxLength={2000}
              />
            )}
          </FormField>
          <div className="approval-actions__buttons">
            <Button
              type="button"
              label="Refuse"
              icon="pi pi-times"
              severity="danger"
              outlined
              loading={pending === 'refuse'}
              disabled={pending !== null}
              onClick={refuse}
            />
            <Button
              type="button"
              label="Approve"
              icon="pi pi-check"
              severity="success"
              loading={pending === 'approve'}
              disabled={pending !== null}
              onClick={() => void onApprove(note)}
            />
          </div>
        </div>
      ) : (
        <Message
          severity="info"
          className="approval-needs-owner"
          content={
            <span>
              <strong>{isOwnRequest ? 'Your own request' : 'Needs the owner'}</strong>
              {isOwnRequest
                ? ' — nobody approves their own exception: the owner decides it.'
                : f.submitterRole === 'branch_manager'
                  ? ' — a branch manager’s own exception goes to the owner.'
                  : ` — the discount is beyond the branch manager’s ${f.discountAuthority.branch_manager}% authority, so only the owner can decide it.`}
            </span>
          }
        />
      )}

      <ConfirmDialog
        visible={confirmRefuse}
        onHide={() => setConfirmRefuse(false)}
        header="Refuse this proposal?"
        icon="pi pi-exclamation-triangle"
        message={`${request.requestedBy.name} gets it back with your note and has to change it before it can be sent to ${request.homeownerName}.`}
        acceptLabel="Confirm refusal"
        rejectLabel="Go back"
        acceptClassName="p-button-danger"
        defaultFocus="reject"
        accept={() => {
          setConfirmRefuse(false);
          void onRefuse(note);
        }}
        reject={() => setConfirmRefuse(false)}
        className="app-dialog"
      />
    </article>
  );
}
