import '../payments.css';
import { useState } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import { Tag } from 'primereact/tag';
import {
  asSubject,
  money,
  refundOwed,
  type ContractPayments,
  type PaymentKind,
  type PaymentRequestView,
} from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { useNotify } from '@/components/notify';
import { useAppAbility } from '@/features/auth/ability';
import { formatInBranchZone } from '@/features/leads/lead-format';
import { formatDay } from '@/features/ledger/ledger-format';
import { useLeadContract } from '@/features/proposals/api/get-lead-contract';
import { useContractPayments } from '../api/get-contract-payments';
import { useResendPaymentLink } from '../api/resend-payment-link';
import { KIND_LABELS, methodText, REQUEST_STATUS, usd } from '../payments-format';
import { PaymentLinkDialog } from './payment-link-dialog';
import { RecordPaymentDialog } from './record-payment-dialog';
import { RefundDialog } from './refund-dialog';

interface LeadPaymentsProps {
  leadId: string;
  homeownerName: string;
  homeownerEmail: string | null;
  /** The branch's IANA zone: the links' times are shown on its clock. */
  timeZone?: string;
}

/**
 * The money of the lead's contract: what it costs, what came in, what is left; the card payment links
 * (to copy or e-mail again); the payments and refunds; and, for the bookkeeper, recording cash or cheques
 * and refunding a cancelled contract. Shows nothing until there is a contract the person may see.
 */
export function LeadPayments({ leadId, homeownerName, homeownerEmail, timeZone }: LeadPaymentsProps) {
  const contract = useLeadContract(leadId);
  const payments = useContractPayments(contract.data?.id ?? null);
  if (!contract.data || payments.data === null) return null;
  if (payments.isPending) return null;
  if (payments.isError) {
    return (
      <section className="lead-section" aria-labelledby="lead-payments-title">
        <h2 id="lead-payments-title" className="lead-section__title">
          Payments
        </h2>
        <ApiErrorMessage error={payments.error} />
      </section>
    );
  }
  return (
    <PaymentsPanel
      payments={payments.data}
      salespersonId={contract.data.salespersonId}
      homeownerName={homeownerName}
      homeownerEmail={homeownerEmail}
      timeZone={timeZone}
    />
  );
}

type Open = null | 'record' | 'refund' | PaymentKind;

