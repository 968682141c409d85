import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import { addCalendarDays, type JobDetail } from '@loambook/common';
import { FormField } from '@/components/form-field';
import { Select } from '@/components/select';
import { serverFormErrors, type FieldErrors } from '@/lib/form-errors';
import { isApiError } from '@/lib/api-client';
import { useScheduleJob, useUnscheduleJob } from '../api/schedule-job';
import { formatDay, formatPersonHours } from '../job-format';
import { RefusalMessage } from './refusal-message';

export interface ScheduleTarget {
  id: string;
  number: string;
  homeownerName: string;
  crewId: string | null;
  startOn: string | null;
  durationDays: number;
  /** The plan's labour, person-hours (for the working days to fit the crew); null or absent when unknown. */
  estimatedLabourHours?: string | null;
}

interface ScheduleDialogProps {
  job: ScheduleTarget | null;
  crews: { id: string; name: string; leadName: string }[];
  /** The day proposed when the job has none yet. */
  defaultStartOn: string;
  onClose: () => void;
  onDone: (job: JobDetail, what: 'scheduled' | 'unscheduled') => void;
}

type Field = 'crewId' | 'startOn' | 'durationDays';

/** The quick edit of a job's place on the calendar: crew, first day, number of days. Keyboard and touch. */
export function ScheduleDialog(props: ScheduleDialogProps) {
  return (
    <Dialog
      visible={props.job !== null}
      onHide={props.onClose}
      header={props.job ? `Schedule ${props.job.number}` : 'Schedule'}
      className="app-dialog"
      style={{ width: '30rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      {props.job ? <ScheduleForm key={props.job.id} {...props} job={props.job} /> : null}
    </Dialog>
  );
}

function ScheduleForm({
  job,
  crews,
  defaultStartOn,
  onClose,
  onDone,
}: ScheduleDialogProps & { job: ScheduleTarget }) {
  const schedule = useScheduleJob();
  const unschedule = useUnscheduleJob();
  const [crewId, setCrewId] = useState<string | null>(
    job.crewId ?? (crews.length === 1 ? crews[0]!.id : null),
  );
  const [startOn, setStartOn] = useState(job.startOn ?? defaultStartOn);
  const [days, setDays] = useState(String(job.durationDays || 1));
  const [submitted, setSubmitted] = useState(false);
  const [serverFields, setServerFields] = useState<FieldErrors<Field>>({});
  const [refusal, setRefusal] = useState<unknown>(null);
  const [confirmRemove, setConfirmRemove] = useState(false);

  const n = Number(days);
  const errors: FieldErrors<Field> = {};
  if (!crewId) errors.crewId = 'Choose the crew.';
  if (!/^\d{4}-\d{2}-\d{2}$/.test(startOn)) errors.startOn = 'Choose the first working day.';
  if (!/^\d{1,2}$/.test(days.trim()) || n < 1 || n > 30) errors.durationDays = 'From 1 to 30 days.';
  const errorFor = (f: Field) => serverFields[f] ?? (submitted ? errors[f] : undefined);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setRefusal(null);
    if (Object.values(errors).some(Boolean)) return;
    try {
      const saved = await schedule.mutateAsync({
        id: job.id,
        input: { crewId: crewId!, startOn, durationDays: n },
      });
      onDone(saved, 'scheduled');
    } catch (error) {
      if (isApiError(error) && error.status === 409) {
        setRefusal(error);
        return;
      }
      const mapped = serverFormErrors(error, ['crewId', 'startOn', 'durationDays'] as const);
      setServerFields(mapped.fields);
      setRefusal(mapped.form ? error : null);
    }
  };

  const remove = async () => {
    setRefusal(null);
    try {
      onDone(await unschedule.mutateAsync(job.id), 'unscheduled');
    } catch (error) {
      setRefusal(error);
    }
  };

  const ends = !errors.startOn && !errors.durationDays ? addCalendarDays(startOn, n - 1) : null;

  return (
    <form className="dialog-form" onSubmit={submit} noValidate aria-label="Schedule">
      <p className="dialog-intro">
        {job.homeownerName}. The homeowner gets an e-mail with the new days when you save.
      </p>
      {refusal ? <RefusalMessage error={refusal} /> : null}
      <FormField id="schedule-crew" label="Crew" error={errorFor('crewId')} required>
        {({ invalid, ...control }) => (
          <Select
            inputId={control.id}
            aria-describedby={control['aria-describedby']}
            value={crewId}
            options={crews.map((c) => ({ value: c.id, label: `${c.name} · ${c.leadName}` }))}
            onChange={(e) => {
              setCrewId(e.value as string);
              setServerFields((s) => ({ ...s, crewId: undefined }));
            }}
            placeholder={crews.length ? 'Choose a crew' : 'No crews in this branch yet'}
            invalid={invalid}
            className="w-full"
          />
        )}
      </FormField>
      <div className="form-grid form-grid--pair">
        <FormField id="schedule-start" label="First day" error={errorFor('startOn')} required>
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              type="date"
              value={startOn}
              onChange={(e) => {
                setStartOn(e.target.value);
                setServerFields((s) => ({ ...s, startOn: undefined }));
              }}
              invalid={invalid}
              className="w-full"
            />
          )}
        </FormField>
        <FormField
          id="schedule-days"
          label="Working days"
          error={errorFor('durationDays')}
          required
          hint={
            ends || job.estimatedLabourHours
              ? [
                  ends ? `Last day ${formatDay(ends)}` : null,
                  job.estimatedLabourHours
                    ? `The plan has ${formatPersonHours(job.estimatedLabourHours)} of labour`
                    : null,
                ]
                  .filter(Boolean)
                  .join(' · ')
              : undefined
          }
        >
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              value={days}
              inputMode="numeric"
              onChange={(e) => {
                setDays(e.target.value);
                setServerFields((s) => ({ ...s, durationDays: undefined }));
              }}
              invalid={invalid}
              className="w-full"
            />
          )}
        </FormField>
      </div>
      {confirmRemove ? (
        <Message
          severity="warn"
          className="w-full"
          content={
            <div className="confirm-inline">
              <span>Take {job.number} off the calendar? The crew loses the days; the job stays signed.</span>
              <span className="confirm-inline__actions">
                <Button type="button" label="Keep it" text onClick={() => setConfirmRemove(false)} />
                <Button
                  type="button"
                  label="Yes, unschedule"
                  severity="danger"
                  loading={unschedule.isPending}
                  onClick={() => void remove()}
                />
              </span>
            </div>
          }
        />
      ) : null}
      <div className="dialog-actions">
        {job.startOn && !confirmRemove ? (
          <Button
            type="button"
            label="Unschedule"
            icon="pi pi-calendar-times"
            severity="danger"
            text
            className="dialog-actions__left"
            onClick={() => setConfirmRemove(true)}
          />
        ) : null}
        <Button type="button" label="Cancel" text onClick={onClose} />
        <Button type="submit" label="Save schedule" icon="pi pi-check" loading={schedule.isPending} />
      </div>
    </form>
  );
}
