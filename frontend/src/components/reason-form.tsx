import { useState, type FormEvent, type ReactNode } from 'react';
import { Button } from 'primereact/button';
import { InputTextarea } from 'primereact/inputtextarea';
import { ApiErrorMessage } from '@/components/api-error-message';
import { FormField } from '@/components/form-field';
import { serverFormErrors } from '@/lib/form-errors';

export interface ReasonFormProps {
  /** The textarea's id (also the label's target). */
  id: string;
  /** What the action does, above the field. */
  intro: ReactNode;
  label?: string;
  hint: string;
  /** Shown when the text is shorter than `minLength` (after trimming). */
  missing: string;
  minLength?: number;
  maxLength: number;
  /** The server's name for the field, for its validation message (e.g. 'reason', 'note'). */
  field: string;
  keepLabel: string;
  confirmLabel: string;
  confirmIcon: string;
  pending: boolean;
  /** Sends the trimmed text; a refusal is shown on the field or, when it is not about the field, below it. */
  onSubmit: (text: string) => Promise<unknown>;
  onClose: () => void;
}

/**
 * The body of a dialog that asks for a reason before a step that cannot be taken back (a lead marked lost,
 * an entry reversed, a cancellation recorded): the text is required, the server's word on it is shown on the
 * field, any other refusal beneath it, and the confirming button says what will happen.
 */
export function ReasonForm({
  id,
  intro,
  label = 'Reason',
  hint,
  missing,
  minLength = 1,
  maxLength,
  field,
  keepLabel,
  confirmLabel,
  confirmIcon,
  pending,
  onSubmit,
  onClose,
}: ReasonFormProps) {
  const [text, setText] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [refusal, setRefusal] = useState<unknown>(null);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setRefusal(null);
    if (text.trim().length < minLength) {
      setError(missing);
      return;
    }
    try {
      await onSubmit(text.trim());
    } catch (e) {
      const message = serverFormErrors(e, [field] as const).fields[field] ?? null;
      setError(message);
      if (!message) setRefusal(e);
    }
  };

  return (
    <form className="dialog-form" onSubmit={submit} noValidate>
      {intro}
      <FormField id={id} label={label} error={error} required hint={hint}>
        {({ invalid, ...control }) => (
          <InputTextarea
            {...control}
            value={text}
            onChange={(e) => {
              setText(e.target.value);
              setError(null);
            }}
            invalid={invalid}
            rows={3}
            maxLength={maxLength}
            autoFocus
            className="w-full"
          />
        )}
      </FormField>
      {refusal ? <ApiErrorMessage error={refusal} /> : null}
      <div className="dialog-actions">
        <Button type="button" label={keepLabel} severity="secondary" outlined onClick={onClose} />
        <Button type="submit" label={confirmLabel} severity="danger" icon={confirmIcon} loading={pending} />
      </div>
    </form>
  );
}
