import { useState } from 'react';
import { Button } from 'primereact/button';
import { Checkbox } from 'primereact/checkbox';
import { Dialog } from 'primereact/dialog';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import type { Branch } from '@loambook/common';
import { FormField } from '@/components/form-field';
import { Select } from '@/components/select';
import { serverFormErrors } from '@/lib/form-errors';
import { useCreateBankAccount } from '../api/create-bank-account';

type Field = 'name' | 'last4' | 'branchId';
const COMPANY = 'company';

/** A new bank account: its name, the last four digits, whose it is, and whether payouts arrive on it. */
export function NewBankAccountDialog({
  visible,
  branches,
  onClose,
}: {
  visible: boolean;
  branches: Branch[];
  onClose: () => void;
}) {
  const [name, setName] = useState('');
  const [last4, setLast4] = useState('');
  const [branchId, setBranchId] = useState<string>(COMPANY);
  const [receivesPayouts, setReceivesPayouts] = useState(true);
  const [tried, setTried] = useState(false);
  const create = useCreateBankAccount();
  const server = create.error ? serverFormErrors<Field>(create.error, ['name', 'last4', 'branchId']) : null;
  const errors: Partial<Record<Field, string>> = {
    name: tried && name.trim().length < 2 ? 'Name the account (2 characters or more).' : server?.fields.name,
    last4:
      tried && !/^[0-9]{4}$/.test(last4)
        ? 'The last four digits of the account number.'
        : server?.fields.last4,
    branchId: server?.fields.branchId,
  };
  const close = () => {
    setName('');
    setLast4('');
    setBranchId(COMPANY);
    setReceivesPayouts(true);
    setTried(false);
    create.reset();
    onClose();
  };
  const submit = () => {
    setTried(true);
    if (name.trim().length < 2 || !/^[0-9]{4}$/.test(last4)) return;
    create.mutate(
      { name: name.trim(), last4, branchId: branchId === COMPANY ? null : branchId, receivesPayouts },
      { onSuccess: close },
    );
  };
  return (
    <Dialog
      visible={visible}
      onHide={close}
      header="New bank account"
      className="app-dialog recon-dialog"
      style={{ width: 'min(32rem, 96vw)' }}
      footer={
        <div className="dialog-actions">
          <Button type="button" label="Cancel" text onClick={close} />
          <Button type="button" label="Add account" onClick={submit} loading={create.isPending} />
        </div>
      }
    >
      {server?.form ? <Message severity="error" text={server.form} className="form-message" /> : null}
      <FormField
        id="account-name"
        label="Name"
        error={errors.name}
        hint="As the office calls it, e.g. Operating."
        required
      >
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={name}
            onChange={(e) => setName(e.target.value)}
            invalid={invalid}
            maxLength={80}
          />
        )}
      </FormField>
      <FormField
        id="account-last4"
        label="Last four digits"
        error={errors.last4}
        hint="Only these are kept."
        required
      >
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={last4}
            onChange={(e) => setLast4(e.target.value.replace(/\D/g, '').slice(0, 4))}
            invalid={invalid}
            inputMode="numeric"
            autoComplete="off"
          />
        )}
      </FormField>
      <FormField id="account-branch" label="Whose account" error={errors.branchId}>
        {({ invalid, id, ...aria }) => (
          <Select
            inputId={id}
            {...aria}
            value={branchId}
            options={[
              { label: 'The whole company', value: COMPANY },
              ...branches.map((b) => ({ label: `${b.code} · ${b.name}`, value: b.id })),
            ]}
            onChange={(e) => setBranchId(e.value as string)}
            invalid={invalid}
            panelClassName="app-overlay"
          />
        )}
      </FormField>
      <div className="checkbox-row">
        <Checkbox
          inputId="account-payouts"
          checked={receivesPayouts}
          onChange={(e) => setReceivesPayouts(!!e.checked)}
        />
        <label htmlFor="account-payouts">The card processor pays its payouts into this account</label>
      </div>
    </Dialog>
  );
}
