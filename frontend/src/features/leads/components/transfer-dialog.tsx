import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { InputTextarea } from 'primereact/inputtextarea';
import { Message } from 'primereact/message';
import type { LeadDetail } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { FormField } from '@/components/form-field';
import { Select } from '@/components/select';
import { isApiError } from '@/lib/api-client';
import { serverFormErrors } from '@/lib/form-errors';
import { useBranchDirectory } from '@/features/branches/api/get-branch-directory';
import { useTransferLead } from '../api/transfer-lead';

interface TransferDialogProps {
  lead: LeadDetail;
  visible: boolean;
  onClose: () => void;
  onDone: (lead: LeadDetail) => void;
}

/** Hands a lead to another branch; only until a proposal has gone out to the homeowner. */
export function TransferDialog(props: TransferDialogProps) {
  return (
    <Dialog
      visible={props.visible}
      onHide={props.onClose}
      header="Transfer to another branch"
      className="app-dialog"
      style={{ width: '32rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      <TransferForm {...props} />
    </Dialog>
  );
}

function TransferForm({ lead, onClose, onDone }: TransferDialogProps) {
  const transfer = useTransferLead();
  // Every branch, not just the manager's own: a lead usually moves to a branch they do not work in.
  const directory = useBranchDirectory();
  const [branchId, setBranchId] = useState<string | null>(null);
  const [note, setNote] = useState('');
  const [submitted, setSubmitted] = useState(false);
  const [serverErrors, setServerErrors] = useState<{ branchId?: string; note?: string }>({});
  const [refusal, setRefusal] = useState<unknown>(null);

  const options = (directory.data ?? [])
    .filter((b) => b.id !== lead.branchId)
    .map((b) => ({ label: `${b.code} · ${b.name}`, value: b.id }));
  const branchError =
    serverErrors.branchId ?? (submitted && !branchId ? 'Choose the branch to transfer to.' : null);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setRefusal(null);
    if (!branchId) return;
    try {
      onDone(await transfer.mutateAsync({ leadId: lead.id, branchId, note: note.trim() || undefined }));
    } catch (e) {
      // Too late (a proposal is out) and the like come as 409 with the reason in words.
      if (isApiError(e) && e.status === 409) {
        setRefusal(e);
        return;
      }
      const mapped = serverFormErrors(e, ['branchId', 'note'] as const);
      setServerErrors(mapped.fields);
      if (mapped.form) setRefusal(e);
    }
  };

  return (
    <form className="dialog-form" onSubmit={submit} noValidate>
      <p className="dialog-intro">
        {lead.homeownerName}’s lead, with its inspections, photos and draft proposals, moves from{' '}
        {lead.branchCode} to the branch you choose. {lead.branchCode} keeps a read-only view of it.
      </p>
      {refusal ? <ApiErrorMessage error={refusal} /> : null}
      {directory.isError ? <ApiErrorMessage error={directory.error} /> : null}
      {directory.isSuccess && options.length === 0 ? (
        <Message
          severity="info"
          className="w-full"
          text={`${lead.branchCode} is the company’s only branch, so there is nowhere to move this lead yet.`}
        />
      ) : null}
      <FormField id="transfer-branch" label="Move to branch" error={branchError} required>
        {({ invalid, id, ...aria }) => (
          <Select
            inputId={id}
            {...aria}
            value={branchId}
            options={options}
            onChange={(e) => {
              setBranchId(e.value as string);
              setServerErrors({});
            }}
            invalid={invalid}
            placeholder={
              directory.isPending
                ? 'Loading branches…'
                : options.length
                  ? 'Choose a branch'
                  : 'No other branch to choose'
            }
            disabled={options.length === 0}
            className="w-full"
          />
        )}
      </FormField>
      <FormField
        id="transfer-note"
        label="Message to the other branch"
        error={serverErrors.note}
        hint="Optional: why it moves, and anything they should know."
      >
        {({ invalid, ...control }) => (
          <InputTextarea
            {...control}
            value={note}
            onChange={(e) => setNote(e.target.value)}
            invalid={invalid}
            rows={3}
            maxLength={1000}
            className="w-full"
          />
        )}
      </FormField>
      <div className="dialog-actions">
        <Button type="button" label="Cancel" severity="secondary" outlined onClick={onClose} />
        <Button
          type="submit"
          label="Move lead"
          icon="pi pi-arrow-right-arrow-left"
          loading={transfer.isPending}
        />
      </div>
    </form>
  );
}
