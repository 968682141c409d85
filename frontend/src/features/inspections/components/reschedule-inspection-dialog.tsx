import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { Message } from 'primereact/message';
import type { Inspection } from '@loambook/common';
import { serverFormErrors, type FieldErrors } from '@/lib/form-errors';
import { useUpdateInspection } from '../api/update-inspection';
import { formatWallClock } from '../inspection-format';
import { useVisitTime, VisitTimeFields, type VisitTimeField } from './visit-time-fields';

interface RescheduleInspectionDialogProps {
  inspection: Inspection;
  visible: boolean;
  onClose: () => void;
  onDone: (inspection: Inspection) => void;
}

/** Moves a booked visit to another day or time on the branch's clock; the timeline records the move. */
export function RescheduleInspectionDialog(props: RescheduleInspectionDialogProps) {
  return (
    <Dialog
      visible={props.visible}
      onHide={props.onClose}
      header="Reschedule inspection"
      className="app-dialog"
      style={{ width: '32rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
      dismissableMask={false}
    >
      <RescheduleForm {...props} />
    </Dialog>
  );
}

function RescheduleForm({ inspection, onClose, onDone }: RescheduleInspectionDialogProps) {
  const update = useUpdateInspection();
  const visit = useVisitTime(
    {
      date: inspection.scheduledLocal.slice(0, 10),
      time: inspection.scheduledLocal.slice(11, 16),
      durationMinutes: inspection.durationMinutes,
    },
    inspection.timezone,
  );
  const [submitted, setSubmitted] = useState(false);
  const [serverFields, setServerFields] = useState<FieldErrors<VisitTimeField>>({});
  const [formMessage, setFormMessage] = useState<string | null>(null);

  const errorFor = (f: VisitTimeField) => serverFields[f] ?? (submitted ? visit.errors[f] : undefined);
  const clearServer = (f: VisitTimeField) => setServerFields((s) => (s[f] ? { ...s, [f]: undefined } : s));
  const unchanged =
    visit.local === inspection.scheduledLocal && visit.durationMinutes === inspection.durationMinutes;

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setFormMessage(null);
    if (Object.values(visit.errors).some(Boolean)) return;
    if (unchanged) {
      setFormMessage('That is the time it is booked for already: choose another day or time.');
      return;
    }
    try {
      onDone(
        await update.mutateAsync({
          id: inspection.id,
          patch: { scheduledAt: visit.local, durationMinutes: visit.durationMinutes },
        }),
      );
    } catch (error) {
      const mapped = serverFormErrors(error, ['scheduledAt', 'durationMinutes'] as const);
      setServerFields({ time: mapped.fields.scheduledAt, durationMinutes: mapped.fields.durationMinutes });
      setFormMessage(mapped.form);
    }
  };

  return (
    <form className="dialog-form" onSubmit={submit} noValidate>
      <p className="dialog-intro">
        Booked for {formatWallClock(inspection.scheduledLocal)}. Choose the new time on the clock at the
        house; tell {inspection.lead.homeownerName} about the change.
      </p>
      {formMessage ? <Message severity="error" text={formMessage} className="form-message" /> : null}
      <VisitTimeFields
        idPrefix="reschedule"
        visit={visit}
        timezone={inspection.timezone}
        errorFor={errorFor}
        onEdit={clearServer}
      />
      <div className="dialog-actions">
        <Button
          type="button"
          label="Keep the time"
          severity="secondary"
          outlined
          onClick={onClose}
          disabled={update.isPending}
        />
        <Button type="submit" label="Reschedule" icon="pi pi-calendar" loading={update.isPending} />
      </div>
    </form>
  );
}
