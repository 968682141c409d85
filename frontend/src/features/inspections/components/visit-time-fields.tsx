import { useState } from 'react';
import { InputText } from 'primereact/inputtext';
import {
  INSPECTION_MAX_DURATION_MINUTES,
  INSPECTION_MIN_DURATION_MINUTES,
  zonedLocalToUtc,
} from '@loambook/common';
import { FormField } from '@/components/form-field';
import type { FieldErrors } from '@/lib/form-errors';
import { zoneLabel } from '../inspection-format';

export type VisitTimeField = 'date' | 'time' | 'durationMinutes';

/**
 * The day, time and length of a visit, on the branch's clock: the state and checks shared by booking an
 * inspection and rescheduling one. `local` is what the API takes ('2026-12-04T13:30').
 */
export function useVisitTime(
  initial: { date: string; time: string; durationMinutes: number },
  timezone?: string,
) {
  const [date, setDate] = useState(initial.date);
  const [time, setTime] = useState(initial.time);
  const [duration, setDuration] = useState(String(initial.durationMinutes));

  const local = `${date}T${time}`;
  const errors: FieldErrors<VisitTimeField> = {};
  if (!/^\d{4}-\d{2}-\d{2}$/.test(date)) errors.date = 'Choose the day of the visit.';
  if (!/^\d{2}:\d{2}$/.test(time)) errors.time = 'Enter the time the visit starts.';
  else if (!errors.date && timezone) {
    // The server says the same; saying it here saves a round trip (a time skipped by the spring change).
    const check = zonedLocalToUtc(local, timezone);
    if (!check.ok && check.reason === 'nonexistent') errors.time = check.message;
  }
  const durationMinutes = Number(duration);
  if (
    !/^\d{1,3}$/.test(duration.trim()) ||
    durationMinutes < INSPECTION_MIN_DURATION_MINUTES ||
    durationMinutes > INSPECTION_MAX_DURATION_MINUTES
  ) {
    errors.durationMinutes = `Enter a duration from ${INSPECTION_MIN_DURATION_MINUTES} to ${INSPECTION_MAX_DURATION_MINUTES} minutes.`;
  }
  return { date, setDate, time, setTime, duration, setDuration, local, durationMinutes, errors };
}

export type VisitTime = ReturnType<typeof useVisitTime>;

interface VisitTimeFieldsProps {
  /** Prefix of the inputs' ids: `${idPrefix}-date`, `-time`, `-duration`. */
  idPrefix: string;
  visit: VisitTime;
  timezone?: string;
  errorFor: (field: VisitTimeField) => string | undefined;
  /** Called when a field changes, so the caller can drop that field's server error. */
  onEdit: (field: VisitTimeField) => void;
}

export function VisitTimeFields({ idPrefix, visit, timezone, errorFor, onEdit }: VisitTimeFieldsProps) {
  const zone = timezone ? zoneLabel(timezone) : null;
  return (
    <>
      <div className="form-grid form-grid--pair">
        <FormField id={`${idPrefix}-date`} label="Date" error={errorFor('date')} required>
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              type="date"
              value={visit.date}
              onChange={(e) => {
                visit.setDate(e.target.value);
                onEdit('time');
              }}
              invalid={invalid}
              className="w-full"
            />
          )}
        </FormField>
        <FormField
          id={`${idPrefix}-time`}
          label="Time"
          error={errorFor('time')}
          required
          hint={
            zone ? (
              <span className="zone-hint">
                {zone} · {timezone}
              </span>
            ) : (
              'The branch’s time zone'
            )
          }
        >
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              type="time"
              step={300}
              value={visit.time}
              onChange={(e) => {
                visit.setTime(e.target.value);
                onEdit('time');
              }}
              invalid={invalid}
              className="w-full"
            />
          )}
        </FormField>
      </div>
      <FormField
        id={`${idPrefix}-duration`}
        label="Duration (minutes)"
        error={errorFor('durationMinutes')}
        hint="A full visit with a survey usually takes 60 to 120 minutes."
      >
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={visit.duration}
            onChange={(e) => {
              visit.setDuration(e.target.value);
              onEdit('durationMinutes');
            }}
            inputMode="numeric"
            maxLength={3}
            invalid={invalid}
            className="duration-input"
          />
        )}
      </FormField>
    </>
  );
}
