import { useState } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { InputTextarea } from 'primereact/inputtextarea';
import { Message } from 'primereact/message';
import { RadioButton } from 'primereact/radiobutton';
import type { BankLineView, CommissionPaymentTarget, MatchTargetKind, PayoutTarget } from '@loambook/common';
import { FormField } from '@/components/form-field';
import { Select } from '@/components/select';
import { serverFormErrors } from '@/lib/form-errors';
import { useCreateMatch } from '../api/create-match';
import { formatAmount, formatDay } from '../reconciliation-format';

interface ManualMatchDialogProps {
  line: BankLineView | null;
  payouts: PayoutTarget[];
  commissionPayments: CommissionPaymentTarget[];
  onClose: () => void;
  onMatched: () => void;
}

/**
 * Match one bank line by hand: to a payout or a commission payment of exactly its amount (any date), or as
 * "other" — reviewed, not something the books match (rent, a supplier) — with a note saying what it is.
 */
export function ManualMatchDialog({
  line,
  payouts,
  commissionPayments,
  onClose,
  onMatched,
}: ManualMatchDialogProps) {
  const [kind, setKind] = useState<MatchTargetKind>('payout');
  const [targetId, setTargetId] = useState<string | null>(null);
  const [note, setNote] = useState('');
  const [tried, setTried] = useState(false);
  const create = useCreateMatch();

  const reset = () => {
    setKind('payout');
    setTargetId(null);
    setNote('');
    setTried(false);
    create.reset();
  };
  const close = () => {
    reset();
    onClose();
  };

  const samePayouts = line ? payouts.filter((p) => p.amountCents === line.amountCents) : [];
  const sameCommissions = line
    ? commissionPayments.filter((c) => c.bankAmountCents === line.amountCents)
    : [];
  const options =
    kind === 'payout'
      ? samePayouts.map((p) => ({
          label: `${p.processorPayoutId} · arrival ${formatDay(p.arrivalDate)}`,
          value: p.id,
        }))
      : sameCommissions.map((c) => ({
          label: `${c.salespersonName} · ${c.branchName} · paid ${formatDay(c.paidOn)}`,
          value: c.id,
        }));
  const server = create.error ? serverFormErrors(create.error, ['note', 'targetId'] as const) : null;
  const errors = {
    targetId:
      tried && kind !== 'other' && !targetId
        ? 'Choose what the line pays or receives.'
        : server?.fields.targetId,
    note:
      tried && kind === 'other' && note.trim().length < 3
        ? 'Say what the line is (3 characters or more).'
        : server?.fields.note,
  };

  const submit = () => {
    setTried(true);
    if (!line) return;
    if (kind !== 'other' && !targetId) return;
    if (kind === 'other' && note.trim().length < 3) return;
    create.mutate(
      {
        bankLineId: line.id,
        targetKind: kind,
        ...(kind === 'other' ? { note: note.trim() } : { targetId: targetId! }),
      },
      {
        onSuccess: () => {
          reset();
          onMatched();
        },
      },
    );
  };

  const kinds: [MatchTargetKind, string][] = [
    ['payout', 'A processor payout'],
    ['commission_payment', 'A commission payment'],
    ['other', 'Other: nothing in the books to match (rent, a supplier, bank interest…)'],
  ];

  return (
    <Dialog
      visible={line !== null}
      onHide={close}
      header="Match a bank line"
      className="app-dialog recon-dialog"
      style={{ width: 'min(36rem, 96vw)' }}
      footer={
        <div className="dialog-actions">
          <Button type="button" label="Cancel" text onClick={close} />
          <Button type="button" label="Match" icon="pi pi-link" onClick={submit} loading={create.isPending} />
        </div>
      }
    >
      {line ? (
        <>
          <p>
            {formatDay(line.postedOn)} · {line.description || 'No description'} ·{' '}
            <strong>{formatAmount(line.amount)}</strong>
          </p>
          {server?.form ? <Message severity="error" text={server.form} className="form-message" /> : null}
          <fieldset className="manual-match__kinds">
            <legend>The line is</legend>
            {kinds.map(([k, label]) => (
              <div className="radio-row" key={k}>
                <RadioButton
                  inputId={`manual-${k}`}
                  name="targetKind"
                  value={k}
                  checked={kind === k}
                  onChange={() => {
                    setKind(k);
                    setTargetId(null);
                  }}
                />
                <label htmlFor={`manual-${k}`}>{label}</label>
              </div>
            ))}
          </fieldset>
          {kind === 'other' ? (
            <FormField id="manual-note" label="What it is" error={errors.note} required>
              {({ invalid, ...control }) => (
                <InputTextarea
                  {...control}
                  value={note}
                  onChange={(e) => setNote(e.target.value)}
                  invalid={invalid}
                  rows={2}
                  maxLength={300}
                  autoResize
                />
              )}
            </FormField>
          ) : options.length === 0 ? (
            <Message
              severity="info"
              text={`No unmatched ${kind === 'payout' ? 'payout' : 'commission payment'} of exactly ${formatAmount(line.amount)} in this period. Undo a match first if this line belongs to one already matched.`}
            />
          ) : (
            <FormField
              id="manual-target"
              label={kind === 'payout' ? 'Payout' : 'Commission payment'}
              error={errors.targetId}
              hint="Only those of exactly this amount are listed."
              required
            >
              {({ invalid, id, ...aria }) => (
                <Select
                  inputId={id}
                  {...aria}
                  value={targetId}
                  options={options}
                  onChange={(e) => setTargetId(e.value as string)}
                  invalid={invalid}
                  placeholder="Choose one"
                  panelClassName="app-overlay"
                />
              )}
            </FormField>
          )}
        </>
      ) : null}
    </Dialog>
  );
}
