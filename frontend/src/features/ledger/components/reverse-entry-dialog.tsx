import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { InputTextarea } from 'primereact/inputtextarea';
import { formatUsd, type JournalEntry } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { FormField } from '@/components/form-field';
import { serverFormErrors } from '@/lib/form-errors';
import { useLastValue } from '@/lib/use-last-value';
import { useReverseEntry } from '../api/reverse-entry';
import { formatDay } from '../ledger-format';

interface ReverseEntryDialogProps {
  entry: JournalEntry | null;
  onClose: () => void;
  onDone: (reversal: JournalEntry) => void;
}

/** Posting a reversal cannot be undone either (only reversed again): it asks for a reason and a confirmation. */
export function ReverseEntryDialog({ entry, onClose, onDone }: ReverseEntryDialogProps) {
  const shown = useLastValue(entry);
  return (
    <Dialog
      visible={entry !== null}
      onHide={onClose}
      header="Reverse this entry"
      className="app-dialog"
      style={{ width: '34rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      {shown ? <ReverseForm key={shown.id} entry={shown} onClose={onClose} onDone={onDone} /> : null}
    </Dialog>
  );
}

function ReverseForm({
  entry,
  onClose,
  onDone,
}: { entry: JournalEntry } & Omit<ReverseEntryDialogProps, 'entry'>) {
  const reverse = useReverseEntry();
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    if (reason.trim().length < 3) {
      setError('Say why the entry is reversed.');
      return;
    }
    try {
      onDone(await reverse.mutateAsync({ entryId: entry.id, reason: reason.trim() }));
    } catch (e) {
      setError(serverFormErrors(e, ['reason'] as const).fields.reason ?? null);
    }
  };

  return (
    <form className="dialog-form" onSubmit={submit} noValidate>
      <p className="dialog-intro">
        {formatDay(entry.effectiveOn)} · {entry.reasonLabel} · {formatUsd(entry.total)} ({entry.branchCode}).
        Posted entries are never changed: a new entry puts every line on the other side, dated today, and
        names this one. Both stay in the journal.
      </p>
      <FormField
        id="reverse-reason"
        label="Reason"
        error={error}
        required
        hint="E.g. posted to the wrong branch, duplicate cheque, wrong amount (then post the right one)."
      >
        {({ invalid, ...control }) => (
          <InputTextarea
            {...control}
            value={reason}
            onChange={(e) => {
              setReason(e.target.value);
              setError(null);
            }}
            invalid={invalid}
            rows={3}
            maxLength={300}
            autoFocus
            className="w-full"
          />
        )}
      </FormField>
      {reverse.isError && !error ? <ApiErrorMessage error={reverse.error} /> : null}
      <div className="dialog-actions">
        <Button type="button" label="Keep the entry" severity="secondary" outlined onClick={onClose} />
        <Button
          type="submit"
          label="Post reversal"
          severity="danger"
          icon="pi pi-undo"
          loading={reverse.isPending}
        />
      </div>
    </form>
  );
}
