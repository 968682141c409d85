import { Dialog } from 'primereact/dialog';
import { formatUsd, type JournalEntry } from '@loambook/common';
import { ReasonForm } from '@/components/reason-form';
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
  return (
    <ReasonForm
      id="reverse-reason"
      intro={
        <p className="dialog-intro">
          {formatDay(entry.effectiveOn)} · {entry.reasonLabel} · {formatUsd(entry.total)} ({entry.branchCode}
          ). Posted entries are never changed: a new entry puts every line on the other side, dated today, and
          names this one. Both stay in the journal.
        </p>
      }
      hint="E.g. posted to the wrong branch, duplicate cheque, wrong amount (then post the right one)."
      missing="Say why the entry is reversed."
      minLength={3}
      maxLength={300}
      field="reason"
      keepLabel="Keep the entry"
      confirmLabel="Post reversal"
      confirmIcon="pi pi-undo"
      pending={reverse.isPending}
      onSubmit={async (reason) => onDone(await reverse.mutateAsync({ entryId: entry.id, reason }))}
      onClose={onClose}
    />
  );
}
