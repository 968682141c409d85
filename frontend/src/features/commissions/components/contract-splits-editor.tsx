import '../commissions.css';
import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import { asSubject, formatUsd, validateSplits, type ContractCommissionSplitsView } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { TableSkeleton } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { Select } from '@/components/select';
import { isApiError } from '@/lib/api-client';
import { useAppAbility } from '@/features/auth/ability';
import { useLeadContract } from '@/features/proposals/api/get-lead-contract';
import { useContractSplits } from '../api/get-contract-splits';
import { useSetContractSplits } from '../api/set-contract-splits';
import { MILESTONE_LABELS } from '../commission-format';

const MAX_PEOPLE = 10;

/**
 * The commission card of a lead page: the split of its latest contract; nothing while it has none. For the
 * lead page: `<LeadCommissionSplits leadId={lead.id} />` among its cards.
 */
export function LeadCommissionSplits({ leadId }: { leadId: string }) {
  const contract = useLeadContract(leadId);
  if (!contract.data) return null;
  return (
    <Card className="content-card">
      <ContractSplitsEditor contractId={contract.data.id} />
    </Card>
  );
}

/**
 * Who shares the contract's commission and what each is due under the plan. A manager (or the owner)
 * may change the split until any of it is earned; the shares must add up to exactly 100.
 */
export function ContractSplitsEditor({ contractId }: { contractId: string }) {
  const view = useContractSplits(contractId);
  return (
    <section className="lead-section commission-splits" aria-labelledby="commission-splits-title">
      <h2 id="commission-splits-title" className="lead-section__title">
        Commission
      </h2>
      {view.isPending ? (
        <TableSkeleton rows={2} label="Loading the commission split" />
      ) : view.isError ? (
        <ApiErrorMessage error={view.error} />
      ) : (
        <SplitsBody key={`${view.data.contractId}:${view.data.stored}`} view={view.data} />
      )}
    </section>
  );
}

interface Row {
  salespersonId: string;
  sharePct: string;
}

