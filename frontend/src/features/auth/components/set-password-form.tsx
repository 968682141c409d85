import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Message } from 'primereact/message';
import { Password } from 'primereact/password';
import {
  PASSWORD_MIN_LENGTH,
  passwordProblem,
  type PasswordTokenInfo,
  type SessionResponse,
} from '@loambook/common';
import { FormField } from '@/components/form-field';
import { isApiError } from '@/lib/api-client';
import { serverFormErrors } from '@/lib/form-errors';
import { useSetPassword } from '../api/set-password';

interface SetPasswordFormProps {
  token: string;
  link: PasswordTokenInfo;
  onDone: (session: SessionResponse) => void;
  /** The link stopped working while the form was open (410). */
  onLinkGone: (message: string) => void;
}

export function SetPasswordForm({ token, link, onDone, onLinkGone }: SetPasswordFormProps) {
  const save = useSetPassword();
  const [password, setPassword] = useState('');
  const [repeat, setRepeat] = useState('');
  const [submitted, setSubmitted] = useState(false);
  const [serverMessage, setServerMessage] = useState<string | null>(null);

  const problem = passwordProblem(password, { email: link.email });
  const mismatch = repeat !== password ? 'The two passwords are not the same.' : null;
  const newError = submitted ? (serverMessage ?? problem) : serverMessage;
  // Said while typing once the repeat is as long as the password, and on every attempt to save.
  const repeatError = submitted || (repeat && repeat.length >= password.length) ? mismatch : null;

  const hint =
    password.length === 0 ? (
      `At least ${PASSWORD_MIN_LENGTH} characters. A short sentence you will remember works well.`
    ) : problem ? (
      <span className="password-hint password-hint--todo" aria-live="polite">
        {problem} ({password.length}/{PASSWORD_MIN_LENGTH})
      </span>
    ) : (
      <span className="password-hint password-hint--ok" aria-live="polite">
        <i className="pi pi-check" aria-hidden="true" /> Long enough.
      </span>
    );

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setServerMessage(null);
    if (problem || mismatch) return;
    try {
      onDone(await save.mutateAsync({ token, password }));
    } catch (error) {
      if (isApiError(error) && error.status === 410) {
        onLinkGone(error.message);
        return;
      }
      const mapped = serverFormErrors(error, ['password'] as const);
      setServerMessage(mapped.fields.password ?? mapped.form);
    }
  };

  return (
    <form onSubmit={submit} noValidate className="auth-form" aria-label="Set password">
      <FormField id="new-password" label="New password" error={newError} hint={newError ? undefined : hint}>
        {({ invalid, id, ...aria }) => (
          <Password
            inputId={id}
            {...aria}
            value={password}
            onChange={(e) => {
              setPassword(e.target.value);
              setServerMessage(null);
            }}
            invalid={invalid}
            feedback={false}
            toggleMask
            autoComplete="new-password"
            autoFocus
            className="w-full"
            inputClassName="w-full"
          />
        )}
      </FormField>
      <FormField id="repeat-password" label="Repeat password" error={repeatError}>
        {({ invalid, id, ...aria }) => (
          <Password
            inputId={id}
            {...aria}
            value={repeat}
            onChange={(e) => setRepeat(e.target.value)}
            invalid={invalid}
            feedback={false}
            autoComplete="new-password"
            className="w-full"
            inputClassName="w-full"
          />
        )}
      </FormField>
      {save.isError && !serverMessage ? (
        <Message severity="error" text="The password was not saved. Try again." className="form-message" />
      ) : null}
      <Button
        type="submit"
        label="Set password and sign in"
        icon="pi pi-lock"
        loading={save.isPending}
        className="w-full"
      />
    </form>
  );
}
