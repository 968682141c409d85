import { Dialog } from 'primereact/dialog';
import { ReasonForm } from '@/components/reason-form';
import type { LeadDetail } from '@loambook/common';
import { useMarkLost } from '../api/mark-lost';

interface MarkLostDialogProps {
  lead: LeadDetail;
  visible: boolean;
  onClose: () => void;
  onDone: (lead: LeadDetail) => void;
}

/** Marking a sale lost needs a reason: the office reads them to learn why homeowners go elsewhere. */
export function MarkLostDialog(props: MarkLostDialogProps) {
  return (
    <Dialog
      visible={props.visible}
      onHide={props.onClose}
      header="Mark this lead lost"
      className="app-dialog"
      style={{ width: '32rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      <MarkLostForm {...props} />
    </Dialog>
  );
}

function MarkLostForm({ lead, onClose, onDone }: MarkLostDialogProps) {
  const markLost = useMarkLost();
  return (
    <ReasonForm
      id="lost-reason"
      intro={
        <p className="dialog-intro">
          {lead.homeownerName} leaves the open pipeline. A lost lead can be reopened later from where its work
          left off.
        </p>
      }
      hint="E.g. chose another contractor, price, will do it next year."
      missing="Say why the sale was lost."
      maxLength={500}
      field="reason"
      keepLabel="Keep it open"
      confirmLabel="Confirm lost"
      confirmIcon="pi pi-times"
      pending={markLost.isPending}
      onSubmit={async (reason) => onDone(await markLost.mutateAsync({ leadId: lead.id, reason }))}
      onClose={onClose}
    />
  );
}