function SplitsBody({ view }: { view: ContractCommissionSplitsView }) {
  const ability = useAppAbility();
  const canManage = ability.can(
    'manage',
    asSubject('Contract', { branchId: view.branchId, salespersonId: null }),
  );
  const editable = canManage && !view.earned && !view.cancelled && view.plan !== null;
  const [editing, setEditing] = useState(false);

  if (view.cancelled) {
    return <p className="muted">The contract was cancelled: it earns no commission.</p>;
  }
  if (!view.plan) {
    return (
      <p className="muted">
        No commission plan applies to this contract yet. The owner sets plans under Commission plans.
      </p>
    );
  }
  if (editing) return <SplitsForm view={view} onDone={() => setEditing(false)} />;

  const parts = new Map(view.preview?.parts.map((p) => [p.salespersonId, p]) ?? []);
  return (
    <>
      <p className="muted commission-splits__plan">
        Plan: {view.plan.name}
        {view.stored
          ? ''
          : ' · Until someone sets it, the whole commission goes to the contract’s salesperson.'}
      </p>
      {view.splits.length === 0 ? (
        <p className="muted">No salesperson on this contract.</p>
      ) : (
        <table className="commission-splits__table" aria-label="Commission split">
          <thead>
            <tr>
              <th scope="col">Salesperson</th>
              <th scope="col">Share</th>
              <th scope="col" className="commission-amount">
                Commission
              </th>
              <th scope="col" className="commission-amount">
                {MILESTONE_LABELS.deposit_cleared_window_closed}
              </th>
              <th scope="col" className="commission-amount">
                {MILESTONE_LABELS.job_completed}
              </th>
            </tr>
          </thead>
          <tbody>
            {view.splits.map((s) => {
              const part = parts.get(s.salespersonId);
              return (
                <tr key={s.salespersonId}>
                  <td>{s.salespersonName}</td>
                  <td>{s.sharePct}%</td>
                  <td className="commission-amount">{part ? formatUsd(part.amount) : '—'}</td>
                  <td className="commission-amount">
                    {part ? formatUsd(part.milestones[0]?.amount ?? '0') : '—'}
                  </td>
                  <td className="commission-amount">
                    {part ? formatUsd(part.milestones[1]?.amount ?? '0') : '—'}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
      {view.earned ? (
        <p className="muted">Commission has been earned on this contract: the split is kept as it is.</p>
      ) : null}
      {editable ? (
        <Button
          type="button"
          label="Change split"
          icon="pi pi-users"
          outlined
          size="small"
          onClick={() => setEditing(true)}
        />
      ) : null}
    </>
  );
}

function SplitsForm({ view, onDone }: { view: ContractCommissionSplitsView; onDone: () => void }) {
  const notify = useNotify();
  const save = useSetContractSplits(view.contractId);
  const [rows, setRows] = useState<Row[]>(
    view.splits.map((s) => ({ salespersonId: s.salespersonId, sharePct: s.sharePct })),
  );
  const [server, setServer] = useState<Record<string, string>>({});
  const [formMessage, setFormMessage] = useState<string | null>(null);

  const issues = validateSplits(rows);
  const local = Object.fromEntries(issues.map((i) => [i.field, i.message]));
  const errorFor = (field: string) => server[field] ?? local[field];
  const sumMessage = errorFor('splits');
  const options = view.eligible.map((p) => ({ label: p.name, value: p.id }));

  const setRow = (i: number, patch: Partial<Row>) => {
    setRows((r) => r.map((row, j) => (j === i ? { ...row, ...patch } : row)));
    setServer({});
    setFormMessage(null);
  };

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    if (issues.length > 0) {
      setFormMessage('Fix the split first.');
      return;
    }
    try {
      await save.mutateAsync({
        splits: rows.map((r) => ({ salespersonId: r.salespersonId, sharePct: r.sharePct.trim() })),
      });
      notify.success('Commission split saved');
      onDone();
    } catch (error) {
      if (!isApiError(error)) {
        setFormMessage('Something went wrong. Try again.');
        return;
      }
      setServer(Object.fromEntries(error.fieldErrors.map((f) => [f.field, f.message])));
      setFormMessage(error.message);
    }
  };

  return (
    <form onSubmit={submit} noValidate className="commission-splits__form" aria-label="Commission split">
      {formMessage ? <Message severity="error" text={formMessage} className="form-message" /> : null}
      {rows.map((row, i) => {
        const personError = errorFor(`splits[${i}].salespersonId`);
        const shareError = errorFor(`splits[${i}].sharePct`);
        return (
          <div key={i} className="commission-splits__row">
            <div className="form-field">
              <label htmlFor={`split-${i}-person`} className="form-field__label">
                Salesperson {i + 1}
              </label>
              <Select
                inputId={`split-${i}-person`}
                value={row.salespersonId || null}
                options={options}
                onChange={(e) => setRow(i, { salespersonId: e.value as string })}
                invalid={!!personError}
                aria-invalid={personError ? true : undefined}
                aria-describedby={personError ? `split-${i}-person-error` : undefined}
                placeholder="Choose a salesperson"
                panelClassName="app-overlay"
              />
              {personError ? (
                <small id={`split-${i}-person-error`} className="form-field__error">
                  {personError}
                </small>
              ) : null}
            </div>
            <div className="form-field commission-splits__share">
              <label htmlFor={`split-${i}-share`} className="form-field__label">
                Share (%)
              </label>
              <InputText
                id={`split-${i}-share`}
                value={row.sharePct}
                onChange={(e) => setRow(i, { sharePct: e.target.value })}
                invalid={!!shareError}
                aria-invalid={shareError ? true : undefined}
                aria-describedby={shareError ? `split-${i}-share-error` : undefined}
                inputMode="decimal"
                autoComplete="off"
                maxLength={8}
              />
              {shareError ? (
                <small id={`split-${i}-share-error`} className="form-field__error">
                  {shareError}
                </small>
              ) : null}
            </div>
            <Button
              type="button"
              icon="pi pi-trash"
              text
              severity="secondary"
              aria-label={`Remove salesperson ${i + 1}`}
              disabled={rows.length === 1}
              onClick={() => setRows((r) => r.filter((_, j) => j !== i))}
            />
          </div>
        );
      })}
      <div role="status" aria-live="polite" className={sumMessage ? 'form-field__error' : 'muted'}>
        {sumMessage ?? 'The shares add up to 100%.'}
      </div>
      <div className="dialog-actions">
        <Button
          type="button"
          label="Add salesperson"
          icon="pi pi-plus"
          outlined
          size="small"
          disabled={rows.length >= MAX_PEOPLE}
          onClick={() => setRows((r) => [...r, { salespersonId: '', sharePct: '' }])}
        />
        <span className="commission-splits__spacer" />
        <Button
          type="button"
          label="Cancel"
          severity="secondary"
          outlined
          onClick={onDone}
          disabled={save.isPending}
        />
        <Button type="submit" label="Save split" icon="pi pi-check" loading={save.isPending} />
      </div>
    </form>
  );
}
