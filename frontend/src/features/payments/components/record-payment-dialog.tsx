import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { InputText } from 'primereact/inputtext';
import {
  money,
  RECORDED_METHODS,
  type ContractPayments,
  type PaymentKind,
  type PaymentView,
  type RecordedMethod,
} from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { FormField } from '@/components/form-field';
import { Select } from '@/components/select';
import { serverFormErrors } from '@/lib/form-errors';
import { formatDay } from '@/features/ledger/ledger-format';
import { useRecordPayment } from '../api/record-payment';
import { localToday } from '@/lib/format';
import { AMOUNT_PATTERN, cleanAmount, KIND_LABELS, METHOD_LABELS, usd } from '../payments-format';

interface RecordPaymentDialogProps {
  payments: ContractPayments;
  visible: boolean;
  onClose: () => void;
  onDone: (payment: PaymentView) => void;
}

type Field = 'kind' | 'method' | 'amount' | 'receivedOn' | 'reference';

/**
 * The bookkeeper records money that reached the bank without the card processor: cash, a cheque or a
 * transfer. Posted at once (bank / customer deposits or accounts receivable) and never edited afterwards,
 * so the dialog shows what will be posted and asks for a confirmation first.
 */
export function RecordPaymentDialog(props: RecordPaymentDialogProps) {
  return (
    <Dialog
      visible={props.visible}
      onHide={props.onClose}
      header="Record a payment"
      className="app-dialog"
      style={{ width: '34rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      {props.visible ? <RecordPaymentForm {...props} /> : null}
    </Dialog>
  );
}

function RecordPaymentForm({ payments, onClose, onDone }: RecordPaymentDialogProps) {
  const record = useRecordPayment();
  // One id per opening of the dialog: pressing the button twice, or a retry after a lost answer, records once.
  const [requestId] = useState(() => crypto.randomUUID());
  const depositOpen = money(payments.depositHeld).lessThan(payments.depositAmount);
  const [kind, setKind] = useState<PaymentKind>(depositOpen ? 'deposit' : 'balance');
  const [method, setMethod] = useState<RecordedMethod>('cheque');
  const [amount, setAmount] = useState('');
  const [receivedOn, setReceivedOn] = useState(localToday());
  const [reference, setReference] = useState('');
  const [errors, setErrors] = useState<Partial<Record<Field, string>>>({});
  const [refusal, setRefusal] = useState<unknown>(null);
  const [confirming, setConfirming] = useState(false);

  const check = (): Partial<Record<Field, string>> => {
    const e: Partial<Record<Field, string>> = {};
    const value = cleanAmount(amount);
    if (!AMOUNT_PATTERN.test(value) || !money(value).greaterThan(0))
      e.amount = 'Enter the amount in dollars, e.g. 500.00.';
    else if (money(value).greaterThan(payments.balanceDue))
      e.amount = `That is more than the ${usd(payments.balanceDue)} left to pay.`;
    if (!/^\d{4}-\d{2}-\d{2}$/.test(receivedOn)) e.receivedOn = 'Enter the day the money was received.';
    else if (receivedOn > localToday())
      e.receivedOn = 'The day the money was received cannot be in the future.';
    if (reference.length > 120) e.reference = 'At most 120 characters.';
    return e;
  };

  const review = (event: FormEvent) => {
    event.preventDefault();
    setRefusal(null);
    const found = check();
    setErrors(found);
    if (Object.keys(found).length === 0) setConfirming(true);
  };

  const save = async () => {
    try {
      onDone(
        await record.mutateAsync({
          contractId: payments.contractId,
          kind,
          method,
          amount: cleanAmount(amount),
          receivedOn,
          ...(reference.trim() ? { reference: reference.trim() } : {}),
          requestId,
        }),
      );
    } catch (e) {
      const mapped = serverFormErrors(e, ['kind', 'method', 'amount', 'receivedOn', 'reference'] as const);
      setErrors(mapped.fields);
      setConfirming(false);
      if (mapped.form) setRefusal(e);
    }
  };

  if (confirming) {
    const account = kind === 'deposit' ? 'customer deposits' : 'accounts receivable';
    return (
      <div className="dialog-form">
        <p className="dialog-intro">
          Record <strong>{usd(cleanAmount(amount))}</strong> received by {METHOD_LABELS[method].toLowerCase()}
          {reference.trim() ? ` (${reference.trim()})` : ''} on {formatDay(receivedOn)} as the{' '}
          {KIND_LABELS[kind].toLowerCase()}?
        </p>
        <p className="dialog-intro">
          This posts bank / {account} at once. A posted payment is not edited: a mistake is put right with a
          reversing entry in the journal.
        </p>
        <div className="dialog-actions">
          <Button
            type="button"
            label="Back"
            severity="secondary"
            outlined
            onClick={() => setConfirming(false)}
          />
          <Button
            type="button"
            label="Record payment"
            icon="pi pi-check"
            loading={record.isPending}
            onClick={save}
          />
        </div>
      </div>
    );
  }

  return (
    <form className="dialog-form" onSubmit={review} noValidate>
      <p className="dialog-intro">
        Left to pay: <strong>{usd(payments.balanceDue)}</strong>. Card payments are recorded by themselves
        when the processor reports them.
      </p>
      {refusal ? <ApiErrorMessage error={refusal} /> : null}
      <div className="payments-form-row">
        <FormField id="record-kind" label="For" error={errors.kind} required>
          {({ invalid, id }) => (
            <Select
              inputId={id}
              value={kind}
              options={(['deposit', 'balance'] as const).map((k) => ({ label: KIND_LABELS[k], value: k }))}
              onChange={(e) => setKind(e.value as PaymentKind)}
              invalid={invalid}
              className="w-full"
            />
          )}
        </FormField>
        <FormField id="record-method" label="Method" error={errors.method} required>
          {({ invalid, id }) => (
            <Select
              inputId={id}
              value={method}
              options={RECORDED_METHODS.map((m) => ({ label: METHOD_LABELS[m], value: m }))}
              onChange={(e) => setMethod(e.value as RecordedMethod)}
              invalid={invalid}
              className="w-full"
            />
          )}
        </FormField>
      </div>
      <div className="payments-form-row">
        <FormField id="record-amount" label="Amount" error={errors.amount} required>
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              value={amount}
              inputMode="decimal"
              placeholder="0.00"
              onChange={(e) => {
                setAmount(e.target.value);
                setErrors((x) => ({ ...x, amount: undefined }));
              }}
              invalid={invalid}
              autoFocus
              className="w-full"
            />
          )}
        </FormField>
        <FormField id="record-received-on" label="Received on" error={errors.receivedOn} required>
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              type="date"
              value={receivedOn}
              max={localToday()}
              onChange={(e) => {
                setReceivedOn(e.target.value);
                setErrors((x) => ({ ...x, receivedOn: undefined }));
              }}
              invalid={invalid}
              className="w-full"
            />
          )}
        </FormField>
      </div>
      <FormField
        id="record-reference"
        label="Reference"
        error={errors.reference}
        hint="Cheque number, transfer reference or receipt number."
      >
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={reference}
            maxLength={120}
            onChange={(e) => setReference(e.target.value)}
            invalid={invalid}
            className="w-full"
          />
        )}
      </FormField>
      <div className="dialog-actions">
        <Button type="button" label="Cancel" severity="secondary" outlined onClick={onClose} />
        <Button type="submit" label="Review" icon="pi pi-arrow-right" iconPos="right" />
      </div>
    </form>
  );
}
