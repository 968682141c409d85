import '../commissions.css';
import { useState } from 'react';
import type { FormEvent } from 'react';
import { useSearchParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Dialog } from 'primereact/dialog';
import { InputText } from 'primereact/inputtext';
import { formatUsd, payPeriodFor, type CommissionStatementStatus } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { FormField } from '@/components/form-field';
import { TableSkeleton } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { Select } from '@/components/select';
import { useAppAbility } from '@/features/auth/ability';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { localToday } from '@/lib/format';
import { useStatements } from '../api/get-statements';
import { useBuildStatements, useRunEarningCheck } from '../api/statement-actions';
import { formatPeriod, STATUS_LABELS } from '../commission-format';
import { StatementsTable } from '../components/statements-table';

const DAY = /^\d{4}-\d{2}-\d{2}$/;
const ANY = '__any__';
const STATUS_OPTIONS = [
  { label: 'Any status', value: ANY },
  ...(['draft', 'approved', 'paid'] as const).map((s) => ({ label: STATUS_LABELS[s], value: s })),
];

/** "1 line", "2 lines". */
const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** Statements per salesperson per pay period: the bookkeeper builds, approves and pays; managers read. */
export default function CommissionStatementsRoute() {
  const ability = useAppAbility();
  const notify = useNotify();
  const { branchId, branch } = useCurrentBranch();
  const [params, setParams] = useSearchParams();
  const periodParam = params.get('period') ?? '';
  const period = DAY.test(periodParam) ? periodParam : '';
  const statusParam = params.get('status');
  const status = (['draft', 'approved', 'paid'] as const).find((s) => s === statusParam) ?? null;
  const statements = useStatements({ branchId, period, status });
  const canWork = ability.can('create', 'CommissionStatement');
  const run = useRunEarningCheck();
  const [building, setBuilding] = useState(false);

  const setFilter = (key: 'period' | 'status', value: string | null) =>
    setParams(
      (p) => {
        const next = new URLSearchParams(p);
        if (value) next.set(key, value);
        else next.delete(key);
        return next;
      },
      { replace: true },
    );

  const runNow = async () => {
    try {
      const r = await run.mutateAsync();
      notify.success(
        'Earning check done',
        `${count(r.linesWritten, 'new line', 'new lines')}: ${formatUsd(r.earned)} earned, ${formatUsd(r.clawedBack)} clawed back.${r.failures.length ? ` ${count(r.failures.length, 'contract', 'contracts')} could not be checked.` : ''}`,
      );
    } catch {
      notify.error('The earning check did not run', 'Try again in a moment.');
    }
  };

  return (
    <div className="page page--wide commissions-page">
      <PageHeader
        title="Commission statements"
        description={
          <>
            Twice a month per salesperson: the 1st–15th and the 16th to the month’s end. A clawback after a
            cancellation or refund lands in the next open statement; a negative balance pays nothing and
            carries forward.{' '}
            <span className="scope-note">
              Showing {branch ? `${branch.code} · ${branch.name}` : 'every branch you may see'}.
            </span>
          </>
        }
        actions={
          canWork ? (
            <>
              <Button
                label="Run earning check"
                icon="pi pi-refresh"
                outlined
                loading={run.isPending}
                onClick={runNow}
              />
              <Button label="Build statements…" icon="pi pi-file" onClick={() => setBuilding(true)} />
            </>
          ) : null
        }
      />
      <Card className="content-card">
        <div className="commission-filters">
          <div className="form-field">
            <label htmlFor="statements-period" className="form-field__label">
              Pay period containing
            </label>
            <InputText
              id="statements-period"
              type="date"
              value={period}
              onChange={(e) => setFilter('period', DAY.test(e.target.value) ? e.target.value : null)}
              aria-describedby="statements-period-hint"
            />
            <small id="statements-period-hint" className="form-field__hint">
              {period
                ? formatPeriod(payPeriodFor(period).start, payPeriodFor(period).end)
                : 'Empty: every period.'}
            </small>
          </div>
          <div className="form-field">
            <label htmlFor="statements-status" className="form-field__label">
              Status
            </label>
            <Select
              inputId="statements-status"
              value={status ?? ANY}
              options={STATUS_OPTIONS}
              onChange={(e) =>
                setFilter('status', e.value === ANY ? null : (e.value as CommissionStatementStatus))
              }
              panelClassName="app-overlay"
            />
          </div>
        </div>
        {statements.isPending ? (
          <TableSkeleton label="Loading the statements" />
        ) : statements.isError ? (
          <ApiErrorMessage error={statements.error} />
        ) : statements.data.length === 0 ? (
          <EmptyState icon="pi-file" title="No statements here">
            {canWork
              ? 'Run the earning check, then build the statements of a pay period.'
              : 'Statements appear once the bookkeeper builds them.'}
          </EmptyState>
        ) : (
          <StatementsTable statements={statements.data} showBranch={!branchId} />
        )}
      </Card>
      <BuildDialog visible={building} onClose={() => setBuilding(false)} />
    </div>
  );
}

function BuildDialog({ visible, onClose }: { visible: boolean; onClose: () => void }) {
  const notify = useNotify();
  const build = useBuildStatements();
  const [day, setDay] = useState(localToday());
  const [error, setError] = useState<string | null>(null);
  const valid = DAY.test(day);
  const p = valid ? payPeriodFor(day) : null;

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    if (!valid) {
      setError('Choose a day of the pay period.');
      return;
    }
    try {
      const r = await build.mutateAsync(day);
      notify.success(
        'Statements built',
        `${count(r.linesPlaced, 'line', 'lines')} placed on ${count(r.statements.length, 'draft statement', 'draft statements')}.`,
      );
      onClose();
    } catch (e) {
      setError(e instanceof Error ? e.message : 'Something went wrong.');
    }
  };

  return (
    <Dialog
      visible={visible}
      onHide={onClose}
      header="Build statements"
      className="app-dialog"
      style={{ width: '32rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      <form className="dialog-form" onSubmit={submit} noValidate>
        <p className="dialog-intro">
          Every earned or clawed-back line dated up to the end of the pay period goes on its salesperson’s
          draft statement. Drafts are recomputed; approved and paid statements are never changed.
        </p>
        <FormField
          id="build-period"
          label="A day of the pay period"
          error={error}
          hint={p ? `Builds up to ${formatPeriod(p.start, p.end)}.` : undefined}
          required
        >
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              type="date"
              value={day}
              onChange={(e) => {
                setDay(e.target.value);
                setError(null);
              }}
              invalid={invalid}
            />
          )}
        </FormField>
        {build.isPending ? <p role="status">Building the statements…</p> : null}
        {build.isError && !error ? <ApiErrorMessage error={build.error} /> : null}
        <div className="dialog-actions">
          <Button type="button" label="Cancel" severity="secondary" outlined onClick={onClose} />
          <Button type="submit" label="Build" icon="pi pi-file" loading={build.isPending} />
        </div>
      </form>
    </Dialog>
  );
}
