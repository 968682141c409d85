import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { InputTextarea } from 'primereact/inputtextarea';
import type { Inspection } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { FormField } from '@/components/form-field';
import { useCancelInspection } from '../api/cancel-inspection';
import { formatWallClock } from '../inspection-format';

interface CancelInspectionDialogProps {
  inspection: Inspection;
  visible: boolean;
  onClose: () => void;
  onDone: (inspection: Inspection) => void;
}

/** Calls off a booked visit, with an optional reason for the timeline. It cannot be booked again. */
export function CancelInspectionDialog(props: CancelInspectionDialogProps) {
  return (
    <Dialog
      visible={props.visible}
      onHide={props.onClose}
      header="Cancel this inspection?"
      className="app-dialog"
      style={{ width: '32rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      <CancelForm {...props} />
    </Dialog>
  );
}

function CancelForm({ inspection, onClose, onDone }: CancelInspectionDialogProps) {
  const cancel = useCancelInspection();
  const [reason, setReason] = useState('');

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    try {
      onDone(await cancel.mutateAsync({ id: inspection.id, reason: reason.trim() || undefined }));
    } catch {
      // Shown below from cancel.error (e.g. 409: it was completed meanwhile).
    }
  };

  return (
    <form className="dialog-form" onSubmit={submit} noValidate>
      <p className="dialog-intro">
        The visit of {formatWallClock(inspection.scheduledLocal)} is called off and kept, cancelled, for the
        record, with its findings, survey and photos so far. When nothing else is booked for{' '}
        {inspection.lead.homeownerName}, the lead goes back to New. To change only the day or time, reschedule
        instead.
      </p>
      <FormField
        id="cancel-inspection-reason"
        label="Reason"
        hint="Optional, for the timeline: e.g. homeowner away, rain, will call back."
      >
        {({ invalid, ...control }) => (
          <InputTextarea
            {...control}
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            invalid={invalid}
            rows={2}
            maxLength={500}
            className="w-full"
          />
        )}
      </FormField>
      {cancel.isError ? <ApiErrorMessage error={cancel.error} /> : null}
      <div className="dialog-actions">
        <Button type="button" label="Keep it booked" severity="secondary" outlined onClick={onClose} />
        <Button
          type="submit"
          label="Cancel inspection"
          severity="danger"
          icon="pi pi-calendar-times"
          loading={cancel.isPending}
        />
      </div>
    </form>
  );
}
