import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { Message } from 'primereact/message';
import { INSPECTION_DEFAULT_DURATION_MINUTES, utcToZonedLocal, type Inspection } from '@loambook/common';
import { FormField } from '@/components/form-field';
import { Select } from '@/components/select';
import { serverFormErrors, type FieldErrors } from '@/lib/form-errors';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { useBranches } from '@/features/branches/api/get-branches';
import { useUsers } from '@/features/users/api/get-users';
import { useBookInspection } from '../api/book-inspection';
import { useVisitTime, VisitTimeFields, type VisitTimeField } from './visit-time-fields';

type Field = VisitTimeField | 'inspectorId';
const DEFAULT_INSPECTOR = '__default__';
const INSPECTOR_ROLES = ['salesperson', 'branch_manager', 'owner'];

interface BookInspectionDialogProps {
  visible: boolean;
  onClose: () => void;
  onBooked: (inspection: Inspection) => void;
  leadId: string;
  branchId: string;
  homeownerName: string;
}

export function BookInspectionDialog(props: BookInspectionDialogProps) {
  return (
    <Dialog
      visible={props.visible}
      onHide={props.onClose}
      header="Book inspection"
      className="app-dialog"
      style={{ width: '32rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
      dismissableMask={false}
    >
      <BookForm {...props} />
    </Dialog>
  );
}

/** Tomorrow on the branch's calendar ('YYYY-MM-DD'). */
function tomorrowIn(timezone: string | undefined): string {
  const next = new Date(Date.now() + 86_400_000);
  try {
    return timezone ? utcToZonedLocal(next, timezone).local.slice(0, 10) : next.toISOString().slice(0, 10);
  } catch {
    return next.toISOString().slice(0, 10);
  }
}

function BookForm({ onClose, onBooked, leadId, branchId, homeownerName }: BookInspectionDialogProps) {
  const user = useCurrentUser();
  const branches = useBranches();
  const branch = branches.data?.find((b) => b.id === branchId);
  const timezone = branch?.timezone;
  // Managers and the owner may send someone else; a salesperson's own inspections are theirs.
  const choosesInspector = user.role === 'owner' || user.role === 'branch_manager';
  const users = useUsers({ branchId });
  const inspectors = choosesInspector
    ? (users.data ?? [])
        .filter((u) => u.active && INSPECTOR_ROLES.includes(u.role))
        .sort((a, b) => a.name.localeCompare(b.name))
    : [];

  const book = useBookInspection();
  const visit = useVisitTime(
    { date: tomorrowIn(timezone), time: '09:00', durationMinutes: INSPECTION_DEFAULT_DURATION_MINUTES },
    timezone,
  );
  const [inspectorId, setInspectorId] = useState(DEFAULT_INSPECTOR);
  const [submitted, setSubmitted] = useState(false);
  const [serverFields, setServerFields] = useState<FieldErrors<Field>>({});
  const [formMessage, setFormMessage] = useState<string | null>(null);

  const clientErrors: FieldErrors<Field> = visit.errors;
  const errorFor = (f: Field) => serverFields[f] ?? (submitted ? clientErrors[f] : undefined);
  const clearServer = (f: Field) => setServerFields((s) => (s[f] ? { ...s, [f]: undefined } : s));

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setFormMessage(null);
    if (Object.values(clientErrors).some(Boolean)) return;
    try {
      const inspection = await book.mutateAsync({
        leadId,
        request: {
          scheduledAt: visit.local,
          durationMinutes: visit.durationMinutes,
          ...(inspectorId !== DEFAULT_INSPECTOR ? { inspectorId } : {}),
        },
      });
      onBooked(inspection);
    } catch (error) {
      // The server names the wall-clock time "scheduledAt"; its faults are about the time of day here.
      const mapped = serverFormErrors(error, ['scheduledAt', 'durationMinutes', 'inspectorId'] as const);
      setServerFields({
        time: mapped.fields.scheduledAt,
        durationMinutes: mapped.fields.durationMinutes,
        inspectorId: mapped.fields.inspectorId,
      });
      setFormMessage(mapped.form);
    }
  };

  return (
    <form className="dialog-form" onSubmit={submit} noValidate>
      <p className="dialog-intro">
        A visit to {homeownerName}. The time is on the clock at the house
        {branch ? ` (branch ${branch.code})` : ''}, whatever your own device’s zone.
      </p>
      {formMessage ? <Message severity="error" text={formMessage} className="form-message" /> : null}
      <VisitTimeFields
        idPrefix="book"
        visit={visit}
        timezone={timezone}
        errorFor={errorFor}
        onEdit={clearServer}
      />
      {choosesInspector ? (
        <FormField
          id="book-inspector"
          label="Inspector"
          error={errorFor('inspectorId')}
          hint="Left as is, the lead’s salesperson inspects (or you, when there is none)."
        >
          {({ invalid, id, ...aria }) => (
            <Select
              inputId={id}
              {...aria}
              value={inspectorId}
              options={[
                { label: 'The lead’s salesperson', value: DEFAULT_INSPECTOR },
                ...inspectors.map((u) => ({
                  label: u.id === user.id ? `${u.name} (you)` : u.name,
                  value: u.id,
                })),
              ]}
              onChange={(e) => {
                setInspectorId(e.value as string);
                clearServer('inspectorId');
              }}
              invalid={invalid}
              loading={users.isFetching}
              className="w-full"
            />
          )}
        </FormField>
      ) : null}
      <div className="dialog-actions">
        <Button
          type="button"
          label="Cancel"
          severity="secondary"
          outlined
          onClick={onClose}
          disabled={book.isPending}
        />
        <Button type="submit" label="Book" icon="pi pi-calendar-plus" loading={book.isPending} />
      </div>
    </form>
  );
}
