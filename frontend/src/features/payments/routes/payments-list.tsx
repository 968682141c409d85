import '../payments.css';
import { useCallback } from 'react';
import { Link, useSearchParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { InputText } from 'primereact/inputtext';
import { Paginator } from 'primereact/paginator';
import { PAYMENT_KINDS, PAYMENT_METHODS, type PaymentKind, type PaymentMethod } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Select } from '@/components/select';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { formatDay } from '@/features/ledger/ledger-format';
import {
  PAYMENT_PAGE_SIZES,
  usePayments,
  type PaymentPageSize,
  type PaymentsQuery,
} from '../api/get-payments';
import { KIND_LABELS, METHOD_LABELS, methodText, usd } from '../payments-format';

const ALL = '__all__';
const DAY = /^\d{4}-\d{2}-\d{2}$/;

interface View {
  from: string;
  to: string;
  method: PaymentMethod | '';
  kind: PaymentKind | '';
  page: number;
  pageSize: PaymentPageSize;
}

function viewFrom(params: URLSearchParams): View {
  const day = (k: string) => (DAY.test(params.get(k) ?? '') ? params.get(k)! : '');
  const method = params.get('method') ?? '';
  const kind = params.get('kind') ?? '';
  const page = Number.parseInt(params.get('page') ?? '1', 10);
  const size = Number.parseInt(params.get('size') ?? '25', 10);
  return {
    from: day('from'),
    to: day('to'),
    method: (PAYMENT_METHODS as readonly string[]).includes(method) ? (method as PaymentMethod) : '',
    kind: (PAYMENT_KINDS as readonly string[]).includes(kind) ? (kind as PaymentKind) : '',
    page: page > 0 ? page : 1,
    pageSize: (PAYMENT_PAGE_SIZES as readonly number[]).includes(size) ? (size as PaymentPageSize) : 25,
  };
}

function paramsFrom(v: View): URLSearchParams {
  const p = new URLSearchParams();
  if (v.from) p.set('from', v.from);
  if (v.to) p.set('to', v.to);
  if (v.method) p.set('method', v.method);
  if (v.kind) p.set('kind', v.kind);
  if (v.page > 1) p.set('page', String(v.page));
  if (v.pageSize !== 25) p.set('size', String(v.pageSize));
  return p;
}

