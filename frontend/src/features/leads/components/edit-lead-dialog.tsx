import { Dialog } from 'primereact/dialog';
import type { LeadDetail } from '@loambook/common';
import { useNotify } from '@/components/notify';
import { useUpdateLead } from '../api/update-lead';
import { leadPatch, valuesFromLead, type LeadFormValues } from '../lead-form-values';
import { LeadForm } from './lead-form';

interface EditLeadDialogProps {
  lead: LeadDetail;
  visible: boolean;
  chooseSalesperson: boolean;
  onClose: () => void;
}

/** The homeowner's contact details and the property, as on the new-lead form. */
export function EditLeadDialog({ lead, visible, chooseSalesperson, onClose }: EditLeadDialogProps) {
  const update = useUpdateLead();
  const notify = useNotify();
  const initial = valuesFromLead(lead);

  const submit = async (values: LeadFormValues) => {
    const patch = leadPatch(initial, values, { sendSalesperson: chooseSalesperson });
    if (Object.keys(patch).length === 0) {
      notify.info('Nothing changed');
    } else {
      await update.mutateAsync({ id: lead.id, patch });
      notify.success('Lead saved', `${values.homeownerName.trim()} is up to date.`);
    }
    onClose();
  };

  return (
    <Dialog
      visible={visible}
      onHide={onClose}
      header="Edit lead"
      className="app-dialog"
      style={{ width: '54rem' }}
      breakpoints={{ '900px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
      dismissableMask={false}
    >
      <LeadForm
        initialValues={initial}
        onSubmit={submit}
        onCancel={onClose}
        pending={update.isPending}
        submitLabel="Save changes"
        mode="edit"
        branches={[]}
        chooseSalesperson={chooseSalesperson}
        leadId={lead.id}
        leadBranchId={lead.branchId}
        idPrefix="edit-lead"
      />
    </Dialog>
  );
}
