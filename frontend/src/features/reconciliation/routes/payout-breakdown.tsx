import '../reconciliation.css';
import { Link, useParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Column } from 'primereact/column';
import { DataTable } from 'primereact/datatable';
import { Message } from 'primereact/message';
import { Tag } from 'primereact/tag';
import type { PayoutItemView } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { PageLoading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { usePayoutBreakdown } from '../api/get-payout-breakdown';
import { formatAmount, formatDay, monthOf } from '../reconciliation-format';

function ItemsTable({
  items,
  label,
  withPeople,
}: {
  items: PayoutItemView[];
  label: string;
  withPeople: boolean;
}) {
  if (items.length === 0) return <p className="reconciliation-note">None.</p>;
  return (
    <DataTable
      value={items}
      dataKey="balanceTransactionId"
      size="small"
      className="recon-table"
      pt={{ table: { 'aria-label': label } }}
    >
      {withPeople ? (
        <Column
          header="Homeowner"
          body={(i: PayoutItemView) =>
            i.leadId ? (
              <>
                <Link to={paths.lead.href(i.leadId)}>{i.homeownerName}</Link>
                <small className="unmatched__sub">{i.address}</small>
              </>
            ) : (
              '—'
            )
          }
        />
      ) : null}
      {withPeople ? (
        <Column
          header="Payment"
          body={(i: PayoutItemView) =>
            i.paymentKind
              ? `${i.paymentKind === 'deposit' ? 'Deposit' : 'Balance'} · ${formatDay(i.receivedOn)}`
              : '—'
          }
        />
      ) : (
        <Column header="Type" field="type" />
      )}
      <Column header="Branch" field="branchName" />
      <Column
        header="Balance transaction"
        body={(i: PayoutItemView) => <code>{i.balanceTransactionId}</code>}
      />
      <Column
        header="Amount"
        bodyClassName="recon-amount"
        headerClassName="recon-amount"
        body={(i: PayoutItemView) => formatAmount(i.amount)}
      />
      <Column
        header="Fee"
        bodyClassName="recon-amount"
        headerClassName="recon-amount"
        body={(i: PayoutItemView) => formatAmount(i.fee)}
      />
      <Column
        header="Net"
        bodyClassName="recon-amount"
        headerClassName="recon-amount"
        body={(i: PayoutItemView) => formatAmount(i.net)}
      />
    </DataTable>
  );
}

/** What a processor payout is made of: its charges (whose contract), refunds and fees, and whether it adds up. */
export default function PayoutBreakdownRoute() {
  const { payoutId = '' } = useParams();
  const q = usePayoutBreakdown(payoutId);
  if (q.isPending) return <PageLoading label="Loading the payout" />;
  if (q.isError) return <ApiErrorMessage error={q.error} />;
  const { payout, breakdown: b, branches, charges, refunds, others, match } = q.data;
  const rows: [string, string][] = [
    [`Charges (${b.chargeCount})`, b.charges],
    [`Refunds (${b.refundCount})`, b.refunds],
    [`Other (${b.otherCount})`, b.other],
    ['Processing fees', b.fees === '0.00' ? '0.00' : `-${b.fees}`],
    ['Net of what it holds', b.net],
    ['The payout', b.payoutAmount],
    ['Difference', b.difference],
  ];
  return (
    <div className="page reconciliation-page">
      <PageHeader
        title={`Payout ${payout.processorPayoutId}`}
        description={`${formatAmount(payout.amount)} ${payout.currency.toUpperCase()}, arriving ${formatDay(payout.arrivalDate)} (${payout.status}).`}
        actions={
          <Button type="button" label="Print" icon="pi pi-print" outlined onClick={() => window.print()} />
        }
      />
      <Card className="content-card">
        {b.balanced ? (
          <Message
            severity="success"
            text="The charges, refunds and fees add up to the payout, to the cent."
          />
        ) : (
          <Message
            severity="warn"
            text={`The payout differs from what it holds by ${formatAmount(b.difference)}. Balance transactions may still be missing: the processor reports them with the payout.`}
          />
        )}
        {b.inconsistentIds.length > 0 ? (
          <Message
            severity="warn"
            text={`For ${b.inconsistentIds.join(', ')} the processor’s net is not amount minus fee.`}
          />
        ) : null}
        <table className="breakdown-figures" aria-label="Payout figures">
          <tbody>
            {rows.map(([label, value]) => (
              <tr key={label}>
                <th scope="row">{label}</th>
                <td className="recon-amount">{formatAmount(value)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <p>
          On the bank:{' '}
          {match ? (
            <>
              <Link
                to={paths.reconciliation.href({
                  bankAccountId: match.bankAccountId,
                  ...monthOf(match.bankLine.postedOn),
                })}
              >
                {formatDay(match.bankLine.postedOn)}, {formatAmount(match.bankLine.amount)}
              </Link>{' '}
              <Tag
                value={match.status === 'confirmed' ? 'Confirmed' : 'Suggested'}
                severity={match.status === 'confirmed' ? 'success' : 'warning'}
              />
            </>
          ) : (
            'not matched to a bank line yet.'
          )}
        </p>
        {branches.length > 0 ? (
          <>
            <h2 className="section-title">By branch</h2>
            <DataTable
              value={branches}
              dataKey="branchId"
              size="small"
              className="recon-table"
              pt={{ table: { 'aria-label': 'By branch' } }}
            >
              <Column header="Branch" field="branchName" />
              <Column header="Items" field="itemCount" />
              <Column
                header="Gross"
                bodyClassName="recon-amount"
                headerClassName="recon-amount"
                body={(r: { gross: string }) => formatAmount(r.gross)}
              />
              <Column
                header="Fees"
                bodyClassName="recon-amount"
                headerClassName="recon-amount"
                body={(r: { fee: string }) => formatAmount(r.fee)}
              />
              <Column
                header="Net"
                bodyClassName="recon-amount"
                headerClassName="recon-amount"
                body={(r: { net: string }) => formatAmount(r.net)}
              />
            </DataTable>
          </>
        ) : null}
        <h2 className="section-title">Charges</h2>
        <ItemsTable items={charges} label="Charges" withPeople />
        <h2 className="section-title">Refunds</h2>
        <ItemsTable items={refunds} label="Refunds" withPeople />
        {others.length > 0 ? (
          <>
            <h2 className="section-title">Other balance transactions</h2>
            <ItemsTable items={others} label="Other balance transactions" withPeople={false} />
          </>
        ) : null}
      </Card>
    </div>
  );
}
