import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import { formatUsd, UNIT_AMOUNT_PATTERN, type SendProposalRequest } from '@loambook/common';
import { FormField } from '@/components/form-field';
import { serverFormErrors } from '@/lib/form-errors';

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

interface SendDialogProps {
  visible: boolean;
  /** The lead's e-mail address, the default recipient. */
  defaultEmail: string | null;
  homeownerName: string;
  version: number;
  /** Sending again: earlier links stop working. */
  resend: boolean;
  /** The lowest option's customer total: the deposit may not exceed it. */
  lowestTotal: string | null;
  onSend: (input: SendProposalRequest) => Promise<unknown>;
  onClose: () => void;
  pending: boolean;
}

export function SendDialog({ visible, onClose, ...rest }: SendDialogProps) {
  return (
    <Dialog
      visible={visible}
      onHide={onClose}
      header={rest.resend ? 'Send the proposal again' : 'Send the proposal'}
      className="app-dialog"
      style={{ width: '34rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1rem)' }}
      draggable={false}
      resizable={false}
    >
      {visible ? <SendForm onClose={onClose} {...rest} /> : null}
    </Dialog>
  );
}

function SendForm({
  defaultEmail,
  homeownerName,
  version,
  resend,
  lowestTotal,
  onSend,
  onClose,
  pending,
}: Omit<SendDialogProps, 'visible'>) {
  const [email, setEmail] = useState(defaultEmail ?? '');
  const [deposit, setDeposit] = useState('');
  const [submitted, setSubmitted] = useState(false);
  const [server, setServer] = useState<{ email?: string; depositAmount?: string }>({});
  const [formMessage, setFormMessage] = useState<string | null>(null);

  const clientEmail = EMAIL.test(email.trim()) ? undefined : 'Enter the homeowner’s e-mail address.';
  const clientDeposit =
    deposit.trim() && !UNIT_AMOUNT_PATTERN.test(deposit.trim())
      ? 'Enter the deposit in dollars with at most two decimals, e.g. 1500.'
      : undefined;
  const emailError = server.email ?? (submitted ? clientEmail : undefined);
  const depositError = server.depositAmount ?? (submitted ? clientDeposit : undefined);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setFormMessage(null);
    if (clientEmail || clientDeposit) return;
    const input: SendProposalRequest = {};
    input.email = email.trim();
    if (deposit.trim()) input.depositAmount = deposit.trim();
    try {
      await onSend(input);
    } catch (error) {
      const mapped = serverFormErrors(error, ['email', 'depositAmount'] as const);
      setServer(mapped.fields);
      setFormMessage(mapped.form);
    }
  };

  return (
    <form onSubmit={submit} noValidate className="dialog-form" aria-label="Send the proposal">
      <p className="dialog-intro">
        {homeownerName} gets an e-mail with version {version} as a PDF and a link to read and sign it online.
        {resend ? ' The link sent before stops working.' : ''}
      </p>
      {formMessage ? <Message severity="error" text={formMessage} className="form-message" /> : null}
      <FormField
        id="send-email"
        label="Send to"
        error={emailError}
        required
        hint={
          defaultEmail
            ? 'The lead’s address; change it to send elsewhere (the lead stays as it is).'
            : undefined
        }
      >
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            type="email"
            value={email}
            onChange={(e) => {
              setEmail(e.target.value);
              setServer((s) => ({ ...s, email: undefined }));
            }}
            invalid={invalid}
            autoComplete="off"
            maxLength={254}
          />
        )}
      </FormField>
      <FormField
        id="send-deposit"
        label="Deposit"
        error={depositError}
        hint={`Optional: asked for at signing${lowestTotal ? `, at most ${formatUsd(lowestTotal)} (the lowest option)` : ''}.`}
      >
        {({ invalid, ...control }) => (
          <div className="p-inputgroup money-input">
            <span className="p-inputgroup-addon" aria-hidden="true">
              $
            </span>
            <InputText
              {...control}
              value={deposit}
              onChange={(e) => {
                setDeposit(e.target.value);
                setServer((s) => ({ ...s, depositAmount: undefined }));
              }}
              invalid={invalid}
              inputMode="decimal"
              autoComplete="off"
              maxLength={13}
            />
          </div>
        )}
      </FormField>
      <div className="dialog-actions">
        <Button
          type="button"
          label="Cancel"
          severity="secondary"
          outlined
          onClick={onClose}
          disabled={pending}
        />
        <Button type="submit" label="Send" icon="pi pi-send" loading={pending} />
      </div>
    </form>
  );
}