function PaymentsPanel({
  payments: p,
  salespersonId,
  homeownerName,
  homeownerEmail,
  timeZone,
}: {
  payments: ContractPayments;
  salespersonId: string | null;
  homeownerName: string;
  homeownerEmail: string | null;
  timeZone?: string;
}) {
  const ability = useAppAbility();
  const notify = useNotify();
  const resend = useResendPaymentLink();
  const [open, setOpen] = useState<Open>(null);

  const contractSubject = asSubject('Contract', { branchId: p.branchId, salespersonId });
  const canRecord = ability.can('create', asSubject('Payment', { branchId: p.branchId }));
  const canRequest = p.processorEnabled && (ability.can('update', contractSubject) || canRecord);
  const due = money(p.balanceDue).greaterThan(0);
  const depositOutstanding =
    money(p.depositHeld).lessThan(p.depositAmount) || money(p.depositAmount).isZero();
  const when = (iso: string) => formatInBranchZone(iso, timeZone);
  const hasOpen = (kind: PaymentKind) => p.requests.some((r) => r.kind === kind && r.status === 'open');

  const copy = async (r: PaymentRequestView) => {
    try {
      await navigator.clipboard.writeText(r.url ?? '');
      notify.success('Link copied', 'Paste it into a text message or an e-mail to the homeowner.');
    } catch {
      notify.error('Could not copy', 'Select the link and copy it by hand.');
    }
  };

  return (
    <section className="lead-section payments-panel" aria-labelledby="lead-payments-title">
      <div className="lead-section__head">
        <h2 id="lead-payments-title" className="lead-section__title">
          Payments
        </h2>
        <div className="payments-panel__actions">
          {canRequest && !p.cancelled && due && depositOutstanding && !p.completed ? (
            <Button
              type="button"
              size="small"
              label={hasOpen('deposit') ? 'New deposit link' : 'Request deposit'}
              icon="pi pi-link"
              outlined
              onClick={() => setOpen('deposit')}
            />
          ) : null}
          {canRequest && !p.cancelled && due ? (
            <Button
              type="button"
              size="small"
              label={hasOpen('balance') ? 'New balance link' : 'Request balance'}
              icon="pi pi-link"
              outlined
              onClick={() => setOpen('balance')}
            />
          ) : null}
          {canRecord && !p.cancelled && due ? (
            <Button
              type="button"
              size="small"
              label="Record a payment"
              icon="pi pi-wallet"
              onClick={() => setOpen('record')}
            />
          ) : null}
          {canRecord && p.cancelled && money(p.refundable).greaterThan(0) ? (
            <Button
              type="button"
              size="small"
              label="Refund"
              icon="pi pi-replay"
              severity="danger"
              outlined
              onClick={() => setOpen('refund')}
            />
          ) : null}
        </div>
      </div>

      <dl className="fact-list payments-summary">
        <div>
          <dt>Contract price</dt>
          <dd>{usd(p.price)}</dd>
        </div>
        <div>
          <dt>Deposit asked</dt>
          <dd>{usd(p.depositAmount)}</dd>
        </div>
        <div>
          <dt>Received</dt>
          <dd>{usd(p.paid)}</dd>
        </div>
        <div>
          <dt>{p.cancelled ? 'Still to refund' : 'Balance due'}</dt>
          <dd className="strong">{usd(p.cancelled ? p.refundable : p.balanceDue)}</dd>
        </div>
      </dl>

      {refundOwed(p) ? (
        <Message
          severity="warn"
          className="w-full"
          text="The contract was cancelled: every payment made under it is due back within 10 business days (FTC guidance)."
        />
      ) : p.cancelled ? (
        <p className="muted">
          {money(p.refunded).greaterThan(0)
            ? 'The contract was cancelled and everything received under it has been refunded.'
            : 'The contract was cancelled before anything was received: nothing is owed back.'}
        </p>
      ) : null}
      {p.depositWarning && !p.depositReceivedAt && !p.cancelled ? (
        <Message
          severity="warn"
          className="w-full payments-warning"
          content={
            <div>
              <p className="payments-warning__text">{p.depositWarning.message}</p>
              <ul className="payments-warning__clocks">
                {p.depositWarning.clocks.map((c) => (
                  <li key={c.code}>
                    <strong>{c.title}</strong>: {c.startsWhen} ({c.source})
                  </li>
                ))}
              </ul>
            </div>
          }
        />
      ) : null}
      {!p.processorEnabled ? (
        <p className="muted">
          Card payments are not set up here: record cash, cheques and transfers instead.
        </p>
      ) : null}

      {p.requests.length ? (
        <>
          <h3 className="payments-subtitle">Payment links</h3>
          <ul className="payments-links">
            {p.requests.map((r) => (
              <li key={r.id} className="payments-link">
                <div className="payments-link__head">
                  <span className="strong">
                    {KIND_LABELS[r.kind]} {usd(r.amount)}
                  </span>
                  <Tag value={REQUEST_STATUS[r.status].label} severity={REQUEST_STATUS[r.status].severity} />
                </div>
                <p className="muted payments-link__meta">
                  Made {when(r.createdAt)}
                  {r.emailedTo
                    ? ` · e-mailed to ${r.emailedTo}${r.emailCount > 1 ? ` (${r.emailCount} times)` : ''}`
                    : ' · not e-mailed'}
                  {r.paidAt ? ` · paid ${when(r.paidAt)}` : ''}
                  {r.status === 'open' && r.expiresAt ? ` · works until ${when(r.expiresAt)}` : ''}
                </p>
                {r.status === 'open' && r.url ? (
                  <div className="payments-link__url">
                    <label htmlFor={`link-${r.id}`} className="visually-hidden">
                      {KIND_LABELS[r.kind]} payment link
                    </label>
                    <InputText
                      id={`link-${r.id}`}
                      value={r.url}
                      readOnly
                      className="w-full"
                      onFocus={(e) => e.target.select()}
                    />
                    <Button
                      type="button"
                      size="small"
                      icon="pi pi-copy"
                      label="Copy"
                      outlined
                      onClick={() => void copy(r)}
                    />
                    {canRequest && homeownerEmail ? (
                      <Button
                        type="button"
                        size="small"
                        icon="pi pi-envelope"
                        label="E-mail again"
                        outlined
                        loading={resend.isPending && resend.variables === r.id}
                        onClick={() =>
                          resend.mutate(r.id, {
                            onSuccess: (sent) =>
                              notify.success('Link e-mailed again', `Sent to ${sent.emailedTo}.`),
                            onError: (e) =>
                              notify.error('Not sent', e instanceof Error ? e.message : undefined),
                          })
                        }
                      />
                    ) : null}
                  </div>
                ) : null}
              </li>
            ))}
          </ul>
        </>
      ) : null}

      <h3 className="payments-subtitle">Received</h3>
      {p.payments.length === 0 ? (
        <p className="muted">Nothing received yet.</p>
      ) : (
        <table className="payments-table">
          <caption className="visually-hidden">Payments received for this contract</caption>
          <thead>
            <tr>
              <th scope="col">Date</th>
              <th scope="col">For</th>
              <th scope="col">How</th>
              <th scope="col" className="num">
                Amount
              </th>
              <th scope="col" className="num">
                Fee
              </th>
              <th scope="col" className="num">
                Refunded
              </th>
            </tr>
          </thead>
          <tbody>
            {p.payments.map((x) => (
              <tr key={x.id}>
                <td>{formatDay(x.receivedOn)}</td>
                <td>{KIND_LABELS[x.kind]}</td>
                <td>{methodText(x)}</td>
                <td className="num">{usd(x.amount)}</td>
                <td className="num">{money(x.fee).isZero() ? '—' : usd(x.fee)}</td>
                <td className="num">{money(x.refunded).isZero() ? '—' : usd(x.refunded)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {p.refunds.length ? (
        <>
          <h3 className="payments-subtitle">Refunds</h3>
          <ul className="payments-refunds">
            {p.refunds.map((r) => (
              <li key={r.id}>
                {formatDay(r.refundedOn)}: {usd(r.amount)} to the card
                {r.status !== 'succeeded' ? ` (${r.status})` : ''}
                {r.reason ? <span className="muted"> · {r.reason}</span> : null}
              </li>
            ))}
          </ul>
        </>
      ) : null}

      {canRequest ? (
        <PaymentLinkDialog
          payments={p}
          kind={open === 'deposit' || open === 'balance' ? open : null}
          homeownerEmail={homeownerEmail}
          onClose={() => setOpen(null)}
          onDone={(result) => {
            setOpen(null);
            notify.success(
              'Payment link made',
              result.emailed
                ? `E-mailed to ${result.request.emailedTo ?? homeownerEmail}. Copy it from the panel if needed.`
                : 'It was not e-mailed: copy it from the panel and send it to the homeowner.',
            );
          }}
        />
      ) : null}
      {canRecord ? (
        <>
          <RecordPaymentDialog
            payments={p}
            visible={open === 'record'}
            onClose={() => setOpen(null)}
            onDone={(payment) => {
              setOpen(null);
              notify.success(
                'Payment recorded',
                `${usd(payment.amount)} by ${methodText(payment).toLowerCase()}.`,
              );
            }}
          />
          <RefundDialog
            payments={p}
            homeownerName={homeownerName}
            visible={open === 'refund'}
            onClose={() => setOpen(null)}
            onDone={(refunds) => {
              setOpen(null);
              const total = refunds.reduce((a, r) => a.plus(money(r.amount)), money('0'));
              notify.success('Refund made', `${usd(total.toFixed(2))} back to the card.`);
            }}
          />
        </>
      ) : null}
    </section>
  );
}
