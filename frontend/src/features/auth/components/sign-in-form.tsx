import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import { Password } from 'primereact/password';
import type { SessionResponse } from '@loambook/common';
import { FormField } from '@/components/form-field';
import { hasErrors, serverFormErrors, type FieldErrors } from '@/lib/form-errors';
import { useLogin } from '../api/login';

type Field = 'email' | 'password';
const FIELDS: readonly Field[] = ['email', 'password'];
const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

function validate(email: string, password: string): FieldErrors<Field> {
  const errors: FieldErrors<Field> = {};
  if (!email.trim()) errors.email = 'Enter your e-mail address.';
  else if (!EMAIL.test(email.trim())) errors.email = 'Enter a valid e-mail address.';
  if (!password) errors.password = 'Enter your password.';
  return errors;
}

export function SignInForm({ onSignedIn }: { onSignedIn: (session: SessionResponse) => void }) {
  const login = useLogin();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [submitted, setSubmitted] = useState(false);
  const [serverFields, setServerFields] = useState<FieldErrors<Field>>({});
  const [formMessage, setFormMessage] = useState<string | null>(null);

  const clientErrors = validate(email, password);
  const errorFor = (f: Field) => serverFields[f] ?? (submitted ? clientErrors[f] : undefined);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setFormMessage(null);
    setServerFields({});
    if (hasErrors(clientErrors)) return;
    try {
      onSignedIn(await login.mutateAsync({ email: email.trim(), password }));
    } catch (error) {
      const mapped = serverFormErrors(error, FIELDS);
      setServerFields(mapped.fields);
      setFormMessage(mapped.form);
    }
  };

  return (
    <form onSubmit={submit} noValidate className="auth-form" aria-label="Sign in">
      {formMessage ? (
        <Message severity="error" text={formMessage} className="form-message" role="alert" />
      ) : null}
      <FormField id="sign-in-email" label="E-mail" error={errorFor('email')}>
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            type="email"
            value={email}
            onChange={(e) => setEmail(e.target.value)}
            invalid={invalid}
            autoComplete="username"
            autoFocus
            className="w-full"
          />
        )}
      </FormField>
      <FormField id="sign-in-password" label="Password" error={errorFor('password')}>
        {({ invalid, id, ...aria }) => (
          <Password
            inputId={id}
            {...aria}
            value={password}
            onChange={(e) => setPassword(e.target.value)}
            invalid={invalid}
            feedback={false}
            autoComplete="current-password"
            className="w-full"
            inputClassName="w-full"
          />
        )}
      </FormField>
      <Button
        type="submit"
        label="Sign in"
        icon="pi pi-sign-in"
        loading={login.isPending}
        className="w-full"
      />
    </form>
  );
}
