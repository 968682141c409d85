import { useState } from 'react';
import type { FormEvent } from 'react';
import { InputTextarea } from 'primereact/inputtextarea';
import { SelectButton } from 'primereact/selectbutton';
import { MANUAL_ACTIVITY_KINDS, type ManualActivityKind } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { useNotify } from '@/components/notify';
import { serverFormErrors } from '@/lib/form-errors';
import { useAddActivity } from '../api/add-activity';
import { activityKind } from '../lead-format';

const KIND_OPTIONS = MANUAL_ACTIVITY_KINDS.map((k) => ({ label: activityKind(k).label, value: k }));

/** A call, a visit, a note or an e-mail, written onto the lead's timeline. */
export function LogActivityForm({ leadId }: { leadId: string }) {
  const notify = useNotify();
  const add = useAddActivity();
  const [kind, setKind] = useState<ManualActivityKind>('call');
  const [body, setBody] = useState('');
  const [error, setError] = useState<string | null>(null);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    if (!body.trim()) {
      setError('Write what happened.');
      return;
    }
    setError(null);
    try {
      await add.mutateAsync({ leadId, kind, body: body.trim() });
      setBody('');
      notify.success('Added to the timeline');
    } catch (e) {
      const mapped = serverFormErrors(e, ['body', 'kind'] as const);
      setError(mapped.fields.body ?? mapped.fields.kind ?? null);
    }
  };

  return (
    <form className="log-activity" onSubmit={submit} noValidate aria-labelledby="log-activity-title">
      <h3 id="log-activity-title" className="log-activity__title">
        Log activity
      </h3>
      <div className="log-activity__kind" role="group" aria-labelledby="log-activity-kind">
        <span id="log-activity-kind" className="form-field__label">
          Kind
        </span>
        <SelectButton
          value={kind}
          options={KIND_OPTIONS}
          onChange={(e) => e.value && setKind(e.value as ManualActivityKind)}
          allowEmpty={false}
          className="kind-buttons"
        />
      </div>
      <div className="form-field">
        <label htmlFor="log-activity-body" className="form-field__label">
          What happened
        </label>
        <InputTextarea
          id="log-activity-body"
          value={body}
          onChange={(e) => {
            setBody(e.target.value);
            if (error) setError(null);
          }}
          rows={2}
          autoResize
          maxLength={4000}
          invalid={!!error}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? 'log-activity-error' : undefined}
          placeholder="Left a voicemail about Thursday’s visit…"
          className="w-full"
        />
        {error ? (
          <small id="log-activity-error" className="form-field__error">
            <i className="pi pi-exclamation-circle" aria-hidden="true" /> {error}
          </small>
        ) : null}
      </div>
      {add.isError && !error ? <ApiErrorMessage error={add.error} /> : null}
      <div className="log-activity__actions">
        {/* A plain button (PrimeReact's repeats its text as aria-label, which "Time" would match). */}
        <button type="submit" className="p-button p-component" disabled={add.isPending}>
          <i
            className={`pi ${add.isPending ? 'pi-spin pi-spinner' : 'pi-plus'} p-button-icon p-button-icon-left`}
            aria-hidden="true"
          />
          <span className="p-button-label">Add to timeline</span>
        </button>
      </div>
    </form>
  );
}
