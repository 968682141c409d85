import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { InputTextarea } from 'primereact/inputtextarea';
import { FormField } from '@/components/form-field';
import { ApiErrorMessage } from '@/components/api-error-message';
import { serverFormErrors } from '@/lib/form-errors';
import type { LeadDetail } from '@loambook/common';
import { useMarkLost } from '../api/mark-lost';

interface MarkLostDialogProps {
  lead: LeadDetail;
  visible: boolean;
  onClose: () => void;
  onDone: (lead: LeadDetail) => void;
}

/** Marking a sale lost needs a reason: the office reads them to learn why homeowners go elsewhere. */
export function MarkLostDialog(props: MarkLostDialogProps) {
  return (
    <Dialog
      visible={props.visible}
      onHide={props.onClose}
      header="Mark this lead lost"
      className="app-dialog"
      style={{ width: '32rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      <MarkLostForm {...props} />
    </Dialog>
  );
}

function MarkLostForm({ lead, onClose, onDone }: MarkLostDialogProps) {
  const markLost = useMarkLost();
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    if (!reason.trim()) {
      setError('Say why the sale was lost.');
      return;
    }
    try {
      onDone(await markLost.mutateAsync({ leadId: lead.id, reason: reason.trim() }));
    } catch (e) {
      setError(serverFormErrors(e, ['reason'] as const).fields.reason ?? null);
    }
  };

  return (
    <form className="dialog-form" onSubmit={submit} noValidate>
      <p className="dialog-intro">
        {lead.homeownerName} leaves the open pipeline. A lost lead can be reopened later from where its work
        left off.
      </p>
      <FormField
        id="lost-reason"
        label="Reason"
        error={error}
        required
        hint="E.g. chose another contractor, price, will do it next year."
      >
        {({ invalid, ...control }) => (
          <InputTextarea
            {...control}
            value={reason}
            onChange={(e) => {
              setReason(e.target.value);
              setError(null);
            }}
            invalid={invalid}
            rows={3}
            maxLength={500}
            autoFocus
            className="w-full"
          />
        )}
      </FormField>
      {markLost.isError && !error ? <ApiErrorMessage error={markLost.error} /> : null}
      <div className="dialog-actions">
        <Button type="button" label="Keep it open" severity="secondary" outlined onClick={onClose} />
        <Button
          type="submit"
          label="Confirm lost"
          severity="danger"
          icon="pi pi-times"
          loading={markLost.isPending}
        />
      </div>
    </form>
  );
}
