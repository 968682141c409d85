import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { InputText } from 'primereact/inputtext';
import { money, type ContractPayments, type PaymentKind, type PaymentLinkResult } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { FormField } from '@/components/form-field';
import { isApiError } from '@/lib/api-client';
import { serverFormErrors } from '@/lib/form-errors';
import { useCreatePaymentLink } from '../api/create-payment-link';
import { AMOUNT_PATTERN, cleanAmount, KIND_LABELS, usd } from '../payments-format';

interface PaymentLinkDialogProps {
  payments: ContractPayments;
  kind: PaymentKind | null;
  homeownerEmail: string | null;
  onClose: () => void;
  onDone: (result: PaymentLinkResult) => void;
}

/** Asks the processor for a card payment link for the deposit or the balance; the homeowner gets it by e-mail. */
export function PaymentLinkDialog(props: PaymentLinkDialogProps) {
  return (
    <Dialog
      visible={props.kind !== null}
      onHide={props.onClose}
      header={props.kind === 'balance' ? 'Request the balance by card' : 'Request the deposit by card'}
      className="app-dialog"
      style={{ width: '32rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      {props.kind ? <PaymentLinkForm {...props} kind={props.kind} /> : null}
    </Dialog>
  );
}

function PaymentLinkForm({
  payments,
  kind,
  homeownerEmail,
  onClose,
  onDone,
}: PaymentLinkDialogProps & { kind: PaymentKind }) {
  const create = useCreatePaymentLink();
  const suggested =
    kind === 'deposit' && money(payments.depositAmount).greaterThan(0)
      ? payments.depositAmount
      : payments.balanceDue;
  const [amount, setAmount] = useState(suggested);
  const [error, setError] = useState<string | null>(null);
  const [refusal, setRefusal] = useState<unknown>(null);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setRefusal(null);
    const value = cleanAmount(amount);
    if (!AMOUNT_PATTERN.test(value) || !money(value).greaterThan(0)) {
      setError('Enter the amount in dollars, e.g. 1500.00.');
      return;
    }
    if (money(value).greaterThan(payments.balanceDue)) {
      setError(`That is more than the ${usd(payments.balanceDue)} left to pay.`);
      return;
    }
    try {
      onDone(await create.mutateAsync({ contractId: payments.contractId, kind, amount: value }));
    } catch (e) {
      const mapped = serverFormErrors(e, ['amount'] as const);
      const onAmount =
        mapped.fields.amount ??
        (isApiError(e) && (e.details as { field?: string } | null)?.field === 'amount' ? e.message : null);
      setError(onAmount);
      if (!onAmount) setRefusal(e);
    }
  };

  return (
    <form className="dialog-form" onSubmit={submit} noValidate>
      <p className="dialog-intro">
        The card processor makes a payment page for this amount.{' '}
        {homeownerEmail ? (
          <>
            The link is e-mailed to <strong>{homeownerEmail}</strong> and shown here to copy.
          </>
        ) : (
          <>The lead has no e-mail address: copy the link from the panel and send it another way.</>
        )}{' '}
        A new link replaces an earlier {KIND_LABELS[kind].toLowerCase()} link that was not paid.
      </p>
      {refusal ? <ApiErrorMessage error={refusal} /> : null}
      <FormField
        id="payment-link-amount"
        label={`${KIND_LABELS[kind]} amount`}
        error={error}
        required
        hint={`Left to pay on the contract: ${usd(payments.balanceDue)}.`}
      >
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={amount}
            inputMode="decimal"
            onChange={(e) => {
              setAmount(e.target.value);
              setError(null);
            }}
            invalid={invalid}
            autoFocus
            className="w-full"
          />
        )}
      </FormField>
      <div className="dialog-actions">
        <Button type="button" label="Cancel" severity="secondary" outlined onClick={onClose} />
        <Button type="submit" label="Make the link" icon="pi pi-link" loading={create.isPending} />
      </div>
    </form>
  );
}
