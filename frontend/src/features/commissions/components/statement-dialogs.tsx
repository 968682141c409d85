import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { ConfirmDialog } from 'primereact/confirmdialog';
import { Dialog } from 'primereact/dialog';
import { InputText } from 'primereact/inputtext';
import { formatUsd, money, type CommissionStatementDetail, type PayStatementInput } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { FormField } from '@/components/form-field';
import { localToday } from '@/lib/format';
import { serverFormErrors } from '@/lib/form-errors';
import { formatPeriod } from '../commission-format';

const DAY = /^\d{4}-\d{2}-\d{2}$/;

/** Approving locks the statement's figures: asked once more. */
export function ApproveStatementDialog({
  statement,
  visible,
  onConfirm,
  onClose,
}: {
  statement: CommissionStatementDetail;
  visible: boolean;
  onConfirm: () => void;
  onClose: () => void;
}) {
  return (
    <ConfirmDialog
      visible={visible}
      onHide={onClose}
      header="Approve this statement"
      icon="pi pi-lock"
      message={`Approve ${statement.salespersonName}’s statement for ${formatPeriod(statement.periodStart, statement.periodEnd)}, payable ${formatUsd(statement.payable)}? Its figures are then locked: anything earned or clawed back later goes on the next statement.`}
      acceptLabel="Approve"
      rejectLabel="Not yet"
      defaultFocus="reject"
      accept={onConfirm}
      reject={onClose}
      className="app-dialog"
    />
  );
}

/** Marking paid posts commissions payable / bank: the date and reference are asked, then confirmed. */
export function PayStatementDialog({
  statement,
  visible,
  pending,
  onSubmit,
  onClose,
}: {
  statement: CommissionStatementDetail;
  visible: boolean;
  pending: boolean;
  onSubmit: (input: PayStatementInput) => Promise<unknown>;
  onClose: () => void;
}) {
  const [paidOn, setPaidOn] = useState(localToday);
  const [reference, setReference] = useState('');
  const [errors, setErrors] = useState<{ paidOn?: string; reference?: string }>({});
  const [formError, setFormError] = useState<unknown>(null);
  const paysNothing = !money(statement.payable).greaterThan(0);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    if (!DAY.test(paidOn)) {
      setErrors({ paidOn: 'Choose the day it was paid.' });
      return;
    }
    try {
      await onSubmit({ paidOn, ...(reference.trim() ? { reference: reference.trim() } : {}) });
    } catch (e) {
      const mapped = serverFormErrors(e, ['paidOn', 'reference'] as const);
      setErrors(mapped.fields);
      setFormError(mapped.form ? e : null);
    }
  };

  return (
    <Dialog
      visible={visible}
      onHide={onClose}
      header="Mark the statement paid"
      className="app-dialog"
      style={{ width: '34rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      <form className="dialog-form" onSubmit={submit} noValidate aria-label="Mark paid">
        <p className="dialog-intro">
          {paysNothing
            ? `This statement pays ${formatUsd('0')}: nothing is posted, and ${formatUsd(statement.carriedOut)} carries into ${statement.salespersonName}’s next statement.`
            : `Posts ${formatUsd(statement.payable)} from commissions payable (${statement.salespersonName}) to the bank, dated the day paid. This cannot be undone except by a reversing entry.`}
        </p>
        <FormField id="pay-on" label="Paid on" error={errors.paidOn} required>
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              type="date"
              value={paidOn}
              onChange={(e) => {
                setPaidOn(e.target.value);
                setErrors({});
              }}
              invalid={invalid}
            />
          )}
        </FormField>
        <FormField
          id="pay-reference"
          label="Reference"
          error={errors.reference}
          hint="Cheque number or transfer reference, as it will read on the bank statement."
        >
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              value={reference}
              onChange={(e) => setReference(e.target.value)}
              invalid={invalid}
              maxLength={120}
              autoComplete="off"
            />
          )}
        </FormField>
        {formError ? <ApiErrorMessage error={formError} /> : null}
        <div className="dialog-actions">
          <Button
            type="button"
            label="Cancel"
            severity="secondary"
            outlined
            onClick={onClose}
            disabled={pending}
          />
          <Button
            type="submit"
            label={paysNothing ? 'Mark paid ($0.00)' : `Mark paid ${formatUsd(statement.payable)}`}
            icon="pi pi-check"
            loading={pending}
          />
        </div>
      </form>
    </Dialog>
  );
}
