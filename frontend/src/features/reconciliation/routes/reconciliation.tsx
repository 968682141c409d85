import '../reconciliation.css';
import { useState } from 'react';
import { Link, useSearchParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { ConfirmDialog } from 'primereact/confirmdialog';
import { InputNumber } from 'primereact/inputnumber';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import type { BankLineView, LockBlockers, MatchView } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { PageLoading, TableSkeleton } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { Select } from '@/components/select';
import { useAppAbility } from '@/features/auth/ability';
import { isApiError } from '@/lib/api-client';
import { localToday } from '@/lib/format';
import { useConfirmMatch } from '../api/confirm-match';
import { useBankAccounts } from '../api/get-bank-accounts';
import { useReconciliation } from '../api/get-reconciliation';
import { useLockPeriod } from '../api/lock-period';
import { useSuggestMatches } from '../api/suggest-matches';
import { useUndoMatch } from '../api/undo-match';
import { ManualMatchDialog } from '../components/manual-match-dialog';
import { MatchedTable } from '../components/matched-table';
import { UnmatchedLists } from '../components/unmatched-lists';
import {
  accountLabel,
  formatAmount,
  formatDay,
  formatRange,
  isCalendarDay,
  monthOf,
} from '../reconciliation-format';

/** Days either side a bank line may be from its payout or commission payment, by default (the server's too). */
export const DEFAULT_WINDOW_DAYS = 3;

/** What still stands in the way of locking, in words; empty when nothing does. */
export function blockerList(b: LockBlockers): string[] {
  const n = (count: number, one: string, many: string) => (count === 1 ? `1 ${one}` : `${count} ${many}`);
  const out: string[] = [];
  if (b.unmatchedBankLines)
    out.push(`${n(b.unmatchedBankLines, 'bank line is', 'bank lines are')} not matched`);
  if (b.unconfirmedMatches)
    out.push(`${n(b.unconfirmedMatches, 'suggestion is', 'suggestions are')} not confirmed`);
  if (b.unmatchedPayouts) out.push(`${n(b.unmatchedPayouts, 'payout is', 'payouts are')} not on the bank`);
  if (b.unmatchedCommissionPayments)
    out.push(
      `${n(b.unmatchedCommissionPayments, 'commission payment is', 'commission payments are')} not on the bank`,
    );
  if (b.uncoveredDays) out.push(`${n(b.uncoveredDays, 'day has', 'days have')} no uploaded statement`);
  return out;
}

/**
 * The reconciliation workspace for one bank account and period: the books' side (processor payouts and
 * commission payments) against the bank lines, matched pairs to confirm or undo, what is unmatched on both
 * sides, and locking the period once it is reconciled.
 */
export default function ReconciliationRoute() {
  const ability = useAppAbility();
  const notify = useNotify();
  const accounts = useBankAccounts();
  const [params, setParams] = useSearchParams();
  const [windowDays, setWindowDays] = useState<number>(DEFAULT_WINDOW_DAYS);
  const [matching, setMatching] = useState<BankLineView | null>(null);
  const [undoing, setUndoing] = useState<MatchView | null>(null);
  const [locking, setLocking] = useState(false);
  const [busyId, setBusyId] = useState<string | null>(null);
  const suggest = useSuggestMatches();
  const confirm = useConfirmMatch();
  const undo = useUndoMatch();
  const lock = useLockPeriod();

  const list = accounts.data ?? [];
  const accountId = params.get('account') ?? list[0]?.id ?? null;
  const account = list.find((a) => a.id === accountId) ?? null;
  const defaults = monthOf(account?.statementsThrough ?? localToday());
  const from = isCalendarDay(params.get('from')) ? params.get('from')! : defaults.from;
  const to = isCalendarDay(params.get('to')) ? params.get('to')! : defaults.to;
  const rangeError = from > to ? 'The period ends before it starts.' : null;
  const q = account && !rangeError ? { bankAccountId: account.id, from, to } : null;
  const view = useReconciliation(q);
  const mayChange = ability.can('update', 'Reconciliation');

  const setQuery = (next: { account?: string; from?: string; to?: string }) =>
    setParams(
      () => {
        const p = new URLSearchParams();
        p.set('account', next.account ?? accountId ?? '');
        p.set('from', next.from ?? from);
        p.set('to', next.to ?? to);
        return p;
      },
      { replace: true },
    );

  if (accounts.isPending) return <PageLoading label="Loading the bank accounts" />;
  if (accounts.isError) return <ApiErrorMessage error={accounts.error} />;
  if (list.length === 0) {
    return (
      <div className="page reconciliation-page">
        <PageHeader title="Reconciliation" />
        <EmptyState icon="pi-wallet" title="No bank accounts yet">
          <p>
            Add the company’s bank account and upload a statement to start.{' '}
            <Link to={paths.bankAccounts.href()}>Bank accounts</Link>
          </p>
        </EmptyState>
      </div>
    );
  }

  const data = view.data;
  const blockers = data ? blockerList(data.lockBlockers) : [];
  const runSuggest = () =>
    q &&
    suggest.mutate(
      { ...q, windowDays },
      {
        onSuccess: (r) =>
          notify.success(
            r.suggested === 0
              ? 'No new matches found'
              : `${r.suggested} match${r.suggested === 1 ? '' : 'es'} suggested`,
            `Same amount, at most ${r.windowDays} day${r.windowDays === 1 ? '' : 's'} apart. Confirm each one.`,
          ),
        onError: (e) => notify.error('Matching failed', isApiError(e) ? e.message : undefined),
      },
    );
  const runConfirm = (m: MatchView) => {
    setBusyId(m.id);
    confirm.mutate(m.id, {
      onError: (e) => notify.error('Not confirmed', isApiError(e) ? e.message : undefined),
      onSettled: () => setBusyId(null),
    });
  };
  const runUndo = (m: MatchView) => {
    setBusyId(m.id);
    undo.mutate(m.id, {
      onSuccess: () => notify.info('Match undone', 'Both sides are unmatched again.'),
      onError: (e) => notify.error('Not undone', isApiError(e) ? e.message : undefined),
      onSettled: () => {
        setBusyId(null);
        setUndoing(null);
      },
    });
  };

  return (
    <div className="page reconciliation-page">
      <PageHeader
        title="Reconciliation"
        description="Processor payouts and commission payments from the books against the lines of the bank statement. Matches are suggested by exact amount and date; confirm each one, then lock the period."
        actions={
          <div className="recon-actions">
            {ability.can('create', 'Reconciliation') ? (
              <Link
                className="p-button p-button-outlined p-component"
                to={paths.uploadStatement.href(accountId)}
              >
                Upload a statement
              </Link>
            ) : null}
            <Link className="p-button p-button-text p-component" to={paths.bankAccounts.href()}>
              Bank accounts
            </Link>
          </div>
        }
      />
      <Card className="content-card">
        <div className="recon-filters">
          <div className="recon-filter recon-filter--account">
            <label htmlFor="recon-account" className="recon-filter__label">
              Bank account
            </label>
            <Select
              inputId="recon-account"
              value={accountId}
              options={list.map((a) => ({ label: accountLabel(a), value: a.id }))}
              onChange={(e) => setQuery({ account: e.value as string })}
              panelClassName="app-overlay"
            />
          </div>
          <div className="recon-filter">
            <label htmlFor="recon-from" className="recon-filter__label">
              From
            </label>
            <InputText
              id="recon-from"
              type="date"
              value={from}
              onChange={(e) => isCalendarDay(e.target.value) && setQuery({ from: e.target.value })}
            />
          </div>
          <div className="recon-filter">
            <label htmlFor="recon-to" className="recon-filter__label">
              To
            </label>
            <InputText
              id="recon-to"
              type="date"
              value={to}
              invalid={!!rangeError}
              aria-describedby={rangeError ? 'recon-to-error' : undefined}
              onChange={(e) => isCalendarDay(e.target.value) && setQuery({ to: e.target.value })}
            />
            {rangeError ? (
              <small id="recon-to-error" className="form-field__error">
                {rangeError}
              </small>
            ) : null}
          </div>
          {mayChange ? (
            <div className="recon-filter recon-filter--suggest">
              <label htmlFor="recon-window" className="recon-filter__label">
                Days either side
              </label>
              <div className="recon-suggest">
                <InputNumber
                  inputId="recon-window"
                  value={windowDays}
                  min={0}
                  max={30}
                  showButtons
                  onValueChange={(e) => setWindowDays(e.value ?? DEFAULT_WINDOW_DAYS)}
                  inputClassName="recon-window"
                />
                <Button
                  type="button"
                  label="Suggest matches"
                  icon="pi pi-bolt"
                  onClick={runSuggest}
                  loading={suggest.isPending}
                  disabled={!q || data?.locked}
                />
              </div>
            </div>
          ) : null}
        </div>

        {view.isPending && q ? (
          <TableSkeleton label="Loading the reconciliation" rows={8} />
        ) : view.isError ? (
          <ApiErrorMessage error={view.error} />
        ) : data ? (
          <>
            <div className="recon-summary" aria-live="polite">
              <span>
                {formatRange(data.from, data.to)} · {data.summary.bankLines} bank line
                {data.summary.bankLines === 1 ? '' : 's'}: in {formatAmount(data.summary.moneyIn)}, out{' '}
                {formatAmount(data.summary.moneyOut)} · {data.summary.confirmed} confirmed,{' '}
                {data.summary.suggested} suggested
              </span>
              {data.locked ? (
                <Message severity="success" text="This period is reconciled and locked." />
              ) : mayChange ? (
                <Button
                  type="button"
                  label="Lock the period"
                  icon="pi pi-lock"
                  severity="secondary"
                  disabled={blockers.length > 0 || data.lockedPeriods.length > 0}
                  onClick={() => setLocking(true)}
                  aria-describedby="recon-blockers"
                />
              ) : null}
            </div>
            {!data.locked && blockers.length > 0 ? (
              <p id="recon-blockers" className="reconciliation-note">
                To lock this period: {blockers.join('; ')}.
              </p>
            ) : null}
            {data.lockedPeriods.length > 0 && !data.locked ? (
              <p className="reconciliation-note">
                Locked already:{' '}
                {data.lockedPeriods.map((p) => formatRange(p.periodStart, p.periodEnd)).join(', ')}. Choose
                dates outside them to lock more.
              </p>
            ) : null}
            {lock.isError ? <ApiErrorMessage error={lock.error} /> : null}

            <h2 className="section-title">Matched</h2>
            <MatchedTable
              matches={data.matched}
              busyId={busyId}
              onConfirm={mayChange ? runConfirm : undefined}
              onUndo={mayChange ? (m) => (m.status === 'confirmed' ? setUndoing(m) : runUndo(m)) : undefined}
            />
            <h2 className="section-title">Not matched</h2>
            <UnmatchedLists
              bankLines={data.unmatchedBankLines}
              payouts={data.unmatchedPayouts}
              commissionPayments={data.unmatchedCommissionPayments}
              receivesPayouts={data.bankAccount.receivesPayouts}
              onMatch={mayChange ? setMatching : undefined}
            />
          </>
        ) : null}
      </Card>

      <ManualMatchDialog
        line={matching}
        payouts={data?.unmatchedPayouts ?? []}
        commissionPayments={data?.unmatchedCommissionPayments ?? []}
        onClose={() => setMatching(null)}
        onMatched={() => {
          setMatching(null);
          notify.success('Matched', 'The match is confirmed.');
        }}
      />
      <ConfirmDialog
        visible={undoing !== null}
        onHide={() => setUndoing(null)}
        header="Undo a confirmed match"
        icon="pi pi-exclamation-triangle"
        message={
          undoing
            ? `Undo the match of the bank line of ${formatDay(undoing.bankLine.postedOn)} (${formatAmount(undoing.bankLine.amount)})? Both sides become unmatched again.`
            : ''
        }
        acceptLabel="Undo the match"
        rejectLabel="Keep it"
        acceptClassName="p-button-danger"
        defaultFocus="reject"
        accept={() => undoing && runUndo(undoing)}
        reject={() => setUndoing(null)}
        className="app-dialog"
      />
      <ConfirmDialog
        visible={locking}
        onHide={() => setLocking(false)}
        header="Lock the period"
        icon="pi pi-lock"
        message={
          account
            ? `Lock ${formatRange(from, to)} on ${accountLabel(account)}? Its matches can no longer be undone and no bank line dated in it can be added. A lock cannot be removed.`
            : ''
        }
        acceptLabel="Lock the period"
        rejectLabel="Not yet"
        defaultFocus="reject"
        accept={() =>
          account &&
          lock.mutate(
            { bankAccountId: account.id, from, to },
            { onSuccess: () => notify.success('Period locked', formatRange(from, to)) },
          )
        }
        reject={() => setLocking(false)}
        className="app-dialog"
      />
    </div>
  );
}
