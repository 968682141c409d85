import '../signing.css';
import { Dialog } from 'primereact/dialog';
import { formatUsd, money, type ContractView } from '@loambook/common';
import { ReasonForm } from '@/components/reason-form';
import { useRecordCancellation } from '../api/record-cancellation';
import { formatCalendarDate } from '../signing-format';

interface RecordCancellationDialogProps {
  contract: ContractView;
  visible: boolean;
  onClose: () => void;
  onDone: (contract: ContractView) => void;
}

/**
 * Staff record a cancellation the homeowner made by phone, mail or at the door, while the 16 CFR 429
 * window is open. It cannot be undone, so the dialog says what follows and asks how they cancelled.
 */
export function RecordCancellationDialog(props: RecordCancellationDialogProps) {
  return (
    <Dialog
      visible={props.visible}
      onHide={props.onClose}
      header="Record the homeowner’s cancellation"
      className="app-dialog"
      style={{ width: '34rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      <RecordCancellationForm {...props} />
    </Dialog>
  );
}

function RecordCancellationForm({ contract, onClose, onDone }: RecordCancellationDialogProps) {
  const cancel = useRecordCancellation();
  const paid = money(contract.depositAmount).greaterThan(0);
  // Already cancelled, or the window closed meanwhile: 409 / 422 with the reason in words, under the field.
  return (
    <ReasonForm
      id="cancellation-note"
      label="How the homeowner cancelled"
      intro={
        <>
          <p className="dialog-intro">
            {contract.homeownerName} may cancel until the end of{' '}
            {formatCalendarDate(contract.lastDayToCancel)}. Recording the cancellation:
          </p>
          <ul className="record-cancellation__effects">
            <li>
              cancels the contract for option {contract.option.position}, {contract.option.title} (
              {formatUsd(contract.price)});
            </li>
            <li>moves the lead to Cancelled and calls off any work booked from this contract;</li>
            <li>
              <strong>
                puts a refund on the record: every payment made under the contract
                {paid ? `, the ${formatUsd(contract.depositAmount)} deposit included,` : ''} is due back
                within 10 business days
              </strong>
              ;
            </li>
            <li>e-mails the homeowner a confirmation and tells the salesperson.</li>
          </ul>
          <p className="dialog-intro">It cannot be undone.</p>
        </>
      }
      hint="E.g. phoned the office on Tuesday at 10:15 and mailed the signed cancellation form."
      missing="Say how the homeowner cancelled: by phone, by mail, in person, and when."
      maxLength={2000}
      field="note"
      keepLabel="Keep the contract"
      confirmLabel="Record cancellation"
      confirmIcon="pi pi-ban"
      pending={cancel.isPending}
      onSubmit={async (note) => onDone(await cancel.mutateAsync({ contractId: contract.id, note }))}
      onClose={onClose}
    />
  );
}