/** The bookkeeper's list of money received: by branch, dates, method and kind, with the totals of the filter. */
export default function PaymentsListRoute() {
  const { branchId, branch, branches, allowAll, setBranchId } = useCurrentBranch();
  const [params, setParams] = useSearchParams();
  const view = viewFrom(params);
  const rangeError =
    view.from && view.to && view.from > view.to ? 'The end date is before the start date.' : null;
  const query: PaymentsQuery = { branchId, ...view, to: rangeError ? '' : view.to };
  const list = usePayments(query);

  const setView = useCallback(
    (patch: Partial<View>) =>
      setParams(
        (current) => paramsFrom({ ...viewFrom(current), ...patch, ...('page' in patch ? {} : { page: 1 }) }),
        {
          replace: true,
        },
      ),
    [setParams],
  );
  const filtered = Boolean(view.from || view.to || view.method || view.kind);
  const clear = () =>
    setParams(paramsFrom({ from: '', to: '', method: '', kind: '', page: 1, pageSize: view.pageSize }), {
      replace: true,
    });
  const scope = branch ? `${branch.code} · ${branch.name}` : 'All branches';

  return (
    <div className="page page--wide payments-page">
      <PageHeader
        title="Payments"
        description={
          <>
            Money received: card payments as the processor reports them, and cash, cheques and transfers as
            they are recorded. <span className="scope-note">Showing {scope}.</span>
          </>
        }
      />
      <Card className="content-card">
        <div className="payments-filters" role="search" aria-label="Payment filters">
          <div className="payments-filter">
            <label htmlFor="payments-branch" className="payments-filter__label">
              Branch
            </label>
            <Select
              inputId="payments-branch"
              value={branchId ?? ALL}
              options={[
                ...(allowAll ? [{ label: 'All branches', value: ALL }] : []),
                ...branches.map((b) => ({ label: `${b.code} · ${b.name}`, value: b.id })),
              ]}
              onChange={(e) => setBranchId(e.value === ALL ? null : (e.value as string))}
              className="w-full"
            />
          </div>
          <div className="payments-filter">
            <label htmlFor="payments-from" className="payments-filter__label">
              Received from
            </label>
            <InputText
              id="payments-from"
              type="date"
              value={view.from}
              onChange={(e) => setView({ from: e.target.value })}
            />
          </div>
          <div className="payments-filter">
            <label htmlFor="payments-to" className="payments-filter__label">
              Received to
            </label>
            <InputText
              id="payments-to"
              type="date"
              value={view.to}
              onChange={(e) => setView({ to: e.target.value })}
              invalid={!!rangeError}
              aria-invalid={rangeError ? true : undefined}
              aria-describedby={rangeError ? 'payments-to-error' : undefined}
            />
            {rangeError ? (
              <small id="payments-to-error" className="form-field__error">
                <i className="pi pi-exclamation-circle" aria-hidden="true" /> {rangeError}
              </small>
            ) : null}
          </div>
          <div className="payments-filter">
            <label htmlFor="payments-method" className="payments-filter__label">
              Method
            </label>
            <Select
              inputId="payments-method"
              value={view.method || ALL}
              options={[
                { label: 'Any method', value: ALL },
                ...PAYMENT_METHODS.map((m) => ({ label: METHOD_LABELS[m], value: m })),
              ]}
              onChange={(e) => setView({ method: e.value === ALL ? '' : (e.value as PaymentMethod) })}
              className="w-full"
            />
          </div>
          <div className="payments-filter">
            <label htmlFor="payments-kind" className="payments-filter__label">
              For
            </label>
            <Select
              inputId="payments-kind"
              value={view.kind || ALL}
              options={[
                { label: 'Deposits and balances', value: ALL },
                ...PAYMENT_KINDS.map((k) => ({ label: KIND_LABELS[k], value: k })),
              ]}
              onChange={(e) => setView({ kind: e.value === ALL ? '' : (e.value as PaymentKind) })}
              className="w-full"
            />
          </div>
          {filtered ? (
            <div className="payments-filter payments-filter--clear">
              <Button type="button" label="Clear filters" icon="pi pi-filter-slash" text onClick={clear} />
            </div>
          ) : null}
        </div>
        {list.isPending ? (
          <TableSkeleton label="Loading payments" rows={8} />
        ) : list.isError ? (
          <ApiErrorMessage error={list.error} />
        ) : list.data.total === 0 ? (
          filtered ? (
            <EmptyState icon="pi-filter-slash" title="No payments match these filters">
              <Button type="button" label="Clear filters" text onClick={clear} />
            </EmptyState>
          ) : (
            <EmptyState icon="pi-wallet" title="No payments yet">
              Deposits and balances appear here as homeowners pay by card, and as cash and cheques are
              recorded on the lead’s page.
            </EmptyState>
          )
        ) : (
          <>
            <table className="payments-table">
              <caption className="visually-hidden">Payments received</caption>
              <thead>
                <tr>
                  <th scope="col">Received</th>
                  {branchId === null ? <th scope="col">Branch</th> : null}
                  <th scope="col">Homeowner</th>
                  <th scope="col">For</th>
                  <th scope="col">How</th>
                  <th scope="col" className="num">
                    Amount
                  </th>
                  <th scope="col" className="num">
                    Fee
                  </th>
                  <th scope="col" className="num">
                    Net
                  </th>
                  <th scope="col" className="num">
                    Refunded
                  </th>
                </tr>
              </thead>
              <tbody>
                {list.data.rows.map((r) => (
                  <tr key={r.id}>
                    <td>{formatDay(r.receivedOn)}</td>
                    {branchId === null ? <td>{r.branchCode}</td> : null}
                    <td>
                      <Link to={paths.lead.href(r.leadId)}>{r.homeownerName}</Link>
                    </td>
                    <td>{KIND_LABELS[r.kind]}</td>
                    <td>{methodText(r)}</td>
                    <td className="num">{usd(r.amount)}</td>
                    <td className="num">{usd(r.fee)}</td>
                    <td className="num">{usd(r.net)}</td>
                    <td className="num">{r.refunded === '0.00' ? '—' : usd(r.refunded)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
            <p className="payments-totals" aria-label="Totals of the filter">
              <span>
                {list.data.total} payment{list.data.total === 1 ? '' : 's'}
              </span>
              <span>Received {usd(list.data.totals.amount)}</span>
              <span>Fees {usd(list.data.totals.fee)}</span>
              <span>Net {usd(list.data.totals.net)}</span>
            </p>
            <Paginator
              className="payments-no-print"
              first={(view.page - 1) * view.pageSize}
              rows={view.pageSize}
              totalRecords={list.data.total}
              rowsPerPageOptions={[...PAYMENT_PAGE_SIZES]}
              onPageChange={(e) => setView({ page: e.page + 1, pageSize: e.rows as PaymentPageSize })}
              template="FirstPageLink PrevPageLink PageLinks NextPageLink LastPageLink RowsPerPageDropdown CurrentPageReport"
              currentPageReportTemplate="{first}–{last} of {totalRecords} payments"
            />
          </>
        )}
      </Card>
    </div>
  );
}
