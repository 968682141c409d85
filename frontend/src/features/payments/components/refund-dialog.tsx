import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Checkbox } from 'primereact/checkbox';
import { Dialog } from 'primereact/dialog';
import { InputText } from 'primereact/inputtext';
import { InputTextarea } from 'primereact/inputtextarea';
import { money, type ContractPayments, type RefundView } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { FormField } from '@/components/form-field';
import { serverFormErrors } from '@/lib/form-errors';
import { useRefundPayments } from '../api/refund-payments';
import { AMOUNT_PATTERN, cleanAmount, usd } from '../payments-format';

interface RefundDialogProps {
  payments: ContractPayments;
  homeownerName: string;
  visible: boolean;
  onClose: () => void;
  onDone: (refunds: RefundView[]) => void;
}

/**
 * Refunds a cancelled contract's card payments through the processor (16 CFR 429: every payment is returned
 * within 10 business days of a valid cancellation). Money leaves at once and cannot be called back, so the
 * bookkeeper ticks a confirmation before the button works.
 */
export function RefundDialog(props: RefundDialogProps) {
  return (
    <Dialog
      visible={props.visible}
      onHide={props.onClose}
      header="Refund to the card"
      className="app-dialog"
      style={{ width: '32rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      {props.visible ? <RefundForm {...props} /> : null}
    </Dialog>
  );
}

function RefundForm({ payments, homeownerName, onClose, onDone }: RefundDialogProps) {
  const refund = useRefundPayments();
  const [requestId] = useState(() => crypto.randomUUID());
  const [amount, setAmount] = useState(payments.refundable);
  const [reason, setReason] = useState('');
  const [sure, setSure] = useState(false);
  const [errors, setErrors] = useState<{ amount?: string; reason?: string; sure?: string }>({});
  const [refusal, setRefusal] = useState<unknown>(null);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setRefusal(null);
    const value = cleanAmount(amount);
    const found: typeof errors = {};
    if (!AMOUNT_PATTERN.test(value) || !money(value).greaterThan(0))
      found.amount = 'Enter the amount in dollars.';
    else if (money(value).greaterThan(payments.refundable))
      found.amount = `At most ${usd(payments.refundable)} can go back to the card.`;
    if (!sure) found.sure = 'Tick the box to confirm: a refund cannot be called back.';
    setErrors(found);
    if (Object.keys(found).length) return;
    try {
      onDone(
        await refund.mutateAsync({
          contractId: payments.contractId,
          amount: value,
          ...(reason.trim() ? { reason: reason.trim() } : {}),
          requestId,
        }),
      );
    } catch (e) {
      const mapped = serverFormErrors(e, ['amount', 'reason'] as const);
      setErrors(mapped.fields);
      if (mapped.form) setRefusal(e);
    }
  };

  return (
    <form className="dialog-form" onSubmit={submit} noValidate>
      <p className="dialog-intro">
        The contract was cancelled: every payment made under it is due back within 10 business days. This
        sends {homeownerName}’s card payments back through the card processor. The processor keeps its fee on
        the original payment.
      </p>
      {refusal ? <ApiErrorMessage error={refusal} /> : null}
      <FormField
        id="refund-amount"
        label="Amount to refund"
        error={errors.amount}
        required
        hint={`Card payments still refundable: ${usd(payments.refundable)}.`}
      >
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={amount}
            inputMode="decimal"
            onChange={(e) => setAmount(e.target.value)}
            invalid={invalid}
            className="w-full"
          />
        )}
      </FormField>
      <FormField
        id="refund-reason"
        label="Note"
        error={errors.reason}
        hint="Kept with the refund, e.g. how the homeowner cancelled."
      >
        {({ invalid, ...control }) => (
          <InputTextarea
            {...control}
            value={reason}
            rows={2}
            maxLength={500}
            onChange={(e) => setReason(e.target.value)}
            invalid={invalid}
            className="w-full"
          />
        )}
      </FormField>
      <div className="payments-confirm">
        <Checkbox
          inputId="refund-sure"
          checked={sure}
          onChange={(e) => {
            setSure(Boolean(e.checked));
            setErrors((x) => ({ ...x, sure: undefined }));
          }}
          invalid={!!errors.sure}
          aria-describedby={errors.sure ? 'refund-sure-error' : undefined}
        />
        <label htmlFor="refund-sure">I have checked the amount; refund it to the card now.</label>
      </div>
      {errors.sure ? (
        <small id="refund-sure-error" className="form-field__error">
          <i className="pi pi-exclamation-circle" aria-hidden="true" /> {errors.sure}
        </small>
      ) : null}
      <div className="dialog-actions">
        <Button type="button" label="Keep the money" severity="secondary" outlined onClick={onClose} />
        <Button
          type="submit"
          label="Refund"
          icon="pi pi-replay"
          severity="danger"
          loading={refund.isPending}
        />
      </div>
    </form>
  );
}
