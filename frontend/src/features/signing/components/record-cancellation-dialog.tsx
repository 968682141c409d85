import '../signing.css';
import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { InputTextarea } from 'primereact/inputtextarea';
import { formatUsd, money, type ContractView } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { FormField } from '@/components/form-field';
import { serverFormErrors } from '@/lib/form-errors';
import { useRecordCancellation } from '../api/record-cancellation';
import { formatCalendarDate } from '../signing-format';

interface RecordCancellationDialogProps {
  contract: ContractView;
  visible: boolean;
  onClose: () => void;
  onDone: (contract: ContractView) => void;
}

/**
 * Staff record a cancellation the homeowner made by phone, mail or at the door, while the 16 CFR 429
 * window is open. It cannot be undone, so the dialog says what follows and asks how they cancelled.
 */
export function RecordCancellationDialog(props: RecordCancellationDialogProps) {
  return (
    <Dialog
      visible={props.visible}
      onHide={props.onClose}
      header="Record the homeowner’s cancellation"
      className="app-dialog"
      style={{ width: '34rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      <RecordCancellationForm {...props} />
    </Dialog>
  );
}

function RecordCancellationForm({ contract, onClose, onDone }: RecordCancellationDialogProps) {
  const cancel = useRecordCancellation();
  const [note, setNote] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [refusal, setRefusal] = useState<unknown>(null);
  const paid = money(contract.depositAmount).greaterThan(0);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setRefusal(null);
    if (!note.trim()) {
      setError('Say how the homeowner cancelled: by phone, by mail, in person, and when.');
      return;
    }
    try {
      onDone(await cancel.mutateAsync({ contractId: contract.id, note: note.trim() }));
    } catch (e) {
      // Already cancelled, or the window closed meanwhile: 409 / 422 with the reason in words.
      const mapped = serverFormErrors(e, ['note'] as const);
      setError(mapped.fields.note ?? null);
      if (!mapped.fields.note) setRefusal(e);
    }
  };

  return (
    <form className="dialog-form" onSubmit={submit} noValidate>
      <p className="dialog-intro">
        {contract.homeownerName} may cancel until the end of {formatCalendarDate(contract.lastDayToCancel)}.
        Recording the cancellation:
      </p>
      <ul className="record-cancellation__effects">
        <li>
          cancels the contract for option {contract.option.position}, {contract.option.title} (
          {formatUsd(contract.price)});
        </li>
        <li>moves the lead to Cancelled and calls off any work booked from this contract;</li>
        <li>
          <strong>
            puts a refund on the record: every payment made under the contract
            {paid ? `, the ${formatUsd(contract.depositAmount)} deposit included,` : ''} is due back within 10
            business days
          </strong>
          ;
        </li>
        <li>e-mails the homeowner a confirmation and tells the salesperson.</li>
      </ul>
      <p className="dialog-intro">It cannot be undone.</p>
      {refusal ? <ApiErrorMessage error={refusal} /> : null}
      <FormField
        id="cancellation-note"
        label="How the homeowner cancelled"
        error={error}
        required
        hint="E.g. phoned the office on Tuesday at 10:15 and mailed the signed cancellation form."
      >
        {({ invalid, ...control }) => (
          <InputTextarea
            {...control}
            value={note}
            onChange={(e) => {
              setNote(e.target.value);
              setError(null);
            }}
            invalid={invalid}
            rows={3}
            maxLength={2000}
            autoFocus
            className="w-full"
          />
        )}
      </FormField>
      <div className="dialog-actions">
        <Button type="button" label="Keep the contract" severity="secondary" outlined onClick={onClose} />
        <Button
          type="submit"
          label="Record cancellation"
          severity="danger"
          icon="pi pi-ban"
          loading={cancel.isPending}
        />
      </div>
    </form>
  );
}
