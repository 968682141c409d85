import '../commissions.css';
import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Tag } from 'primereact/tag';
import { asSubject, formatUsd, type CommissionStatementDetail } from '@loambook/common';
import { paths } from '@/app/paths';
import { NotFound } from '@/app/routes/not-found';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { PageLoading } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { isApiError } from '@/lib/api-client';
import { formatDateTime } from '@/lib/format';
import { useAppAbility } from '@/features/auth/ability';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { useStatement } from '../api/get-statement';
import { useApproveStatement, usePayStatement } from '../api/statement-actions';
import {
  formatDay,
  formatPeriod,
  KIND_LABELS,
  MILESTONE_LABELS,
  STATUS_LABELS,
  STATUS_SEVERITY,
} from '../commission-format';
import { ApproveStatementDialog, PayStatementDialog } from '../components/statement-dialogs';

export default function CommissionStatementRoute() {
  const { statementId = '' } = useParams();
  const statement = useStatement(statementId);
  if (statement.isPending) return <PageLoading label="Loading the statement" />;
  if (statement.isError) {
    if (isApiError(statement.error) && (statement.error.status === 404 || statement.error.status === 400)) {
      return <NotFound />;
    }
    return (
      <div className="page">
        <ApiErrorMessage error={statement.error} />
      </div>
    );
  }
  return <StatementPage statement={statement.data} />;
}

export function StatementPage({ statement: s }: { statement: CommissionStatementDetail }) {
  const ability = useAppAbility();
  const user = useCurrentUser();
  const notify = useNotify();
  const approve = useApproveStatement();
  const pay = usePayStatement();
  const [open, setOpen] = useState<null | 'approve' | 'pay'>(null);
  const subject = asSubject('CommissionStatement', { branchId: s.branchId, salespersonId: s.salespersonId });
  const canApprove = s.status === 'draft' && ability.can('approve', subject);
  const canPay = s.status === 'approved' && ability.can('update', subject);
  const back =
    user.role === 'salesperson'
      ? { to: paths.myCommissions.href(), label: 'My commissions' }
      : { to: paths.commissionStatements.href(), label: 'Commission statements' };

  const doApprove = async () => {
    setOpen(null);
    try {
      await approve.mutateAsync(s.id);
      notify.success(
        'Statement approved',
        `${s.salespersonName}, ${formatPeriod(s.periodStart, s.periodEnd)}`,
      );
    } catch (e) {
      notify.error('Not approved', isApiError(e) ? e.message : 'Try again.');
    }
  };

  return (
    <div className="page page--wide commissions-page commission-statement">
      <Link to={back.to} className="back-link commission-no-print">
        <i className="pi pi-arrow-left" aria-hidden="true" /> {back.label}
      </Link>
      <header className="page-header">
        <div>
          <h1 className="page-header__title">
            Commission statement · {formatPeriod(s.periodStart, s.periodEnd)}
          </h1>
          <p className="page-header__description">
            {s.salespersonName} · {s.branchCode}{' '}
            <Tag value={STATUS_LABELS[s.status]} severity={STATUS_SEVERITY[s.status]} />
          </p>
        </div>
        <div className="page-header__actions commission-no-print">
          <Button type="button" label="Print" icon="pi pi-print" outlined onClick={() => window.print()} />
          {canApprove ? (
            <Button
              type="button"
              label="Approve…"
              icon="pi pi-lock"
              loading={approve.isPending}
              onClick={() => setOpen('approve')}
            />
          ) : null}
          {canPay ? (
            <Button type="button" label="Mark paid…" icon="pi pi-wallet" onClick={() => setOpen('pay')} />
          ) : null}
        </div>
      </header>

      <Card className="content-card">
        <dl className="commission-figures" aria-label="Totals">
          <div>
            <dt>Earned</dt>
            <dd>{formatUsd(s.earned)}</dd>
          </div>
          <div>
            <dt>Clawed back</dt>
            <dd>{formatUsd(s.clawedBack)}</dd>
          </div>
          <div>
            <dt>Carried in</dt>
            <dd>{formatUsd(s.carriedIn)}</dd>
          </div>
          <div>
            <dt>Net</dt>
            <dd>{formatUsd(s.net)}</dd>
          </div>
          <div className="commission-figures__payable">
            <dt>Payable</dt>
            <dd>{formatUsd(s.payable)}</dd>
          </div>
          {s.carriedOut !== '0.00' ? (
            <div>
              <dt>Carried to the next statement</dt>
              <dd>{formatUsd(s.carriedOut)}</dd>
            </div>
          ) : null}
        </dl>
        <p className="muted commission-statement__trail">
          {s.approvedAt ? `Approved by ${s.approvedByName ?? '—'} on ${formatDateTime(s.approvedAt)}. ` : ''}
          {s.paidOn
            ? `Paid on ${formatDay(s.paidOn)}${s.paidReference ? ` (${s.paidReference})` : ''} by ${s.paidByName ?? '—'}.`
            : ''}
        </p>
      </Card>

      <Card className="content-card">
        <h2 className="commission-section-title">Lines</h2>
        {s.lines.length === 0 ? (
          <EmptyState icon="pi-list" title="No lines on this statement" />
        ) : (
          <table className="commission-lines" aria-label="Statement lines">
            <thead>
              <tr>
                <th scope="col">Date</th>
                <th scope="col">Homeowner</th>
                <th scope="col">Milestone</th>
                <th scope="col">Kind</th>
                <th scope="col" className="commission-amount">
                  Amount
                </th>
              </tr>
            </thead>
            <tbody>
              {s.lines.map((l) => (
                <tr key={l.id} className={l.kind === 'clawback' ? 'commission-lines__clawback' : undefined}>
                  <td>{formatDay(l.effectiveOn)}</td>
                  <td>
                    {ability.can('read', 'Lead') ? (
                      <Link to={paths.lead.href(l.leadId)}>{l.homeownerName}</Link>
                    ) : (
                      l.homeownerName
                    )}
                  </td>
                  <td>{MILESTONE_LABELS[l.milestone]}</td>
                  <td>{KIND_LABELS[l.kind]}</td>
                  <td className="commission-amount">{formatUsd(l.amount)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Card>

      <ApproveStatementDialog
        statement={s}
        visible={open === 'approve'}
        onConfirm={doApprove}
        onClose={() => setOpen(null)}
      />
      {open === 'pay' ? (
        <PayStatementDialog
          statement={s}
          visible
          pending={pay.isPending}
          onClose={() => setOpen(null)}
          onSubmit={async (input) => {
            await pay.mutateAsync({ id: s.id, input });
            setOpen(null);
            notify.success('Statement paid', `${formatUsd(s.payable)} to ${s.salespersonName}`);
          }}
        />
      ) : null}
    </div>
  );
}
